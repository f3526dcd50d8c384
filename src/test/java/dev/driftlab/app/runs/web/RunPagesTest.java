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
import dev.driftlab.evaluation.TrialEnd;
import dev.driftlab.evaluation.TrialOutcome;
import dev.driftlab.evaluation.Verdict;
import dev.driftlab.report.ResultJson;
import dev.driftlab.scenario.Scenarios;
import java.util.List;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.test.context.TestPropertySource;
import org.springframework.test.web.servlet.MockMvc;
import tools.jackson.databind.json.JsonMapper;
import tools.jackson.databind.node.ObjectNode;

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

        String page = body(get("/s/" + c.editToken() + "/runs/" + id), 200);
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
    void revokingTheViewLink_closesTheRunLinksOfEarlierRuns_andReissuingDoesNotReopenThem() throws Exception {
        long id = doneRun(1L);
        String token = runToken(id);
        body(get("/r/" + token), 200);

        mvc.perform(post("/s/" + c.editToken() + "/links/view/revoke").with(csrf()));
        for (String path : List.of("", "/report", "/batch-report", "/report.pdf", "/play")) {
            body(get("/r/" + token + path), 404);
        }
        body(get("/api/r/" + token), 404);
        mvc.perform(post("/s/" + c.editToken() + "/links/view/reissue").with(csrf()));
        body(get("/r/" + token), 404);

        Thread.sleep(5);
        long later = doneRun(2L);
        body(get("/r/" + runToken(later)), 200);
    }

    @Test
    void cancel_withAViewLink_isRefused_andTheRunGoesOn() throws Exception {
        long id = heldRun();

        String page =
                body(post("/s/" + c.viewToken() + "/runs/" + id + "/cancel").with(csrf()), 403);

        assertThat(page).contains("view link");
        assertThat(board.of(c.scenarioId(), id).state()).isEqualTo("running");
        assertThat(body(get("/s/" + c.viewToken() + "/runs/" + id), 200)).doesNotContain("/cancel");
    }

    @Test
    void cancel_withHtmx_answersTheProgressFragment_andTheRunEndsCancelled() throws Exception {
        long id = heldRun();

        body(
                post("/s/" + c.editToken() + "/runs/" + id + "/cancel")
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

    private String runToken(long id) {
        return board.of(c.scenarioId(), id).viewToken();
    }

    @Test
    void failingRun_showsFailWithItsCross_inTheRunsTableOnItsPageAndInThePlayer() throws Exception {
        executor.verdict = Verdict.FAIL;
        long id = doneRun(1L);

        String panel = body(get("/s/" + c.viewToken() + "/runs"), 200);
        String page = body(get("/s/" + c.viewToken() + "/runs/" + id), 200);
        String player = body(get("/r/" + runToken(id) + "/play"), 200);

        for (String html : List.of(panel, page, player)) {
            assertThat(html)
                    .contains("<span class=\"state done\">done</span>")
                    .contains("class=\"run-verdict verdict-fail\" data-verdict=\"fail\"")
                    // the symbol is for the eye only; the word is what a screen reader reads
                    .contains("<span class=\"verdict-symbol\" aria-hidden=\"true\">\u2717</span>")
                    .contains("<span class=\"verdict-word\">fail</span>")
                    .doesNotContain("verdict-pass");
        }
    }

    @Test
    void passingRun_showsPassWithItsTick_andEveryOtherVerdictItsOwnWordAndClass() throws Exception {
        long id = doneRun(1L);
        executor.verdict = Verdict.NOT_EXERCISED;
        long unexercised = doneRun(2L);

        String page = body(get("/s/" + c.viewToken() + "/runs/" + id), 200);
        String panel = body(get("/s/" + c.viewToken() + "/runs"), 200);

        assertThat(page)
                .contains("verdict-pass")
                .contains("<span class=\"verdict-symbol\" aria-hidden=\"true\">\u2713</span>")
                .contains("<span class=\"verdict-word\">pass</span>")
                .doesNotContain("verdict-fail");
        assertThat(panel)
                .contains("<span class=\"verdict-word\">pass</span>")
                .contains("class=\"run-verdict verdict-not-exercised\"")
                .contains("<span class=\"verdict-word\">not exercised</span>")
                .contains("\u2205");
        assertThat(body(get("/s/" + c.viewToken() + "/runs/" + unexercised), 200))
                .contains("not exercised");
    }

    @Test
    void runStillRunning_showsNoVerdictYet() throws Exception {
        long id = heldRun();

        assertThat(body(get("/s/" + c.viewToken() + "/runs/" + id), 200))
                .contains("<span class=\"state running\">running</span>")
                .doesNotContain("run-verdict");
        executor.release();
    }

    @Test
    void api_carriesTheVerdict_asInTheResultDocument_andNullWhileThereIsNone() throws Exception {
        executor.verdict = Verdict.ENDED_EARLY;
        long id = doneRun(1L);

        String one = body(get("/api/s/" + c.viewToken() + "/runs/" + id), 200);
        String shared = body(get("/api/r/" + runToken(id)), 200);
        long held = heldRun();
        String running = body(get("/api/s/" + c.viewToken() + "/runs/" + held), 200);

        assertThat(one).contains("\"verdict\":\"ended-early\"");
        assertThat(shared).contains("\"verdict\":\"ended-early\"");
        assertThat(running).contains("\"verdict\":null");
        executor.release();
    }

    @Test
    void runPage_showsTheHeadlineFindingsOfItsReport() throws Exception {
        // one trial that stopped at a contact: the finding names how many, where and when
        TrialOutcome t = new TrialOutcome(
                "base",
                1,
                37.25,
                0.25,
                0.2,
                0.3,
                Math.toRadians(2),
                4.0,
                List.of(),
                List.of(),
                1,
                500,
                new TrialEnd(TrialEnd.Kind.CONTACT, 37.25, 5.2, 5.9),
                List.of(),
                0.03,
                0.05);
        ObjectNode doc = JsonMapper.builder().build().createObjectNode();
        doc.put("format", "driftlab-result/2");
        doc.put("verdict", "ended-early");
        ResultJson.trialNode(doc.putArray("trials").addObject(), t);
        executor.result = doc.toString();
        executor.verdict = Verdict.ENDED_EARLY;
        long id = doneRun(1L);
        executor.result = "";
        long plain = doneRun(1L);

        assertThat(body(get("/s/" + c.viewToken() + "/runs/" + id), 200))
                .contains("Before trusting the verdict")
                .contains("1 of 1 trials stopped at a contact near (5.2, 5.9) at about 37 s");
        assertThat(body(get("/s/" + c.viewToken() + "/runs/" + plain), 200))
                .doesNotContain("Before trusting the verdict");
    }

    @Test
    void reportOfARunningRun_readsAsNotYetRun_andOnlyACancelledOneAsStoppedEarly() throws Exception {
        long id = heldRun();
        String token = runToken(id);

        String running = body(get("/r/" + token + "/report"), 200);
        assertThat(running).contains("not every trial has run").doesNotContain("cancelled");

        queue.cancel(id);
        while (!board.of(c.scenarioId(), id).state().equals("cancelled")) {
            Thread.sleep(10);
        }
        assertThat(body(get("/r/" + token + "/report"), 200))
                .contains("not every trial ran (stopped early)")
                .contains("(cancelled)");
    }
}
