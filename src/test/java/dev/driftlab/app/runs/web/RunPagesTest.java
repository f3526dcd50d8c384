package dev.driftlab.app.runs.web;

import static org.assertj.core.api.Assertions.assertThat;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.csrf;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.get;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.post;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.header;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.redirectedUrlPattern;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.status;

import dev.driftlab.app.Polling;
import dev.driftlab.app.WebSlice;
import dev.driftlab.app.runs.RunBoard;
import dev.driftlab.app.runs.RunQueue;
import dev.driftlab.app.runs.ScriptedTrialExecutor;
import dev.driftlab.app.runs.TrialOptions;
import dev.driftlab.app.scenarios.ScenarioStore;
import dev.driftlab.scenario.Scenarios;
import java.util.List;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.test.context.TestPropertySource;
import org.springframework.test.web.servlet.MockMvc;

@WebSlice
@TestPropertySource(properties = {"driftlab.runs.workers=1", "driftlab.runs.queue-capacity=1"})
class RunPagesTest {

    @Autowired
    MockMvc mvc;

    @Autowired
    ScenarioStore store;

    @Autowired
    RunQueue queue;

    @Autowired
    RunBoard board;

    @Autowired
    ScriptedTrialExecutor executor;

    ScenarioStore.Created c;

    @BeforeEach
    void scenario() {
        executor.reset();
        c = store.create(Scenarios.corridor().json(), "Ana", "start");
    }

    @AfterEach
    void release() throws Exception {
        executor.release();
        Polling.until("the run queue emptying", () -> queue.freePlaces() == queue.places());
    }

    private long heldRun() throws Exception {
        executor.holdRuns();
        long id = queue.submit(
                        c.scenarioId(),
                        store.view(c.scenarioId()).latest().id(),
                        List.of("base"),
                        List.of(1L),
                        TrialOptions.resultsOnly())
                .runIds()
                .get(0);
        Polling.until(
                "run " + id + " running",
                () -> board.of(c.scenarioId(), id).state().equals("running"));
        return id;
    }

    private long doneRun(Long... seeds) throws Exception {
        long id = queue.submit(
                        c.scenarioId(),
                        store.view(c.scenarioId()).latest().id(),
                        List.of("base"),
                        List.of(seeds),
                        TrialOptions.resultsOnly())
                .runIds()
                .get(0);
        Polling.until(
                "run " + id + " done",
                () -> board.of(c.scenarioId(), id).state().equals("done"));
        return id;
    }

    private String body(org.springframework.test.web.servlet.RequestBuilder r, int status) throws Exception {
        return mvc.perform(r)
                .andExpect(status().is(status))
                .andReturn()
                .getResponse()
                .getContentAsString();
    }

    @Test
    void submit_withHtmx_answersTheRunsPanel_pollingWhileBusy() throws Exception {
        executor.holdRuns();

        String html = body(
                post("/s/" + c.viewToken() + "/runs")
                        .header("HX-Request", "true")
                        .param("variants", "base")
                        .param("firstSeed", "1")
                        .param("seedCount", "3")
                        .with(csrf()),
                200);

        assertThat(html)
                .startsWith("<div id=\"runs\"")
                .contains("hx-trigger=\"every 1s\"")
                .contains("base");
        executor.release();
    }

    @Test
    void submit_withoutHtmx_redirectsToTheRunsPanel() throws Exception {
        mvc.perform(post("/s/" + c.viewToken() + "/runs")
                        .param("seedCount", "2")
                        .with(csrf()))
                .andExpect(redirectedUrlPattern("/s/*#runs"));
    }

    @Test
    void runsPanel_isAFragment() throws Exception {
        assertThat(body(get("/s/" + c.viewToken() + "/runs"), 200))
                .startsWith("<div id=\"runs\"")
                .contains("No runs yet");
    }

    @Test
    void runPage_showsProgress_andTheProgressFragmentPollsUntilDone() throws Exception {
        long id = heldRun();

        String page = body(get("/s/" + c.viewToken() + "/runs/" + id), 200);
        String fragment = body(get("/s/" + c.viewToken() + "/runs/" + id).header("HX-Request", "true"), 200);

        assertThat(page).contains("<html").contains("running").contains("Cancel");
        assertThat(fragment).startsWith("<div id=\"run-progress\"").contains("hx-trigger=\"every 1s\"");
        executor.release();
        Polling.until(
                "run " + id + " done",
                () -> board.of(c.scenarioId(), id).state().equals("done"));
        String over = body(get("/s/" + c.viewToken() + "/runs/" + id).header("HX-Request", "true"), 200);
        assertThat(over)
                .contains("done")
                .doesNotContain("hx-trigger")
                .contains("Run again")
                .contains("&quot;trials&quot;:1");
    }

    @Test
    void cancel_withHtmx_answersTheProgressFragment_andTheRunEndsCancelled() throws Exception {
        long id = heldRun();

        body(
                post("/s/" + c.viewToken() + "/runs/" + id + "/cancel")
                        .header("HX-Request", "true")
                        .with(csrf()),
                200);

        Polling.until(
                "run " + id + " cancelled",
                () -> board.of(c.scenarioId(), id).state().equals("cancelled"));
        assertThat(board.of(c.scenarioId(), id).state()).isEqualTo("cancelled");
    }

    @Test
    void rerun_opensTheNewRun() throws Exception {
        long id = doneRun(1L);

        mvc.perform(post("/s/" + c.viewToken() + "/runs/" + id + "/rerun").with(csrf()))
                .andExpect(redirectedUrlPattern("/s/" + c.viewToken() + "/runs/*"));
    }

    @Test
    void replay_offersTheRunsSeeds_opensTheNewRun_andRefusesABadSeedNamingTheField() throws Exception {
        long id = doneRun(3L, 4L);
        String page = body(get("/s/" + c.viewToken() + "/runs/" + id), 200);
        assertThat(page).contains("Replay it with frames").contains("<option value=\"4\">4</option>");

        assertThat(body(
                        post("/s/" + c.viewToken() + "/runs/" + id + "/replay")
                                .param("seed", "x4")
                                .with(csrf()),
                        422))
                .contains("seed: &#39;x4&#39; is not a whole number");
        assertThat(body(
                        post("/s/" + c.viewToken() + "/runs/" + id + "/replay")
                                .param("seed", "5")
                                .with(csrf()),
                        422))
                .contains("seed 5 is not one of this run");
        mvc.perform(post("/s/" + c.viewToken() + "/runs/" + id + "/replay")
                        .param("seed", "4")
                        .with(csrf()))
                .andExpect(redirectedUrlPattern("/s/" + c.viewToken() + "/runs/*"));
    }

    @Test
    void sweep_fromTheForm_queuesTheCount_andBadCountsOrTwoVariantsAreRefusedNamingTheField() throws Exception {
        String bad = body(
                post("/s/" + c.viewToken() + "/runs")
                        .with(csrf())
                        .param("variants", "base")
                        .param("seedCount", "2")
                        .param("particleCounts", "300, lots"),
                422);
        String two = body(
                post("/s/" + c.viewToken() + "/runs")
                        .with(csrf())
                        .param("variants", "base", "base")
                        .param("particleCounts", "300"),
                422);
        assertThat(bad).contains("particleCounts: &#39;lots&#39; is not a whole number");
        assertThat(two).contains("particleCounts: a sweep varies one settings variant");

        String panel = body(
                post("/s/" + c.viewToken() + "/runs")
                        .with(csrf())
                        .header("HX-Request", "true")
                        .param("variants", "base")
                        .param("seedCount", "2")
                        .param("particleCounts", "1000"),
                200);
        assertThat(panel).contains("base at 1,000 particles").contains("name=\"particleCounts\"");
    }

    @Test
    void fullQueue_answers503BusyTryLater_andQueuesNothing() throws Exception {
        heldRun();
        queue.submit(
                c.scenarioId(),
                store.view(c.scenarioId()).latest().id(),
                List.of("base"),
                List.of(2L),
                TrialOptions.resultsOnly());

        String html = mvc.perform(post("/s/" + c.viewToken() + "/runs")
                        .param("seedCount", "1")
                        .with(csrf()))
                .andExpect(status().isServiceUnavailable())
                .andExpect(header().string("Retry-After", "10"))
                .andReturn()
                .getResponse()
                .getContentAsString();
        assertThat(html).contains("Busy, try later").contains("Nothing was queued");
        assertThat(board.recent(c.scenarioId(), 10)).hasSize(2);
    }

    @Test
    void runViewLink_showsTheRunReadOnly_andAnUnknownOneIs404() throws Exception {
        long id = queue.submit(
                        c.scenarioId(),
                        store.view(c.scenarioId()).latest().id(),
                        List.of("base"),
                        List.of(1L),
                        TrialOptions.resultsOnly())
                .runIds()
                .get(0);
        String token = board.of(c.scenarioId(), id).viewToken();

        String html = body(get("/r/" + token), 200);

        assertThat(html).contains("Run #" + id).doesNotContain("Cancel").doesNotContain(c.viewToken());
        mvc.perform(get("/r/" + "A".repeat(43))).andExpect(status().isNotFound());
    }

    @Test
    void runOfAnotherScenario_is404() throws Exception {
        ScenarioStore.Created other = store.create(Scenarios.corridor().json(), "Ben", "other");
        long id = queue.submit(
                        other.scenarioId(),
                        store.view(other.scenarioId()).latest().id(),
                        List.of("base"),
                        List.of(1L),
                        TrialOptions.resultsOnly())
                .runIds()
                .get(0);

        mvc.perform(get("/s/" + c.viewToken() + "/runs/" + id)).andExpect(status().isNotFound());
    }
}
