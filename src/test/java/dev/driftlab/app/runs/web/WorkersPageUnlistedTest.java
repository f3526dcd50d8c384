package dev.driftlab.app.runs.web;

import static org.assertj.core.api.Assertions.assertThat;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.get;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.status;

import dev.driftlab.app.WebSlice;
import dev.driftlab.app.runs.persistence.RunRepository;
import dev.driftlab.app.scenarios.ScenarioStore;
import dev.driftlab.scenario.Scenarios;
import java.time.Duration;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.context.annotation.Import;
import org.springframework.jdbc.core.simple.JdbcClient;
import org.springframework.test.context.TestPropertySource;
import org.springframework.test.web.servlet.MockMvc;

/**
 * A server that does not list scenarios on its home page shows runs on the workers page by
 * number only: no scenario name, no link, no token of any kind.
 */
@WebSlice
@Import(WorkRows.FixedClock.class)
@TestPropertySource(properties = "driftlab.home.list-scenarios=false")
class WorkersPageUnlistedTest {

    @Autowired
    MockMvc mvc;

    @Autowired
    JdbcClient jdbc;

    @Autowired
    RunRepository runs;

    @Autowired
    ScenarioStore store;

    @Test
    void unlistedServer_namesRunsByNumberOnly_onThePageAndInTheApi() throws Exception {
        WorkRows rows = new WorkRows(jdbc, runs, store);
        rows.clear();
        ScenarioStore.Created c =
                store.create(Scenarios.corridor().withName("Dock aisle").json(), "Ana", "start");
        long run = rows.runningRun(c, WorkRows.seeds(1, 4));
        rows.process("test-alive", "rack-a", "worker", 4, Duration.ofSeconds(1), false);
        rows.unit(run, 0, 0, 2, "running", "test-alive", 1, 0.5);
        String runToken = runs.find(run).orElseThrow().viewToken();

        String html = mvc.perform(get("/workers"))
                .andExpect(status().isOk())
                .andReturn()
                .getResponse()
                .getContentAsString();
        String json = mvc.perform(get("/api/workers"))
                .andExpect(status().isOk())
                .andReturn()
                .getResponse()
                .getContentAsString();

        assertThat(html)
                .contains("run #" + run)
                .contains("unit 1, 50 % done")
                .contains("does not list scenarios")
                .doesNotContain("Dock aisle")
                .doesNotContain("/runs/" + run);
        assertThat(json)
                .contains("\"run\":" + run)
                .contains("\"scenario\":null")
                .contains("\"runPath\":null")
                .contains("\"scenariosShown\":false")
                .doesNotContain("Dock aisle");
        for (String token : new String[] {c.viewToken(), c.editToken(), runToken}) {
            assertThat(html).doesNotContain(token);
            assertThat(json).doesNotContain(token);
        }
    }
}
