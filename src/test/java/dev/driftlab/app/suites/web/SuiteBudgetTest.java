package dev.driftlab.app.suites.web;

import static org.assertj.core.api.Assertions.assertThat;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.csrf;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.post;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.status;

import dev.driftlab.app.WebSlice;
import dev.driftlab.app.runs.persistence.RunRepository;
import dev.driftlab.app.scenarios.ScenarioStore;
import dev.driftlab.app.sharing.ShareLinks;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.http.MediaType;
import org.springframework.jdbc.core.simple.JdbcClient;
import org.springframework.test.context.TestPropertySource;
import org.springframework.test.web.servlet.MockMvc;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;

/**
 * A suite submission is checked against the server's per-submission budget as a whole (every
 * scenario, column and seed), and refused with nothing queued: no run, no suite run, no cell.
 */
@WebSlice
@TestPropertySource(properties = "driftlab.runs.max-particle-beams=1e6")
class SuiteBudgetTest {

    @Autowired
    MockMvc mvc;

    @Autowired
    ScenarioStore scenarios;

    @Autowired
    ShareLinks links;

    @Autowired
    RunRepository runs;

    @Autowired
    JdbcClient jdbc;

    @Test
    void overTheBudget_refusedNamingTheLimit_andNothingIsQueued() throws Exception {
        List<String> samples = new ArrayList<>();
        for (long id : scenarios.sampleScenarios().values()) {
            samples.add(links.current(id).view().orElseThrow());
        }
        JsonMapper json = JsonMapper.builder().build();
        JsonNode created = json.readTree(mvc.perform(post("/api/suites")
                        .contentType(MediaType.APPLICATION_JSON)
                        .content("{\"name\": \"Big\", \"seeds\": 50, \"scenarios\": [{\"link\": \"" + samples.get(0)
                                + "\"}, {\"link\": \"" + samples.get(1) + "\"}]}")
                        .with(csrf()))
                .andExpect(status().isCreated())
                .andReturn()
                .getResponse()
                .getContentAsString());
        long before = runs.countAll();

        String answer = mvc.perform(
                        post("/api/suites/" + created.get("viewLink").asString() + "/runs")
                                .with(csrf()))
                .andExpect(status().is(422))
                .andReturn()
                .getResponse()
                .getContentAsString();

        assertThat(answer).contains("driftlab.runs.max-particle-beams").contains("\"field\":\"seeds\"");
        assertThat(runs.countAll()).isEqualTo(before);
        assertThat(jdbc.sql("SELECT COUNT(*) FROM suite_run").query(Long.class).single())
                .isZero();
        assertThat(jdbc.sql("SELECT COUNT(*) FROM suite_cell").query(Long.class).single())
                .isZero();
    }

    @Test
    void moreCellsThanTheServerEverHolds_refusedAsTooBig_notBusy() throws Exception {
        // 2 unit threads and 8 waiting places in tests: 4 scenarios x 3 columns = 12 cells
        StringBuilder entries = new StringBuilder();
        for (long id : scenarios.sampleScenarios().values()) {
            entries.append(entries.length() == 0 ? "" : ",")
                    .append("{\"link\": \"")
                    .append(links.current(id).view().orElseThrow())
                    .append("\", \"seeds\": 1}");
        }
        String profile = "{\"format\": \"driftlab-profile/1\", \"name\": \"%s\","
                + " \"localizer\": {\"particles\": {\"count\": 10}}}";
        JsonMapper json = JsonMapper.builder().build();
        JsonNode created = json.readTree(mvc.perform(post("/api/suites")
                        .contentType(MediaType.APPLICATION_JSON)
                        .content("{\"name\": \"Wide\", \"scenarios\": [" + entries + "], \"profiles\": ["
                                + profile.formatted("a") + ", " + profile.formatted("b") + "]}")
                        .with(csrf()))
                .andExpect(status().isCreated())
                .andReturn()
                .getResponse()
                .getContentAsString());
        String answer = mvc.perform(
                        post("/api/suites/" + created.get("viewLink").asString() + "/runs")
                                .with(csrf()))
                .andExpect(status().is(422))
                .andReturn()
                .getResponse()
                .getContentAsString();
        assertThat(answer).contains("12 cells").contains("at most 10 runs at once");
    }
}
