package dev.driftlab.app.runs;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import dev.driftlab.localizer.FoxBound;
import dev.driftlab.recording.FrameChunk;
import dev.driftlab.scenario.Limits;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.concurrent.ConcurrentHashMap;
import org.junit.jupiter.api.Test;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;

/** The engine behind the run queue, driven with a recording context. */
class EngineTrialExecutorTest {

    private final EngineTrialExecutor engine = new EngineTrialExecutor();

    /** Records progress and chunks; cancels once progress passes a fraction. */
    static final class Recording implements TrialContext {
        final List<Double> progress = new ArrayList<>();
        final Map<Integer, byte[]> chunks = new ConcurrentHashMap<>();
        final double cancelAt;
        volatile boolean cancel;

        Recording(double cancelAt) {
            this.cancelAt = cancelAt;
        }

        @Override
        public void progress(double fraction, String message) {
            progress.add(fraction);
            if (fraction >= cancelAt) {
                cancel = true;
            }
        }

        @Override
        public boolean cancelled() {
            return cancel;
        }

        @Override
        public void frameChunk(int index, byte[] data) {
            chunks.put(index, data);
        }

        final Map<Long, TrialRecord> trials = new ConcurrentHashMap<>();

        @Override
        public void trialDone(TrialRecord trial) {
            trials.putIfAbsent(trial.seed(), trial);
        }
    }

    /** A whole run as the queue does it with one unit: every seed, then the result from the stored trials. */
    private StoredResult execute(TrialRequest request, Recording ctx) throws InterruptedException {
        engine.runSeeds(request, request.seeds(), ctx);
        return engine.assemble(
                request, request.seeds().stream().map(ctx.trials::get).toList());
    }

    /** The result without what depends on when and how fast it ran. */
    private static JsonNode withoutTimings(String result) {
        return dev.driftlab.report.ResultDocs.withoutTimings(
                JsonMapper.builder().build().readTree(result));
    }

    @Test
    void seedsRunInSeveralUnits_inAnyOrder_assembleToTheResultOfOneUnit() throws Exception {
        TrialRequest request = new TrialRequest(
                sample("office-carpet-stall"), "base", List.of(7L, 8L, 9L, 10L), new TrialOptions(false));
        Recording whole = new Recording(2);
        String oneUnit = execute(request, whole).resultJson();

        Recording split = new Recording(2);
        engine.runSeeds(request, List.of(10L, 9L), split);
        engine.runSeeds(request, List.of(8L), split);
        engine.runSeeds(request, List.of(7L), split);
        // a unit that runs again (its process died after storing) stores nothing new
        engine.runSeeds(request, List.of(8L), split);
        String units = engine.assemble(
                        request, request.seeds().stream().map(split.trials::get).toList())
                .resultJson();

        assertThat(withoutTimings(units)).isEqualTo(withoutTimings(oneUnit));
        for (long seed : request.seeds()) {
            // equal outcomes (answer times, measurements of the machine, are not part of an outcome's equality)
            assertThat(dev.driftlab.trial.TrialRecords.readOutcome(
                            split.trials.get(seed).outcome()))
                    .isEqualTo(dev.driftlab.trial.TrialRecords.readOutcome(
                            whole.trials.get(seed).outcome()));
        }
    }

    private static String sample(String name) throws Exception {
        return Files.readString(Path.of("sample-projects/" + name + ".json"));
    }

    @Test
    void oneSeedWithFrames_returnsRunResult_andStoresReadableChunks() throws Exception {
        Recording ctx = new Recording(2);

        StoredResult out = execute(
                new TrialRequest(sample("storage-hall-kidnap"), "base", List.of(3L), new TrialOptions(true)), ctx);

        JsonNode result = JsonMapper.builder().build().readTree(out.resultJson());
        assertThat(result.get("format").asString()).isEqualTo("driftlab-result/2");
        assertThat(result.get("kind").asString()).isEqualTo("run");
        // the verdict stored beside the result is the one the result names
        assertThat(out.verdict().fileName()).isEqualTo(result.get("verdict").asString());
        assertThat(result.get("trials").get(0).get("kidnaps").size()).isEqualTo(1);
        assertThat(ctx.chunks).hasSizeGreaterThan(20);
        assertThat(FrameChunk.frame(ctx.chunks.get(2), 0).index()).isEqualTo(2 * EngineTrialExecutor.FRAMES_PER_CHUNK);
        assertThat(ctx.progress).isSorted();
        assertThat(ctx.progress.get(ctx.progress.size() - 1)).isEqualTo(1.0);
    }

    @Test
    void severalSeeds_returnBatchResult_withoutFramesUnlessAsked() throws Exception {
        Recording ctx = new Recording(2);

        StoredResult out = execute(
                new TrialRequest(
                        sample("office-carpet-stall"), "tight motion noise", List.of(1L, 2L), new TrialOptions(false)),
                ctx);

        JsonNode result = JsonMapper.builder().build().readTree(out.resultJson());
        assertThat(result.get("kind").asString()).isEqualTo("batch");
        assertThat(result.get("trials").size()).isEqualTo(2);
        assertThat(result.get("variants").get(0).get("name").asString()).isEqualTo("tight motion noise");
        assertThat(ctx.chunks).isEmpty();
    }

    @Test
    void oneSeedReplayedAloneWithFrames_isTheSameTrialItWasInTheBatch() throws Exception {
        // the premise of "replay a seed with frames": a trial is a pure function of
        // (revision, variant, seed), whatever else runs beside it and whether frames are kept
        JsonMapper json = JsonMapper.builder().build();
        JsonNode batch = json.readTree(execute(
                        new TrialRequest(
                                sample("storage-hall-kidnap"), "base", List.of(4L, 5L), new TrialOptions(false)),
                        new Recording(2))
                .resultJson());
        Recording ctx = new Recording(2);
        JsonNode alone = json.readTree(execute(
                        new TrialRequest(sample("storage-hall-kidnap"), "base", List.of(5L), new TrialOptions(true)),
                        ctx)
                .resultJson());

        JsonNode inBatch = batch.get("trials").get(1);
        JsonNode replayed = alone.get("trials").get(0);
        assertThat(inBatch.get("seed").asLong()).isEqualTo(5L);
        assertThat(dev.driftlab.report.ResultDocs.untimedTrial(replayed))
                .isEqualTo(dev.driftlab.report.ResultDocs.untimedTrial(inBatch));
        assertThat(ctx.chunks).isNotEmpty();
    }

    @Test
    void sweepCount_runsTheVariantAtThatFixedCount_andStatesWhatTheKldBoundAsks() throws Exception {
        JsonNode result = JsonMapper.builder()
                .build()
                .readTree(execute(
                                new TrialRequest(
                                        sample("office-carpet-stall"),
                                        "base",
                                        List.of(1L),
                                        new TrialOptions(false, 300)),
                                new Recording(2))
                        .resultJson());

        JsonNode trial = result.get("trials").get(0);
        assertThat(trial.get("variant").asString()).isEqualTo("300 particles");
        assertThat(trial.get("meanParticles").asDouble()).isEqualTo(300.0);
        // The sample keeps the default error bound 0.05 and confidence 0.99, so the count is Fox's
        // bound (IJRR 22(12), 2003, Wilson-Hilferty form) for some number of occupied bins k >= 2,
        // at least the 66 it asks for at k = 2.
        int required = result.get("kldRequiredParticles").asInt();
        assertThat(required).isGreaterThanOrEqualTo(66);
        assertThat(FoxBound.binsFor(required, 0.05, Limits.MAX_PARTICLES))
                .as("%d particles is the KLD bound for a whole number of bins", required)
                .isPresent();
    }

    @Test
    void cancel_stopsTheRun() throws Exception {
        Recording ctx = new Recording(0.2);

        assertThatThrownBy(() -> execute(
                        new TrialRequest(
                                sample("office-carpet-stall"), "base", List.of(1L, 2L, 3L), new TrialOptions(false)),
                        ctx))
                .isInstanceOf(InterruptedException.class);
        assertThat(ctx.progress.get(ctx.progress.size() - 1)).isLessThan(0.5);
    }

    @Test
    void invalidRevision_failsWithAPlainMessage() throws Exception {
        String bad = sample("office-carpet-stall").replace("\"count\": 2000", "\"count\": 0");

        assertThatThrownBy(() ->
                        execute(new TrialRequest(bad, "base", List.of(1L), new TrialOptions(false)), new Recording(2)))
                .hasMessage("This revision does not validate, so it cannot run: localizer.particles.count: must be at "
                        + "least 1, got 0");
    }
}
