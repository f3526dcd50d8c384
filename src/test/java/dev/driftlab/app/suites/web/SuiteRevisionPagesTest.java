package dev.driftlab.app.suites.web;

import static org.assertj.core.api.Assertions.assertThat;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.csrf;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.get;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.post;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.status;

import dev.driftlab.app.Polling;
import dev.driftlab.app.WebSlice;
import dev.driftlab.app.runs.RunQueue;
import dev.driftlab.app.runs.ScriptedTrialExecutor;
import dev.driftlab.app.scenarios.ScenarioStore;
import dev.driftlab.app.sharing.Access;
import dev.driftlab.app.sharing.ShareLinks;
import dev.driftlab.app.suites.SuiteStore;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.http.MediaType;
import org.springframework.test.web.servlet.MockMvc;
import org.springframework.web.util.HtmlUtils;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;

/** The pages of a suite's older revisions, and the suite run page's report through the report cache. */
@WebSlice
class SuiteRevisionPagesTest {

    static final JsonMapper JSON = JsonMapper.builder().build();

    @Autowired
    MockMvc mvc;

    @Autowired
    ScenarioStore scenarios;

    @Autowired
    ShareLinks links;

    @Autowired
    SuiteStore suites;

    @Autowired
    RunQueue queue;

    @Autowired
    ScriptedTrialExecutor executor;

    @Autowired
    SuiteRunReports reports;

    List<String> samples;
    List<String> names;

    @BeforeEach
    void samples() {
        executor.reset();
        samples = new ArrayList<>();
        names = new ArrayList<>();
        for (long id : scenarios.sampleScenarios().values()) {
            samples.add(links.current(id).view().orElseThrow());
            names.add(scenarios.view(id).head().name());
        }
    }

    @AfterEach
    void drain() throws Exception {
        executor.release();
        Polling.until("the run queue emptying", () -> queue.freePlaces() == queue.places());
    }

    private static final String NOISIER =
            "{\"format\": \"driftlab-profile/1\", \"name\": \"noisier\", \"rangefinder\": {\"rangeSigma\": 0.25}}";

    /** A new suite of the first two samples with one profile: its view and edit tokens. */
    private String[] suite(String profiles) throws Exception {
        String body = "{\"name\": \"Nightly\", \"seeds\": 2, \"scenarios\": [{\"link\": \"" + samples.get(0)
                + "\"}, {\"link\": \"" + samples.get(1) + "\"}], \"profiles\": " + profiles + "}";
        JsonNode created = JSON.readTree(mvc.perform(post("/api/suites")
                        .contentType(MediaType.APPLICATION_JSON)
                        .content(body)
                        .with(csrf()))
                .andExpect(status().isCreated())
                .andReturn()
                .getResponse()
                .getContentAsString());
        return new String[] {
            created.get("viewLink").asString(), created.get("editLink").asString()
        };
    }

    private String page(String url, int status) throws Exception {
        return mvc.perform(get(url))
                .andExpect(status().is(status))
                .andReturn()
                .getResponse()
                .getContentAsString();
    }

    @Test
    void olderRevision_readsAsSavedForViewAndEditLinks_withWhatChanged_andNeverAnEditLinkOrForm() throws Exception {
        String[] t = suite("[" + NOISIER + "]");
        String view = t[0];
        String edit = t[1];
        // revision 2 from the edit page: the second scenario pinned, the first on 3 seeds, the one
        // profile's JSON edited (its commas must reach the server whole)
        mvc.perform(post("/suites/" + edit + "/edit")
                        .param("base", "1")
                        .param("name", "Nightly")
                        .param("seeds", "2")
                        .param("entryLink", samples.get(0), samples.get(1))
                        .param("entryRevision", "", "1")
                        .param("entrySeeds", "3", "")
                        .param(
                                "profileJson",
                                "{\"format\": \"driftlab-profile/1\", \"name\": \"noisier\","
                                        + " \"rangefinder\": {\"rangeSigma\": 0.3, \"dropout\": 0.1}}")
                        .param("author", "Ana")
                        .param("message", "Pinned the second scenario")
                        .with(csrf()))
                .andExpect(status().is3xxRedirection());

        String suitePage = page("/suites/" + view, 200);
        assertThat(suitePage).contains("/suites/" + view + "/history").contains("All revisions (2)");

        String history = page("/suites/" + view + "/history", 200);
        assertThat(history)
                .contains("/suites/" + view + "/revisions/1")
                .contains("/suites/" + view + "/revisions/2")
                .contains("Revision 2 (current)")
                .contains("Pinned the second scenario")
                .contains("Ana")
                .doesNotContain(edit);

        String first = page("/suites/" + view + "/revisions/1", 200);
        assertThat(first)
                .contains("Revision 1 of the suite Nightly")
                .contains("An older revision, read-only: the suite is at revision 2 now.")
                .contains("rangefinder.rangeSigma = 0.25")
                .doesNotContain("rangefinder.dropout")
                .doesNotContain("(pinned)")
                .doesNotContain("Changes from revision")
                .doesNotContain(edit)
                .doesNotContain("<form")
                .contains("/s/" + samples.get(0))
                .contains(HtmlUtils.htmlEscape(names.get(0)));

        String second = page("/suites/" + view + "/revisions/2", 200);
        assertThat(second)
                .contains("This is the current revision. This page is read-only.")
                .contains("1 (pinned)")
                .contains("Changes from revision 1")
                .doesNotContain("<form");
        // the changes, row by row: change, field, before, after
        assertThat(rows(second, "revision-changes"))
                .containsExactly(
                        List.of(
                                "changed",
                                "scenario " + names.get(0),
                                "latest revision, 2 seeds (the suite's)",
                                "latest revision, 3 seeds"),
                        List.of(
                                "changed",
                                "scenario " + names.get(1),
                                "latest revision, 2 seeds (the suite's)",
                                "revision 1 (pinned), 2 seeds (the suite's)"),
                        List.of(
                                "changed",
                                "profile noisier",
                                "rangefinder.rangeSigma = 0.25",
                                "rangefinder.rangeSigma = 0.3; rangefinder.dropout = 0.1"));

        // the edit link reads the same pages, and links back with itself
        assertThat(page("/suites/" + edit + "/revisions/1", 200))
                .contains("rangefinder.rangeSigma = 0.25")
                .contains("/suites/" + edit + "/history");
    }

    @Test
    void missingRevision_isAClear404Page_andARevokedLinkOpensNoRevision() throws Exception {
        String[] t = suite("[]");
        String view = t[0];
        for (String n : List.of("9", "0", "-1")) {
            String missing = page("/suites/" + view + "/revisions/" + n, 404);
            assertThat(missing)
                    .contains("Not found")
                    .contains("Revision " + n
                            + " of the suite &quot;Nightly&quot; (it has revisions 1 to 1) was not found.");
        }
        assertThat(page("/suites/" + view + "/revisions/two", 400)).contains("number: not a valid value");

        long id = suites.require(view).suiteId();
        suites.revoke(id, Access.VIEW);
        page("/suites/" + view + "/history", 404);
        page("/suites/" + view + "/revisions/1", 404);
    }

    @Test
    void finishedRunPage_buildsItsReportOnce_runningRunPageBuildsNone() throws Exception {
        String[] t = suite("[" + NOISIER + "]");
        executor.holdRuns();
        String token = JSON.readTree(
                        mvc.perform(post("/api/suites/" + t[0] + "/runs").with(csrf()))
                                .andExpect(status().isAccepted())
                                .andReturn()
                                .getResponse()
                                .getContentAsString())
                .get("link")
                .asString();
        int before = reports.builds();
        String running = page("/suite-runs/" + token, 200);
        assertThat(running).contains("Cells").doesNotContain("suite-matrix");
        assertThat(reports.builds()).isEqualTo(before);

        executor.release();
        Polling.until(
                "the suite run finishing",
                () -> JSON.readTree(page("/api/suite-runs/" + token, 200))
                        .get("state")
                        .asString()
                        .equals("finished"));
        // the suite page links each run to the revision it ran
        assertThat(page("/suites/" + t[0], 200)).contains("/suites/" + t[0] + "/revisions/1\">revision 1</a>");
        String once = page("/suite-runs/" + token, 200);
        String twice = page("/suite-runs/" + token, 200);
        String polled = mvc.perform(get("/suite-runs/" + token).header("HX-Request", "true"))
                .andExpect(status().isOk())
                .andReturn()
                .getResponse()
                .getContentAsString();
        assertThat(reports.builds()).isEqualTo(before + 1);
        // the same report both times (the pages differ only in their CSRF tokens)
        assertThat(report(once))
                .isEqualTo(report(twice))
                .contains("id=\"suite-matrix\"")
                .contains("/batch-report");
        assertThat(polled).contains("id=\"suite-matrix\"").doesNotContain("<html");
    }

    /** The body rows of the table with this id, each as its cells' texts. */
    private static List<List<String>> rows(String html, String id) {
        String table = html.substring(html.indexOf("id=\"" + id + "\""));
        table = table.substring(table.indexOf("<tbody>"), table.indexOf("</tbody>"));
        List<List<String>> out = new ArrayList<>();
        for (String tr : table.split("<tr>")) {
            if (!tr.contains("<t")) {
                continue;
            }
            List<String> cells = new ArrayList<>();
            java.util.regex.Matcher m = java.util.regex.Pattern.compile(
                            "<t[hd][^>]*>(.*?)</t[hd]>", java.util.regex.Pattern.DOTALL)
                    .matcher(tr);
            while (m.find()) {
                cells.add(HtmlUtils.htmlUnescape(m.group(1).strip()));
            }
            if (!cells.isEmpty()) {
                out.add(cells);
            }
        }
        return out;
    }

    /** The report part of a suite run page. */
    private static String report(String html) {
        int from = html.indexOf("<div class=\"suite-report\">");
        assertThat(from).as("the page has its report").isNotNegative();
        return html.substring(from, html.indexOf("</main>"));
    }
}
