package dev.driftlab.app.scenarios.web;

import static org.assertj.core.api.Assertions.assertThat;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.csrf;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.get;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.post;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.header;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.redirectedUrl;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.redirectedUrlPattern;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.status;

import dev.driftlab.app.WebSlice;
import dev.driftlab.app.scenarios.ScenarioStore;
import dev.driftlab.scenario.Scenarios;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.test.web.servlet.MockMvc;

@WebSlice
class ScenarioPagesTest {

    @Autowired
    MockMvc mvc;

    @Autowired
    ScenarioStore store;

    ScenarioStore.Created c;

    @BeforeEach
    void scenario() {
        c = store.create(Scenarios.corridor().withName("Page test").json(), "Ana", "start");
    }

    private String body(org.springframework.test.web.servlet.RequestBuilder r, int status) throws Exception {
        return mvc.perform(r)
                .andExpect(status().is(status))
                .andReturn()
                .getResponse()
                .getContentAsString();
    }

    @Test
    void scenarioPage_withEditLink_showsSummaryPlanCheckRevisionsSharePanelAndRuns() throws Exception {
        String html = body(get("/s/" + c.editToken()), 200);

        assertThat(html).contains("Page test").contains("<svg").contains("Valid");
        assertThat(html).contains("Revisions").contains("id=\"share\"").contains(c.viewToken());
        assertThat(html).contains("id=\"runs\"").contains("Edit JSON");
        assertThat(html).contains("Simulation results do not certify safety");
    }

    @Test
    void scenarioPage_withViewLink_hidesEditingAndSharing() throws Exception {
        String html = body(get("/s/" + c.viewToken()), 200);

        assertThat(html).contains("Page test").contains("View link");
        assertThat(html)
                .doesNotContain("id=\"share\"")
                .doesNotContain(c.editToken())
                .doesNotContain("Edit JSON");
        assertThat(html).contains("id=\"runs\"");
    }

    @Test
    void editForm_holdsTheLatestDocumentAndBaseRevision() throws Exception {
        String html = body(get("/s/" + c.editToken() + "/edit"), 200);

        assertThat(html).contains("name=\"baseRevision\" value=\"1\"").contains("driftlab-scenario/1");
    }

    @Test
    void save_withHtmx_redirectsThroughHeader_toTheScenario() throws Exception {
        mvc.perform(post("/s/" + c.editToken() + "/edit")
                        .header("HX-Request", "true")
                        .param("baseRevision", "1")
                        .param("author", "Ben")
                        .param("message", "renamed")
                        .param(
                                "document",
                                Scenarios.corridor().withName("Renamed").json())
                        .with(csrf()))
                .andExpect(status().isOk())
                .andExpect(header().string("HX-Redirect", "/s/" + c.editToken()));

        assertThat(store.view(c.scenarioId()).head().name()).isEqualTo("Renamed");
    }

    @Test
    void save_withoutHtmx_redirects() throws Exception {
        mvc.perform(post("/s/" + c.editToken() + "/edit")
                        .param("baseRevision", "1")
                        .param(
                                "document",
                                Scenarios.corridor().withName("Plain form").json())
                        .with(csrf()))
                .andExpect(redirectedUrl("/s/" + c.editToken()));
    }

    @Test
    void save_invalidDocument_answersTheFormFragmentWithTheProblems_andKeepsTheText() throws Exception {
        String bad = "{\"format\": \"driftlab-scenario/1\", \"name\": \"x\"}";
        String html = body(
                post("/s/" + c.editToken() + "/edit")
                        .header("HX-Request", "true")
                        .param("baseRevision", "1")
                        .param("document", bad)
                        .with(csrf()),
                422);

        assertThat(html).startsWith("<form id=\"edit-form\"").contains("Not saved; nothing was stored");
        assertThat(html)
                .contains("<code>site</code> <span>is required</span>")
                .contains("&quot;name&quot;: &quot;x&quot;");
        assertThat(store.history(c.scenarioId())).hasSize(1);
    }

    @Test
    void save_onAStaleRevision_answersTheConflict_andKeepsTheText() throws Exception {
        store.save(
                c.scenarioId(), 1, Scenarios.corridor().withName("Someone else").json(), "Cleo", "first");

        String html = body(
                post("/s/" + c.editToken() + "/edit")
                        .header("HX-Request", "true")
                        .param("baseRevision", "1")
                        .param("document", Scenarios.corridor().withName("Mine").json())
                        .with(csrf()),
                409);

        assertThat(html).contains("Not saved: you edited revision 1, but revision 2 (by Cleo)");
        assertThat(html).contains("Mine");
        assertThat(store.view(c.scenarioId()).head().name()).isEqualTo("Someone else");
    }

    @Test
    void history_listsEveryRevision() throws Exception {
        store.save(c.scenarioId(), 1, Scenarios.corridor().withName("Second").json(), "Ben", "second one");

        String html = body(get("/s/" + c.viewToken() + "/history"), 200);

        assertThat(html).contains("second one").contains("Ben").contains("with 1");
    }

    @Test
    void compare_withHtmx_answersTheDiffFragment_bySection() throws Exception {
        store.save(c.scenarioId(), 1, Scenarios.corridor().withName("Second").json(), "Ben", "renamed");

        String html = body(
                get("/s/" + c.viewToken() + "/compare")
                        .param("from", "1")
                        .param("to", "2")
                        .header("HX-Request", "true"),
                200);

        assertThat(html)
                .startsWith("<div class=\"diff\"")
                .contains("Name and description")
                .contains("Second");
        assertThat(body(
                        get("/s/" + c.viewToken() + "/compare")
                                .param("from", "1")
                                .param("to", "2"),
                        200))
                .contains("<html");
    }

    @Test
    void export_andRevisionExport_downloadTheDocument() throws Exception {
        assertThat(body(get("/s/" + c.viewToken() + "/export"), 200)).contains("Page test");
        mvc.perform(get("/s/" + c.viewToken() + "/revisions/1/export"))
                .andExpect(header().string("Content-Disposition", org.hamcrest.Matchers.containsString("rev1.json")));
        mvc.perform(get("/s/" + c.viewToken() + "/revisions/9/export")).andExpect(status().isNotFound());
    }

    @Test
    void duplicate_opensTheCopysEditLink() throws Exception {
        mvc.perform(post("/s/" + c.editToken() + "/duplicate").with(csrf())).andExpect(redirectedUrlPattern("/s/*"));
    }

    @Test
    void reissueViewLink_retiresTheOldOne() throws Exception {
        mvc.perform(post("/s/" + c.editToken() + "/links/view/reissue").with(csrf()))
                .andExpect(redirectedUrl("/s/" + c.editToken() + "#share"));

        mvc.perform(get("/s/" + c.viewToken())).andExpect(status().isNotFound());
    }

    @Test
    void reissueEditLink_movesToTheNewLink() throws Exception {
        mvc.perform(post("/s/" + c.editToken() + "/links/edit/reissue").with(csrf()))
                .andExpect(redirectedUrlPattern("/s/*#share"));

        mvc.perform(get("/s/" + c.editToken())).andExpect(status().isNotFound());
    }

    @Test
    void revokeEditLink_closesIt() throws Exception {
        mvc.perform(post("/s/" + c.editToken() + "/links/edit/revoke").with(csrf()))
                .andExpect(redirectedUrl("/"));

        mvc.perform(get("/s/" + c.editToken())).andExpect(status().isNotFound());
        mvc.perform(get("/s/" + c.viewToken())).andExpect(status().isOk());
    }
}
