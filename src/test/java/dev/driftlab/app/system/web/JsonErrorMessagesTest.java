package dev.driftlab.app.system.web;

import static org.assertj.core.api.Assertions.assertThat;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.post;

import dev.driftlab.app.WebSlice;
import dev.driftlab.app.scenarios.ScenarioStore;
import dev.driftlab.scenario.Scenarios;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.http.MediaType;
import org.springframework.test.web.servlet.MockMvc;
import org.springframework.test.web.servlet.MvcResult;

/** Bodies that do not read are explained in our words with the field path, never the JSON library's. */
@WebSlice
class JsonErrorMessagesTest {

    @Autowired
    MockMvc mvc;

    @Autowired
    ScenarioStore store;

    String view;

    @BeforeEach
    void scenario() {
        view = store.create(Scenarios.corridor().json(), "Ana", "start").viewToken();
    }

    private MvcResult send(String path, String body) throws Exception {
        return mvc.perform(post(path).contentType(MediaType.APPLICATION_JSON).content(body))
                .andReturn();
    }

    private static String deep(int levels) {
        return "[".repeat(levels) + "]".repeat(levels);
    }

    private static void inOurWords(MvcResult r, int status) throws Exception {
        String body = r.getResponse().getContentAsString();
        assertThat(r.getResponse().getStatus()).as(body).isEqualTo(status);
        assertThat(body)
                .doesNotContain("jackson")
                .doesNotContain("Exception")
                .doesNotContain("Feature")
                .doesNotContain("Constraints")
                .doesNotContain("`")
                .doesNotContain("java.");
    }

    @Test
    void batchBody_malformed_textForANumber_trailingGarbage_deepNesting() throws Exception {
        String batches = "/api/s/" + view + "/batches";

        MvcResult malformed = send(batches, "{\"firstSeed\": }");
        MvcResult text = send(batches, "{\"firstSeed\": \"seven\"}");
        MvcResult trailing = send(batches, "{} x");
        MvcResult nested = send(batches, "{\"variants\": " + deep(2_000) + "}");

        inOurWords(malformed, 400);
        assertThat(malformed.getResponse().getContentAsString()).contains("body: is not valid JSON at line 1");
        inOurWords(text, 400);
        assertThat(text.getResponse().getContentAsString()).contains("firstSeed: expected a number");
        inOurWords(trailing, 400);
        inOurWords(nested, 400);
    }

    @Test
    void scenarioDocument_malformedOrTooDeep_isRefusedInOurWords() throws Exception {
        inOurWords(send("/api/scenarios", "{\"format\": \"driftlab-scenario/1\", "), 422);
        inOurWords(send("/api/scenarios", deep(2_000)), 422);
        inOurWords(send("/api/scenarios", "{\"format\": \"driftlab-scenario/1\"} }"), 422);
    }
}
