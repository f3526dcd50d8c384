package dev.driftlab.app.system.web;

import static org.assertj.core.api.Assertions.assertThat;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.csrf;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.get;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.post;

import dev.driftlab.app.WebSlice;
import dev.driftlab.app.scenarios.ScenarioStore;
import dev.driftlab.scenario.Scenarios;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.mock.web.MockHttpServletResponse;
import org.springframework.test.web.servlet.MockMvc;
import org.springframework.test.web.servlet.RequestBuilder;
import org.springframework.test.web.servlet.request.MockHttpServletRequestBuilder;

@WebSlice
class HtmxArgumentTest {

    @Autowired
    MockMvc mvc;

    @Autowired
    ScenarioStore store;

    private MockHttpServletResponse perform(RequestBuilder r) throws Exception {
        return mvc.perform(r).andReturn().getResponse();
    }

    private static MockHttpServletRequestBuilder htmx(MockHttpServletRequestBuilder r) {
        return r.header("HX-Request", "true");
    }

    @Test
    void home_withHeader_answersTheFragment_andVariesOnTheHeader() throws Exception {
        MockHttpServletResponse r = perform(htmx(get("/")));

        assertThat(r.getStatus()).isEqualTo(200);
        assertThat(r.getContentAsString()).startsWith("<div id=\"scenario-list\"");
        assertThat(r.getHeaders("Vary")).contains("HX-Request");
    }

    @Test
    void home_withoutHeader_answersThePage_andStillVariesOnTheHeader() throws Exception {
        MockHttpServletResponse r = perform(get("/"));

        assertThat(r.getContentAsString()).contains("<html");
        assertThat(r.getHeaders("Vary")).contains("HX-Request");
    }

    @Test
    void compareAndSave_withHeader_varyOnTheHeader_once() throws Exception {
        ScenarioStore.Created c =
                store.create(Scenarios.corridor().withName("Vary").json(), "Ana", "start");
        store.save(c.scenarioId(), 1, Scenarios.corridor().withName("Vary 2").json(), "Ana", "renamed");

        MockHttpServletResponse compare = perform(
                htmx(get("/s/" + c.viewToken() + "/compare").param("from", "1").param("to", "2")));
        MockHttpServletResponse save = perform(htmx(post("/s/" + c.editToken() + "/edit")
                .param("baseRevision", "1")
                .param("document", "{")
                .with(csrf())));

        assertThat(compare.getContentAsString()).startsWith("<div class=\"diff\"");
        assertThat(compare.getHeaders("Vary")).containsOnlyOnce("HX-Request");
        assertThat(save.getStatus()).isGreaterThanOrEqualTo(400);
        assertThat(save.getContentAsString()).doesNotContain("<html");
        assertThat(save.getHeaders("Vary")).containsOnlyOnce("HX-Request");
    }

    @Test
    void pageThatNeverAnswersAFragment_doesNotVaryOnTheHeader() throws Exception {
        ScenarioStore.Created c =
                store.create(Scenarios.corridor().withName("Plain").json(), "Ana", "start");

        MockHttpServletResponse r = perform(htmx(get("/s/" + c.viewToken() + "/history")));

        assertThat(r.getStatus()).isEqualTo(200);
        assertThat(r.getHeaders("Vary")).doesNotContain("HX-Request");
    }
}
