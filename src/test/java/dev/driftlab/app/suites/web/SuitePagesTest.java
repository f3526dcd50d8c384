package dev.driftlab.app.suites.web;

import static org.assertj.core.api.Assertions.assertThat;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.csrf;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.get;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.post;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.redirectedUrlPattern;
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
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;

@WebSlice
class SuitePagesTest {

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

    List<String> samples;

    @BeforeEach
    void samples() {
        executor.reset();
        samples = new ArrayList<>();
        for (long id : scenarios.sampleScenarios().values()) {
            samples.add(links.current(id).view().orElseThrow());
        }
    }

    @AfterEach
    void drain() throws Exception {
        executor.release();
        Polling.until("the run queue emptying", () -> queue.freePlaces() == queue.places());
    }

    private String suite(String scenariosJson, String profilesJson) {
        return "{\"name\": \"Nightly\", \"seeds\": 2, \"scenarios\": " + scenariosJson + ", \"profiles\": "
                + profilesJson + "}";
    }

    private JsonNode create(String body, int status) throws Exception {
        String out = mvc.perform(post("/api/suites")
                        .contentType(MediaType.APPLICATION_JSON)
                        .content(body)
                        .with(csrf()))
                .andExpect(status().is(status))
                .andReturn()
                .getResponse()
                .getContentAsString();
        return JSON.readTree(out);
    }

    private JsonNode getJson(String url) throws Exception {
        return JSON.readTree(mvc.perform(get(url))
                .andExpect(status().isOk())
                .andReturn()
                .getResponse()
                .getContentAsString());
    }

    private static final String NOISIER =
            "{\"format\": \"driftlab-profile/1\", \"name\": \"noisier\"," + " \"rangefinder\": {\"rangeSigma\": 0.25}}";

    @Test
    void create_withSamplesAndAProfile_viewLinkReadsButNeverSeesTheEditLinkNorSaves() throws Exception {
        JsonNode created = create(
                suite(
                        "[{\"link\": \"" + samples.get(0) + "\"}, {\"link\": \"/s/" + samples.get(1)
                                + "\", \"revision\": 1}]",
                        "[" + NOISIER + "]"),
                201);
        String view = created.get("viewLink").asString();
        String edit = created.get("editLink").asString();

        JsonNode byView = getJson("/api/suites/" + view);
        assertThat(byView.get("canEdit").asBoolean()).isFalse();
        assertThat(byView.get("links").has("edit")).isFalse();
        assertThat(byView.toString()).doesNotContain(edit);
        assertThat(byView.get("document").get("scenarios")).hasSize(2);
        assertThat(byView.get("document")
                        .get("scenarios")
                        .get(1)
                        .get("revision")
                        .asInt())
                .isEqualTo(1);

        JsonNode byEdit = getJson("/api/suites/" + edit);
        assertThat(byEdit.get("links").get("edit").asString()).isEqualTo(edit);

        mvc.perform(post("/api/suites/" + view + "/revisions?base=1")
                        .contentType(MediaType.APPLICATION_JSON)
                        .content(suite("[{\"link\": \"" + samples.get(0) + "\"}]", "[]"))
                        .with(csrf()))
                .andExpect(status().isForbidden());
        mvc.perform(post("/api/suites/" + edit + "/revisions?base=1")
                        .contentType(MediaType.APPLICATION_JSON)
                        .content(suite("[{\"link\": \"" + samples.get(0) + "\"}]", "[]"))
                        .with(csrf()))
                .andExpect(status().isOk());
        assertThat(getJson("/api/suites/" + view).get("revision").asInt()).isEqualTo(2);

        // the pages: a view link shows no edit form and no edit link; the home page lists view links only
        String page =
                mvc.perform(get("/suites/" + view)).andReturn().getResponse().getContentAsString();
        assertThat(page)
                .doesNotContain(edit)
                .doesNotContain("Save a new revision")
                .contains("Run the suite");
        String editPage =
                mvc.perform(get("/suites/" + edit)).andReturn().getResponse().getContentAsString();
        assertThat(editPage).contains("Save a new revision");
        String home = mvc.perform(get("/")).andReturn().getResponse().getContentAsString();
        assertThat(home).contains("/suites/" + view).doesNotContain(edit);
    }

    @Test
    void create_anEditLink_isStoredAsTheScenariosViewLink() throws Exception {
        ScenarioStore.Created c =
                scenarios.create(dev.driftlab.scenario.Scenarios.corridor().json(), "Ana", "x");
        JsonNode created = create(suite("[{\"link\": \"" + c.editToken() + "\"}]", "[]"), 201);
        JsonNode doc =
                getJson("/api/suites/" + created.get("viewLink").asString()).get("document");
        assertThat(doc.get("scenarios").get(0).get("link").asString()).isEqualTo(c.viewToken());
        assertThat(doc.toString()).doesNotContain(c.editToken());
    }

    @Test
    void refusals_nameTheFieldAndStoreNothing() throws Exception {
        int before = suites.recent(1000).size();

        JsonNode empty = create(suite("[]", "[]"), 422);
        assertThat(empty.get("problems").get(0).get("path").asString()).isEqualTo("scenarios");

        ScenarioStore.Created c =
                scenarios.create(dev.driftlab.scenario.Scenarios.corridor().json(), "Ana", "x");
        links.revoke(c.scenarioId(), Access.VIEW);
        links.revoke(c.scenarioId(), Access.EDIT);
        JsonNode revoked = create(
                suite("[{\"link\": \"" + samples.get(0) + "\"}, {\"link\": \"" + c.viewToken() + "\"}]", "[]"), 422);
        assertThat(revoked.get("problems").get(0).get("path").asString()).isEqualTo("scenarios[1].link");
        assertThat(revoked.get("problems").get(0).get("message").asString()).contains("revoked");

        JsonNode typo = create(
                suite(
                        "[{\"link\": \"" + samples.get(0) + "\"}]",
                        "[{\"format\": \"driftlab-profile/1\", \"name\": \"typo\", \"rangefinder\": {\"rangeSgma\": 0.1}}]"),
                422);
        assertThat(typo.get("problems").get(0).get("path").asString())
                .isEqualTo("profile \"typo\": rangefinder.rangeSgma");

        JsonNode pinned = create(suite("[{\"link\": \"" + samples.get(0) + "\", \"revision\": 9}]", "[]"), 422);
        assertThat(pinned.get("problems").get(0).get("path").asString()).isEqualTo("scenarios[0].revision");

        StringBuilder many = new StringBuilder("[");
        for (int i = 0; i <= SuiteStore.MAX_ENTRIES; i++) {
            many.append(i == 0 ? "" : ",")
                    .append("{\"link\": \"")
                    .append(samples.get(0))
                    .append("\"}");
        }
        JsonNode tooMany = create(suite(many + "]", "[]"), 422);
        assertThat(tooMany.get("problems").get(0).get("path").asString()).isEqualTo("scenarios");

        assertThat(suites.recent(1000)).hasSize(before);
    }

    @Test
    void newSuiteForm_picksSamplesAndShippedProfiles_andCreates() throws Exception {
        String form = mvc.perform(get("/suites/new")).andReturn().getResponse().getContentAsString();
        assertThat(form).contains(samples.get(0)).contains("noisier rangefinder");
        mvc.perform(post("/suites")
                        .param("name", "From the form")
                        .param("seeds", "2")
                        .param("sample", samples.get(0), samples.get(1))
                        .param("shippedProfile", "fewer-particles.profile.json")
                        .with(csrf()))
                .andExpect(status().is3xxRedirection())
                .andExpect(redirectedUrlPattern("/suites/*"));
        String bad = mvc.perform(post("/suites")
                        .param("name", "Bad")
                        .param("seeds", "many")
                        .param("sample", samples.get(0))
                        .with(csrf()))
                .andExpect(status().is(422))
                .andReturn()
                .getResponse()
                .getContentAsString();
        assertThat(bad).contains("seeds").contains("not a whole number");
    }

    @Test
    void sampleSuite_isLoadedAtStart() {
        assertThat(suites.recent(100)).anyMatch(s -> s.name().equals("Every sample site"));
    }

    @Test
    void run_queuesEveryValidCell_reportsTheInvalidOnePerCell_andFinishes() throws Exception {
        String invalid = "{\"format\": \"driftlab-profile/1\", \"name\": \"no range\","
                + " \"rangefinder\": {\"maxRange\": -1}}";
        JsonNode created = create(
                suite(
                        "[{\"link\": \"" + samples.get(0) + "\"}, {\"link\": \"" + samples.get(1) + "\"}]",
                        "[" + NOISIER + ", " + invalid + "]"),
                201);
        String view = created.get("viewLink").asString();
        JsonNode run =
                JSON.readTree(mvc.perform(post("/api/suites/" + view + "/runs").with(csrf()))
                        .andExpect(status().isAccepted())
                        .andReturn()
                        .getResponse()
                        .getContentAsString());
        String token = run.get("link").asString();
        assertThat(run.get("cells")).hasSize(6);
        Polling.until(
                "the suite run finishing",
                () -> getJson("/api/suite-runs/" + token)
                        .get("state")
                        .asString()
                        .equals("finished"));
        JsonNode done = getJson("/api/suite-runs/" + token);
        List<String> states = new ArrayList<>();
        done.get("cells")
                .forEach(c -> states.add(
                        c.get("column").asString() + "=" + c.get("runState").asString()));
        assertThat(states)
                .containsExactly(
                        "as is=done",
                        "noisier=done",
                        "no range=invalid",
                        "as is=done",
                        "noisier=done",
                        "no range=invalid");
        assertThat(done.get("cells").get(2).get("problems").get(0).asString()).contains("rangefinder.maxRange");
        assertThat(done.get("verdict").asString()).isNotEmpty();

        String page = mvc.perform(get("/suite-runs/" + token))
                .andReturn()
                .getResponse()
                .getContentAsString();
        assertThat(page)
                .contains("Matrix")
                .contains("Invalid under this profile")
                .contains("/batch-report");
        // the home page lists the suite with its last verdict in words
        String home = mvc.perform(get("/")).andReturn().getResponse().getContentAsString();
        String verdictWord = dev.driftlab.evaluation.Verdict.byFileName(
                        done.get("verdict").asString())
                .orElseThrow()
                .word();
        assertThat(home).contains("/suites/" + view).contains("class=\"verdict-word\">" + verdictWord + "<");
        String result = mvc.perform(get("/api/suite-runs/" + token + "/result"))
                .andExpect(status().isOk())
                .andReturn()
                .getResponse()
                .getContentAsString();
        assertThat(result).contains("driftlab-suite-result/1");
        // the files the command line writes, and a PDF from the same page (the XHTML form parses)
        byte[] pdf = mvc.perform(get("/suite-runs/" + token + "/report.pdf"))
                .andExpect(status().isOk())
                .andReturn()
                .getResponse()
                .getContentAsByteArray();
        assertThat(new String(pdf, 0, 5, java.nio.charset.StandardCharsets.ISO_8859_1))
                .isEqualTo("%PDF-");
        assertThat(mvc.perform(get("/suite-runs/" + token + "/report.html"))
                        .andReturn()
                        .getResponse()
                        .getContentAsString())
                .contains("Suite report: Nightly");
        assertThat(mvc.perform(get("/suite-runs/" + token + "/junit.xml"))
                        .andReturn()
                        .getResponse()
                        .getContentAsString())
                .contains("<testsuite");
    }

    @Test
    void cancel_needsTheEditLink_andEndsTheRunIncomplete() throws Exception {
        JsonNode created = create(suite("[{\"link\": \"" + samples.get(0) + "\"}]", "[]"), 201);
        String view = created.get("viewLink").asString();
        String edit = created.get("editLink").asString();
        executor.holdRuns();
        JsonNode run =
                JSON.readTree(mvc.perform(post("/api/suites/" + view + "/runs").with(csrf()))
                        .andExpect(status().isAccepted())
                        .andReturn()
                        .getResponse()
                        .getContentAsString());
        String token = run.get("link").asString();
        String page =
                mvc.perform(get("/suites/" + edit)).andReturn().getResponse().getContentAsString();
        java.util.regex.Matcher m =
                java.util.regex.Pattern.compile("/runs/(\\d+)/cancel").matcher(page);
        assertThat(m.find()).as("a cancel button on the edit page").isTrue();
        long id = Long.parseLong(m.group(1));
        assertThat(mvc.perform(get("/suites/" + view)).andReturn().getResponse().getContentAsString())
                .doesNotContain("/cancel");
        mvc.perform(post("/api/suites/" + view + "/runs/" + id + "/cancel").with(csrf()))
                .andExpect(status().isForbidden());
        mvc.perform(post("/api/suites/" + edit + "/runs/" + id + "/cancel").with(csrf()))
                .andExpect(status().isOk());
        JsonNode done = getJson("/api/suite-runs/" + token);
        assertThat(done.get("state").asString()).isEqualTo("finished");
        assertThat(done.get("verdict").asString()).isEqualTo("incomplete");
        assertThat(done.get("cells").get(0).get("runState").asString()).isEqualTo("cancelled");
    }

    @Test
    void reissue_theOldEditLinkOpensNothing_andAViewLinkCannotReissue() throws Exception {
        JsonNode created = create(suite("[{\"link\": \"" + samples.get(0) + "\"}]", "[]"), 201);
        String view = created.get("viewLink").asString();
        String edit = created.get("editLink").asString();
        mvc.perform(post("/api/suites/" + view + "/links/edit/reissue").with(csrf()))
                .andExpect(status().isForbidden());
        String fresh = JSON.readTree(mvc.perform(post("/api/suites/" + edit + "/links/edit/reissue")
                                .with(csrf()))
                        .andExpect(status().isOk())
                        .andReturn()
                        .getResponse()
                        .getContentAsString())
                .get("edit")
                .asString();
        mvc.perform(get("/api/suites/" + edit)).andExpect(status().isNotFound());
        assertThat(getJson("/api/suites/" + fresh).get("canEdit").asBoolean()).isTrue();
        assertThat(getJson("/api/suites/" + view).get("canEdit").asBoolean()).isFalse();
    }
}
