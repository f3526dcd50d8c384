package dev.driftlab.bench;

import dev.driftlab.evaluation.EpisodeRules;
import dev.driftlab.recording.FrameChunk;
import dev.driftlab.recording.FrameRecorder;
import dev.driftlab.recording.FrameSink;
import dev.driftlab.scenario.Scenario;
import dev.driftlab.scenario.ScenarioFiles;
import dev.driftlab.trial.BatchProgress;
import dev.driftlab.trial.BatchResult;
import dev.driftlab.trial.BatchRunner;
import dev.driftlab.trial.TrialRunner;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicBoolean;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.Warmup;

/**
 * End-to-end figures on the sample kidnap scenario (storage hall, about 160 s of robot time,
 * 360-beam scans at 10 Hz, 2,000 particles, 60 beams used): one trial with every frame recorded,
 * one without recording, reading one frame back from its chunk, and a 100-seed batch on two
 * threads. Scores are milliseconds per operation.
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
@Fork(1)
@Warmup(iterations = 2, time = 5)
@Measurement(iterations = 3, time = 5)
public class TrialBenchmark {

    private Scenario scenario;
    private TrialRunner runner;
    private byte[] chunk;
    private long seed;

    @Setup
    public void setUp() throws IOException {
        scenario = ScenarioFiles.load(Files.readString(Path.of("sample-projects/storage-hall-kidnap.json")));
        runner = new TrialRunner(scenario);
        List<byte[]> chunks = new ArrayList<>();
        FrameRecorder rec = runner.recorder(50, (i, first, count, data) -> chunks.add(data));
        runner.run(scenario.allVariants().get(0), 1, rec, EpisodeRules.defaults(), () -> false);
        chunk = chunks.get(chunks.size() / 2);
    }

    /** One trial with frames recorded (quantised, compressed, chunked in memory). */
    @Benchmark
    public Object kidnapRunWithFrames() {
        List<byte[]> chunks = new ArrayList<>();
        FrameRecorder rec = runner.recorder(50, (i, first, count, data) -> chunks.add(data));
        runner.run(scenario.allVariants().get(0), ++seed, rec, EpisodeRules.defaults(), () -> false);
        return chunks;
    }

    /** One trial without recording, as a batch runs it. */
    @Benchmark
    public Object kidnapRunWithoutFrames() {
        return runner.run(scenario.allVariants().get(0), ++seed, FrameSink.NONE, EpisodeRules.defaults(), () -> false);
    }

    /** Decoding one frame (2,000 particles, 360 ranges) out of a 50-frame chunk. */
    @Benchmark
    @OutputTimeUnit(TimeUnit.MICROSECONDS)
    public Object readOneFrame() {
        return FrameChunk.frame(chunk, 17);
    }

    /** 100 seeds of the base settings on two threads, no recording. */
    @Benchmark
    @Warmup(iterations = 0)
    @Measurement(iterations = 1)
    @BenchmarkMode(Mode.SingleShotTime)
    @OutputTimeUnit(TimeUnit.SECONDS)
    public BatchResult hundredSeedBatchOnTwoThreads() {
        return new BatchRunner(scenario, 2)
                .run(
                        List.of(scenario.allVariants().get(0)),
                        BatchRunner.seeds(1000, 100),
                        EpisodeRules.defaults(),
                        BatchProgress.NONE,
                        new AtomicBoolean());
    }
}
