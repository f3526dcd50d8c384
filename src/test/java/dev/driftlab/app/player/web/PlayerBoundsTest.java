package dev.driftlab.app.player.web;

import static org.assertj.core.api.Assertions.assertThat;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.get;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.content;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.header;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.jsonPath;
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
import dev.driftlab.geometry.Bounds;
import dev.driftlab.geometry.Polygon;
import dev.driftlab.geometry.Pose;
import dev.driftlab.recording.Frame;
import dev.driftlab.recording.FrameRecorder;
import dev.driftlab.scenario.Room;
import dev.driftlab.scenario.Scenarios;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.http.MediaType;
import org.springframework.jdbc.core.simple.JdbcClient;
import org.springframework.test.context.TestPropertySource;
import org.springframework.test.web.servlet.MockMvc;

/**
 * The player's answers under their bounds: two built at once, the rest refused busy at once with
 * {@code Retry-After} (RFC 9110 section 10.2.3) in a problem document (RFC 9457); finished runs'
 * answers kept; answers estimated over a budget of 300 KB refused before they are built.
 */
@WebSlice
@TestPropertySource(properties = {"driftlab.player.concurrent-builds=2", "driftlab.player.max-answer-bytes=300000"})
class PlayerBoundsTest {

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

    @Autowired
    PlayerApi api;

    private String lastViewToken;
    private final CountDownLatch release = new CountDownLatch(1);
    private final List<Thread> holders = new ArrayList<>();

    @AfterEach
    void releaseHolders() throws InterruptedException {
        release.countDown();
        for (Thread t : holders) {
            t.join();
        }
    }

    /** Takes one of the player's permits until the test ends, as a slow build would. */
    private void holdAPermit(String key) throws InterruptedException {
        CountDownLatch inside = new CountDownLatch(1);
        Thread t = new Thread(() -> api.renders().gate().render(key, false, () -> {
            inside.countDown();
            try {
                release.await(30, TimeUnit.SECONDS);
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
            }
            return new byte[0];
        }));
        holders.add(t);
        t.start();
        assertThat(inside.await(10, TimeUnit.SECONDS)).isTrue();
    }

    @Test
    void pastTheBound_sceneAndFramesAreRefusedBusyAtOnce_whileTheAllowedOnesAreBuilt() throws Exception {
        RunRow run = doneRun(Scenarios.corridor().json(), 10, 40);

        holdAPermit("hold-1");
        // one permit of two is free: the scene is built
        mvc.perform(get("/api/r/" + run.viewToken() + "/scene"))
                .andExpect(status().isOk())
                .andExpect(jsonPath("$.frameCount").value(10));
        holdAPermit("hold-2");

        long t0 = System.nanoTime();
        String body = mvc.perform(get("/api/r/" + run.viewToken() + "/frames/0/json"))
                .andExpect(status().isServiceUnavailable())
                .andExpect(header().string("Retry-After", "5"))
                .andExpect(content().contentTypeCompatibleWith(MediaType.APPLICATION_PROBLEM_JSON))
                .andExpect(jsonPath("$.status").value(503))
                .andReturn()
                .getResponse()
                .getContentAsString();
        assertThat(TimeUnit.NANOSECONDS.toMillis(System.nanoTime() - t0)).isLessThan(2_000);
        assertThat(body).contains("player scenes and frames are being made already; try again in a few seconds");
        // the scene built above is kept, so it is answered without a permit; another run's is not
        mvc.perform(get("/api/r/" + run.viewToken() + "/scene")).andExpect(status().isOk());
        RunRow other = doneRun(Scenarios.corridor().json(), 0, 0);
        mvc.perform(get("/api/s/" + lastViewToken + "/runs/" + other.id() + "/scene"))
                .andExpect(status().isServiceUnavailable())
                .andExpect(header().string("Retry-After", "5"));

        release.countDown();
        for (Thread t : holders) {
            t.join();
        }
        assertThat(api.renders().gate().available()).isEqualTo(2);
        mvc.perform(get("/api/r/" + run.viewToken() + "/frames/0/json"))
                .andExpect(status().isOk())
                .andExpect(jsonPath("$.frames.length()").value(10));
    }

    @Test
    void aFinishedRunsSceneAndFrames_areBuiltOnce_aRunningRunsEachTime() throws Exception {
        RunRow run = doneRun(Scenarios.corridor().json(), 10, 40);
        String scene = body("/api/r/" + run.viewToken() + "/scene");
        String frames = body("/api/r/" + run.viewToken() + "/frames/0/json");

        // what is stored can no longer change for a finished run; were it built again, these would show
        jdbc.sql("DELETE FROM run_frame_chunk WHERE run_id = ?").param(run.id()).update();
        jdbc.sql("UPDATE run SET result = NULL WHERE id = ?").param(run.id()).update();

        assertThat(body("/api/r/" + run.viewToken() + "/scene")).isEqualTo(scene);
        assertThat(body("/api/r/" + run.viewToken() + "/frames/0/json")).isEqualTo(frames);

        RunRow running = doneRun(Scenarios.corridor().json(), 10, 40);
        jdbc.sql("UPDATE run SET state = 'running' WHERE id = ?")
                .param(running.id())
                .update();
        mvc.perform(get("/api/r/" + running.viewToken() + "/scene"))
                .andExpect(status().isOk())
                .andExpect(jsonPath("$.frameCount").value(10));
        jdbc.sql("DELETE FROM run_frame_chunk WHERE run_id = ?")
                .param(running.id())
                .update();
        mvc.perform(get("/api/r/" + running.viewToken() + "/scene"))
                .andExpect(status().isOk())
                .andExpect(jsonPath("$.frameCount").value(0));
        mvc.perform(get("/api/r/" + running.viewToken() + "/frames/0/json")).andExpect(status().isNotFound());
    }

    @Test
    void answersEstimatedOverTheBudget_areRefusedWithWhatTheyWouldHold_andNothingIsBuilt() throws Exception {
        // ten frames of 2,000 particles: about 440 KB of frames, over the 300 KB budget
        RunRow run = doneRun(Scenarios.corridor().json(), 10, 2_000);
        String frames = mvc.perform(get("/api/r/" + run.viewToken() + "/frames/0/json"))
                .andExpect(status().isUnprocessableContent())
                .andExpect(content().contentTypeCompatibleWith(MediaType.APPLICATION_PROBLEM_JSON))
                .andReturn()
                .getResponse()
                .getContentAsString();
        assertThat(frames)
                .contains("Frame chunk 0 of this run would be about")
                .contains("10 frames with 20,000 particle states in all")
                .contains("over the player's budget of 293 KB")
                .contains("fewer particles");
        // the scene of the same run is small and is built
        mvc.perform(get("/api/r/" + run.viewToken() + "/scene")).andExpect(status().isOk());

        Scenarios.Builder big = Scenarios.corridor().withName("Many rooms");
        for (int i = 0; i < 1_500; i++) {
            big.withRoom(new Room("r" + i, "R" + i, Polygon.rectangle(30 + (i % 100) * 3, (i / 100) * 3, 2, 2)));
        }
        RunRow bigRun = doneRun(big.json(), 0, 0);
        String scene = mvc.perform(get("/api/r/" + bigRun.viewToken() + "/scene"))
                .andExpect(status().isUnprocessableContent())
                .andReturn()
                .getResponse()
                .getContentAsString();
        assertThat(scene)
                .contains("The scene of this run would be about")
                .contains("1,502 rooms, 1 door,")
                .contains("over the player's budget of 293 KB")
                .doesNotContain("Exception");
        assertThat(api.renders().gate().available()).isEqualTo(2);
    }

    private String body(String url) throws Exception {
        return mvc.perform(get(url))
                .andExpect(status().isOk())
                .andReturn()
                .getResponse()
                .getContentAsString();
    }

    /** A finished run of the scenario with {@code frames} recorded frames of {@code particles} particles. */
    private RunRow doneRun(String scenario, int frames, int particles) throws Exception {
        executor.reset();
        ScenarioStore.Created c = store.create(scenario, "Ana", "start");
        lastViewToken = c.viewToken();
        long id = queue.submit(
                        c.scenarioId(),
                        store.view(c.scenarioId()).latest().id(),
                        List.of("base"),
                        List.of(7L),
                        TrialOptions.resultsOnly())
                .runIds()
                .get(0);
        Polling.until(
                "run " + id + " done",
                () -> board.of(c.scenarioId(), id).state().equals("done"));
        List<byte[]> chunks = new ArrayList<>();
        FrameRecorder rec =
                new FrameRecorder(new Bounds(0, 0, 20, 6), 12, 10, (index, first, count, data) -> chunks.add(data));
        for (int i = 0; i < frames; i++) {
            rec.accept(frame(i, particles));
        }
        rec.finish();
        for (int i = 0; i < chunks.size(); i++) {
            runs.insertChunk(id, i, chunks.get(i));
        }
        return board.of(c.scenarioId(), id);
    }

    private static Frame frame(int i, int n) {
        float[] x = new float[n];
        float[] y = new float[n];
        float[] h = new float[n];
        float[] w = new float[n];
        for (int k = 0; k < n; k++) {
            x[k] = 1 + 0.001f * k;
            y[k] = 1 + 0.002f * k;
            w[k] = 1f / n;
        }
        float[] ranges = new float[10];
        java.util.Arrays.fill(ranges, 2.5f);
        return new Frame(
                i,
                0.1 * (i + 1),
                Pose.of(1 + 0.1 * i, 1, 0),
                Pose.of(1 + 0.1 * i, 1, 0),
                Pose.of(1 + 0.1 * i, 1, 0),
                List.of(),
                n,
                0.4,
                0.38,
                0.41,
                0,
                ranges,
                x,
                y,
                h,
                w,
                List.of());
    }
}
