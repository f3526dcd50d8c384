package dev.driftlab.app.player.web;

import static org.assertj.core.api.Assertions.assertThat;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.get;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.jsonPath;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.redirectedUrl;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.status;

import dev.driftlab.app.Polling;
import dev.driftlab.app.WebSlice;
import dev.driftlab.app.runs.RunBoard;
import dev.driftlab.app.runs.RunQueue;
import dev.driftlab.app.runs.ScriptedTrialExecutor;
import dev.driftlab.app.runs.TrialOptions;
import dev.driftlab.app.runs.persistence.RunRepository;
import dev.driftlab.app.runs.persistence.RunRepository.RunRow;
import dev.driftlab.app.scenarios.ScenarioStore;
import dev.driftlab.evaluation.BatchSummary;
import dev.driftlab.evaluation.Episode;
import dev.driftlab.evaluation.KidnapOutcome;
import dev.driftlab.evaluation.TrialOutcome;
import dev.driftlab.geometry.Bounds;
import dev.driftlab.geometry.Pose;
import dev.driftlab.recording.Frame;
import dev.driftlab.recording.FrameHypothesis;
import dev.driftlab.recording.FrameRecorder;
import dev.driftlab.report.Report;
import dev.driftlab.report.ResultJson;
import dev.driftlab.scenario.FaultKind;
import dev.driftlab.scenario.Scenario;
import dev.driftlab.scenario.Scenarios;
import dev.driftlab.trial.BatchResult;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import java.util.OptionalInt;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.jdbc.core.simple.JdbcClient;
import org.springframework.test.web.servlet.MockMvc;

/**
 * The player's scene and frame endpoints and the report pages over a stored run: real frame
 * chunks from the recorder and a real result document, written as the engine would.
 */
@WebSlice
class PlayerApiTest {

    @Autowired
    MockMvc mvc;

    @Autowired
    ScenarioStore store;

    @Autowired
    RunQueue queue;

    @Autowired
    RunBoard board;

    @Autowired
    RunRepository runs;

    @Autowired
    JdbcClient jdbc;

    @Autowired
    ScriptedTrialExecutor executor;

    ScenarioStore.Created c;
    RunRow run;

    @BeforeEach
    void storedRun() throws Exception {
        executor.reset();
        Scenario scenario =
                Scenarios.corridor().withKidnapAt(3, Pose.of(15, 1, 0)).build();
        c = store.create(Scenarios.corridor().withKidnapAt(3, Pose.of(15, 1, 0)).json(), "Ana", "start");
        long id = doneRun(c.scenarioId()).id();
        storeResult(id, scenario, 1.1, 0.2);
        storeFrames(id);
        run = board.of(c.scenarioId(), id);
    }

    /** Twenty recorded frames in chunks of ten, the truth jumping at frame 3 (a kidnap). */
    private void storeFrames(long runId) {
        List<byte[]> chunks = new ArrayList<>();
        FrameRecorder rec =
                new FrameRecorder(new Bounds(0, 0, 20, 6), 12, 10, (index, first, count, data) -> chunks.add(data));
        for (int i = 0; i < 20; i++) {
            rec.accept(frame(i));
        }
        rec.finish();
        for (int i = 0; i < chunks.size(); i++) {
            runs.insertChunk(runId, i, chunks.get(i));
        }
    }

    private static Frame frame(int i) {
        int n = 40;
        float[] x = new float[n];
        float[] y = new float[n];
        float[] h = new float[n];
        float[] w = new float[n];
        for (int k = 0; k < n; k++) {
            x[k] = 1 + 0.1f * k;
            y[k] = 1;
            w[k] = 1f / n;
        }
        float[] ranges = new float[10];
        java.util.Arrays.fill(ranges, 2.5f);
        // the truth jumps at frame 3, the estimate does not
        Pose truth = i < 3 ? Pose.of(1 + 0.1 * i, 1, 0) : Pose.of(15, 1, 0);
        return new Frame(
                i,
                0.1 * (i + 1),
                truth,
                Pose.of(1 + 0.1 * i, 1, 0),
                Pose.of(1 + 0.1 * i, 1, 0),
                List.of(new FrameHypothesis(1, 1, 1, 0, 0.01, 0, 0.02)),
                30,
                0.4,
                0.38,
                0.41,
                i == 4 ? 5 : 0,
                ranges,
                x,
                y,
                h,
                w,
                i == 3 ? List.of("kidnap kidnap") : List.of());
    }

    @Test
    void scene_hasMapBeamsKidnapsAndFrameCount_throughBothLinks() throws Exception {
        for (String url : List.of(
                "/api/r/" + run.viewToken() + "/scene", "/api/s/" + c.viewToken() + "/runs/" + run.id() + "/scene")) {
            mvc.perform(get(url))
                    .andExpect(status().isOk())
                    .andExpect(jsonPath("$.scenario").value("Test corridor"))
                    .andExpect(jsonPath("$.frameCount").value(20))
                    .andExpect(jsonPath("$.framesPerChunk").value(10))
                    .andExpect(jsonPath("$.chunks.length()").value(2))
                    .andExpect(jsonPath("$.kidnaps[0].recoveredAfter").value(1.1))
                    // the player names the outcome's marks with the kind's label, not its own word
                    .andExpect(jsonPath("$.kidnaps[0].label").value(FaultKind.KIDNAP.label()))
                    .andExpect(jsonPath("$.faults[0].kind").value("kidnap"))
                    .andExpect(jsonPath("$.walls.length()").value(org.hamcrest.Matchers.greaterThan(4)))
                    .andExpect(jsonPath("$.walls[0].length()").value(4))
                    .andExpect(jsonPath("$.series.time.length()").value(20))
                    .andExpect(jsonPath("$.series.positionError[3]").value(13.7))
                    .andExpect(jsonPath("$.beams.length()").value(org.hamcrest.Matchers.greaterThan(0)));
        }
    }

    @Test
    void scene_carriesHowThePlayedTrialEnded_soThePlayerCanMarkAnEarlyStop() throws Exception {
        Scenario scenario =
                Scenarios.corridor().withKidnapAt(3, Pose.of(15, 1, 0)).build();
        mvc.perform(get("/api/r/" + run.viewToken() + "/scene"))
                .andExpect(jsonPath("$.end.kind").value("completed"));
        // a finished run's scene is kept once built, so the early stop is another run's
        RunRow stopped = doneRun(c.scenarioId());

        storeResult(
                stopped.id(),
                scenario,
                "base",
                1.1,
                0.2,
                OptionalInt.empty(),
                new dev.driftlab.evaluation.TrialEnd(dev.driftlab.evaluation.TrialEnd.Kind.CONTACT, 1.5, 5.2, 1.1));

        mvc.perform(get("/api/r/" + stopped.viewToken() + "/scene"))
                .andExpect(status().isOk())
                .andExpect(jsonPath("$.end.kind").value("contact"))
                .andExpect(jsonPath("$.end.time").value(1.5))
                .andExpect(jsonPath("$.end.x").value(5.2))
                .andExpect(jsonPath("$.end.y").value(1.1));
        assertThat(page("/r/" + run.viewToken() + "/play")).contains("Next fault, episode or stop (N)");
    }

    @Test
    void frames_decodeAChunk_withParticlesScanAndEvents() throws Exception {
        mvc.perform(get("/api/r/" + run.viewToken() + "/frames/0/json"))
                .andExpect(status().isOk())
                .andExpect(jsonPath("$.first").value(0))
                .andExpect(jsonPath("$.frames.length()").value(10))
                .andExpect(jsonPath("$.frames[3].truth[0]").value(15.0))
                .andExpect(jsonPath("$.frames[3].estimate[0]").value(1.3))
                .andExpect(jsonPath("$.frames[3].events[0]").value("kidnap kidnap"))
                .andExpect(jsonPath("$.frames[3].px.length()").value(40))
                .andExpect(jsonPath("$.frames[3].pw[0]").value(1.0))
                .andExpect(jsonPath("$.frames[3].ranges.length()").value(10))
                .andExpect(jsonPath("$.frames[4].injected").value(5));
        mvc.perform(get("/api/s/" + c.viewToken() + "/runs/" + run.id() + "/frames/1/json"))
                .andExpect(status().isOk())
                .andExpect(jsonPath("$.first").value(10));
    }

    @Test
    void unknownTokensAndChunks_are404_andADamagedChunkSaysSo() throws Exception {
        mvc.perform(get("/api/r/AAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAA/scene")).andExpect(status().isNotFound());
        mvc.perform(get("/api/r/nope/frames/0/json")).andExpect(status().isNotFound());
        mvc.perform(get("/api/s/nope/runs/" + run.id() + "/scene")).andExpect(status().isNotFound());
        mvc.perform(get("/api/r/" + run.viewToken() + "/frames/9/json")).andExpect(status().isNotFound());
        runs.insertChunk(run.id(), 5, "not a chunk".getBytes(java.nio.charset.StandardCharsets.UTF_8));
        String body = mvc.perform(get("/api/r/" + run.viewToken() + "/frames/5/json"))
                .andExpect(status().isUnprocessableContent())
                .andReturn()
                .getResponse()
                .getContentAsString();
        assertThat(body).contains("could not be read").doesNotContain("Exception");
    }

    @Test
    void playerPage_loadsItsModule_andTheScenarioLinkRedirects() throws Exception {
        String html = mvc.perform(get("/r/" + run.viewToken() + "/play"))
                .andExpect(status().isOk())
                .andReturn()
                .getResponse()
                .getContentAsString();
        assertThat(html)
                .contains("/assets/player/player.js")
                .contains("data-a=\"/api/r/" + run.viewToken() + "\"")
                .contains("id=\"view-a\"")
                .doesNotContain("id=\"view-b\"")
                .doesNotContain("onclick");
        mvc.perform(get("/s/" + c.viewToken() + "/runs/" + run.id() + "/play"))
                .andExpect(redirectedUrl("/r/" + run.viewToken() + "/play"));
        mvc.perform(get("/r/nope/play")).andExpect(status().isNotFound());
    }

    @Test
    void playerPage_comparesWithAPastedRunLinkOfTheSameScenario_andExplainsOtherLinks() throws Exception {
        RunRow second = doneRun(c.scenarioId());
        String foreignToken = doneRun(store.create(Scenarios.corridor().json(), "Ben", "other")
                        .scenarioId())
                .viewToken();

        String pasted =
                page("/r/" + run.viewToken() + "/play?link=http://example.test/r/" + second.viewToken() + "/play");
        String wrongScenario = page("/r/" + run.viewToken() + "/play?link=/r/" + foreignToken);
        String notALink = page("/r/" + run.viewToken() + "/play?link=hello");

        assertThat(pasted)
                .contains("data-b=\"/api/r/" + second.viewToken() + "\"")
                .contains("id=\"view-b\"");
        assertThat(wrongScenario)
                .contains("only runs of this scenario can be compared")
                .doesNotContain("id=\"view-b\"");
        assertThat(notALink).contains("That is not a run link").doesNotContain("id=\"view-b\"");
    }

    /** Stores a one-trial result of seed 7: a kidnap recovered after the given time, this RMS error. */
    private void storeResult(long runId, Scenario scenario, double recoveredAfter, double rmse) {
        storeResult(runId, scenario, "base", recoveredAfter, rmse, OptionalInt.empty());
    }

    private void storeResult(
            long runId, Scenario scenario, String variant, double recoveredAfter, double rmse, OptionalInt kld) {
        storeResult(
                runId,
                scenario,
                variant,
                recoveredAfter,
                rmse,
                kld,
                dev.driftlab.evaluation.TrialEnd.completed(1.9, 0, 0));
    }

    private void storeResult(
            long runId,
            Scenario scenario,
            String variant,
            double recoveredAfter,
            double rmse,
            OptionalInt kld,
            dev.driftlab.evaluation.TrialEnd end) {
        TrialOutcome t = new TrialOutcome(
                variant,
                7,
                1.9,
                rmse,
                0.1,
                0.05,
                0.01,
                0.4,
                List.<Episode>of(),
                List.of(new KidnapOutcome(0.3, 0.2, recoveredAfter)),
                0,
                300,
                end,
                List.of(),
                Double.NaN,
                Double.NaN);
        Report report = Report.of(
                Report.Kind.RUN,
                scenario,
                "test",
                new long[] {7},
                new BatchResult(List.of(t), BatchSummary.of(List.of(t), scenario), 1, false, 1),
                Optional.empty(),
                kld,
                new int[0],
                "2026-01-01T00:00:00Z");
        jdbc.sql("UPDATE run SET result = ? WHERE id = ?")
                .params(ResultJson.render(report), runId)
                .update();
    }

    @Test
    void sweepBatchReport_chartsTheCounts_andFlagsThoseBelowTheKldBound() throws Exception {
        Scenario scenario =
                Scenarios.corridor().withKidnapAt(3, Pose.of(15, 1, 0)).build();
        List<Long> ids = queue.submitSweep(
                        c.scenarioId(),
                        store.view(c.scenarioId()).latest().id(),
                        List.of("base"),
                        List.of(300, 1000),
                        List.of(7L),
                        false,
                        null)
                .runIds();
        for (long id : ids) {
            Polling.until(
                    "run " + id + " done",
                    () -> board.of(c.scenarioId(), id).state().equals("done"));
        }
        storeResult(ids.get(0), scenario, "300 particles", Double.NaN, 0.9, OptionalInt.of(500));
        storeResult(ids.get(1), scenario, "1,000 particles", 1.2, 0.2, OptionalInt.of(500));
        storeFrames(ids.get(1));

        String html = page("/r/" + board.of(c.scenarioId(), ids.get(0)).viewToken() + "/batch-report");

        assertThat(html)
                .contains("Particle count sweep")
                .contains("300 particles: <strong class=\"fail\">below</strong> the 500 the KLD bound asks for")
                .contains("1,000 particles: meets the KLD bound")
                .contains("Key frames")
                .contains("1,000 particles, seed 7")
                .contains(Report.CAUTION);
    }

    @Test
    void beforeAndAfterReport_comparesTwoBatchesOfTheScenario_earlierRevisionAsTheBase() throws Exception {
        Scenario changed =
                Scenarios.corridor().withKidnapAt(4, Pose.of(15, 1, 0)).build();
        store.save(
                c.scenarioId(),
                1,
                Scenarios.corridor().withKidnapAt(4, Pose.of(15, 1, 0)).json(),
                "Ana",
                "kidnap a second later");
        RunRow after = doneRun(c.scenarioId());
        storeResult(after.id(), changed, Double.NaN, 0.5);
        String elsewhere = doneRun(store.create(Scenarios.corridor().json(), "Ben", "other")
                        .scenarioId())
                .viewToken();

        String html = page("/r/" + after.viewToken() + "/compare?with=/r/" + run.viewToken() + "/batch-report");
        byte[] pdf = mvc.perform(get("/r/" + run.viewToken() + "/compare.pdf?with=" + after.viewToken()))
                .andExpect(status().isOk())
                .andReturn()
                .getResponse()
                .getContentAsByteArray();

        assertThat(html)
                .contains("revision 2 against revision 1")
                .contains("base, revision 1")
                .contains("base, revision 2")
                .contains("Paired comparison with the base")
                .contains(Report.CAUTION);
        // the earlier revision recovered, the later did not: one pair, "base only"
        assertThat(html).containsPattern("base, revision 2</td><td>1</td><td>0 / 1 / 0 / 0</td>");
        assertThat(new String(pdf, 0, 5, java.nio.charset.StandardCharsets.US_ASCII))
                .isEqualTo("%PDF-");
        assertThat(page("/r/" + run.viewToken() + "/batch-report")).contains("Before and after: compare with");
        String foreign = mvc.perform(get("/r/" + run.viewToken() + "/compare?with=" + elsewhere))
                .andExpect(status().isUnprocessableContent())
                .andReturn()
                .getResponse()
                .getContentAsString();
        assertThat(foreign).contains("with: that run belongs to another scenario");
        mvc.perform(get("/r/" + run.viewToken() + "/compare?with=nothing"))
                .andExpect(status().isUnprocessableContent());
    }

    /** A finished run of seed 7 with the base settings, on the scenario's latest revision. */
    private RunRow doneRun(long scenarioId) throws Exception {
        long id = queue.submit(
                        scenarioId,
                        store.view(scenarioId).latest().id(),
                        List.of("base"),
                        List.of(7L),
                        TrialOptions.resultsOnly())
                .runIds()
                .get(0);
        Polling.until(
                "run " + id + " done", () -> board.of(scenarioId, id).state().equals("done"));
        return board.of(scenarioId, id);
    }

    private String page(String url) throws Exception {
        return mvc.perform(get(url))
                .andExpect(status().isOk())
                .andReturn()
                .getResponse()
                .getContentAsString();
    }

    @Test
    void reports_pageAndPdf_withCautionEpisodeAndKeyFrames() throws Exception {
        String html = mvc.perform(get("/r/" + run.viewToken() + "/report"))
                .andExpect(status().isOk())
                .andReturn()
                .getResponse()
                .getContentAsString();
        assertThat(html)
                .contains("Test corridor, revision 1")
                .contains("class=\"episode\"")
                .contains("Key frames")
                .contains("Download PDF")
                .contains(Report.CAUTION);
        byte[] pdf = mvc.perform(get("/r/" + run.viewToken() + "/batch-report.pdf"))
                .andExpect(status().isOk())
                .andReturn()
                .getResponse()
                .getContentAsByteArray();
        assertThat(new String(pdf, 0, 5, java.nio.charset.StandardCharsets.US_ASCII))
                .isEqualTo("%PDF-");
        mvc.perform(get("/s/" + c.viewToken() + "/runs/" + run.id() + "/report"))
                .andExpect(redirectedUrl("/r/" + run.viewToken() + "/report"));
        mvc.perform(get("/r/nope/report")).andExpect(status().isNotFound());
    }
}
