package dev.driftlab.bench;

import dev.driftlab.app.JarProcesses;
import java.net.http.HttpResponse;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Level;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Param;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.TearDown;
import org.openjdk.jmh.annotations.Warmup;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;

/**
 * How runs scale over worker processes: a server that runs no units and {@code workers}
 * single-threaded worker processes, all started from the built jar on one PostgreSQL database
 * (embedded, no container needed). Each operation submits a batch of {@link #SEEDS} one-seed units
 * of the storage hall sample and waits until it is done, so the score is seconds per
 * {@value #SEEDS} trials; trials per second is {@value #SEEDS} / score, and the scaling efficiency
 * of two workers is score(1) / (2 x score(2)). Needs {@code target/driftlab.jar} (package first).
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.SingleShotTime)
@OutputTimeUnit(TimeUnit.SECONDS)
@Fork(1)
@Warmup(iterations = 1)
@Measurement(iterations = 3)
public class WorkerScalingBenchmark {

    static final int SEEDS = 24;

    @Param({"1", "2"})
    public int workers;

    private static final JsonMapper JSON = JsonMapper.builder().build();
    private JarProcesses jar;
    private String token;
    private long nextSeed = 1;

    @Setup(Level.Trial)
    public void startProcesses() throws Exception {
        jar = JarProcesses.onPostgres("scaling");
        jar.startServer("--driftlab.runs.execute=false", "--driftlab.runs.unit-work=1");
        for (int i = 1; i <= workers; i++) {
            jar.startWorker("worker-" + i, "--threads", "1");
        }
        String document = Files.readString(Path.of("sample-projects/storage-hall-kidnap.json"));
        token = JSON.readTree(jar.post("/api/scenarios", document).body())
                .get("editToken")
                .asString();
    }

    @TearDown(Level.Trial)
    public void stopProcesses() throws InterruptedException {
        jar.close();
    }

    /** One batch of {@value #SEEDS} trials, from submission until its result is stored. */
    @Benchmark
    public String batch() throws Exception {
        String body = "{\"variants\":[\"base\"],\"firstSeed\":" + nextSeed + ",\"seedCount\":" + SEEDS + "}";
        nextSeed += SEEDS;
        HttpResponse<String> r = jar.post("/api/s/" + token + "/batches", body);
        if (r.statusCode() != 202) {
            throw new IllegalStateException("batch refused: " + r.body());
        }
        long id = JSON.readTree(r.body()).get("runs").get(0).get("id").asLong();
        while (true) {
            JsonNode run =
                    JSON.readTree(jar.get("/api/s/" + token + "/runs/" + id).body());
            if (run.get("finished").asBoolean()) {
                if (!run.get("state").asString().equals("done")) {
                    throw new IllegalStateException("run ended " + run);
                }
                return run.get("state").asString();
            }
            Thread.sleep(100);
        }
    }
}
