package dev.driftlab.bench;

import dev.driftlab.app.PostgresDatabase;
import java.io.IOException;
import java.net.ServerSocket;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
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
    private final HttpClient http =
            HttpClient.newBuilder().connectTimeout(Duration.ofSeconds(10)).build();
    private final List<Process> processes = new ArrayList<>();
    private String base;
    private String token;
    private long nextSeed = 1;

    @Setup(Level.Trial)
    public void startProcesses() throws Exception {
        Path jar = Path.of("target/driftlab.jar").toAbsolutePath();
        if (!Files.exists(jar)) {
            throw new IllegalStateException("build the jar first: ./mvnw -q package -DskipTests");
        }
        PostgresDatabase.Database db = PostgresDatabase.create();
        Path logs = Files.createTempDirectory("driftlab-scaling");
        int port;
        try (ServerSocket s = new ServerSocket(0)) {
            port = s.getLocalPort();
        }
        base = "http://127.0.0.1:" + port;
        start(
                jar,
                db,
                logs,
                "server",
                "--server.address=127.0.0.1",
                "--server.port=" + port,
                "--driftlab.runs.execute=false",
                "--driftlab.runs.unit-work=1");
        long deadline = System.nanoTime() + TimeUnit.MINUTES.toNanos(3);
        while (true) {
            try {
                if (get("/api/samples").statusCode() == 200) {
                    break;
                }
            } catch (IOException notYet) {
                // starting
            }
            if (System.nanoTime() > deadline) {
                throw new IllegalStateException("server did not start; log in " + logs);
            }
            Thread.sleep(300);
        }
        for (int i = 1; i <= workers; i++) {
            start(jar, db, logs, "worker-" + i, "worker", "--threads", "1");
        }
        String document = Files.readString(Path.of("sample-projects/storage-hall-kidnap.json"));
        token = JSON.readTree(post("/api/scenarios", document).body())
                .get("editToken")
                .asString();
    }

    @TearDown(Level.Trial)
    public void stopProcesses() throws InterruptedException {
        for (Process p : processes) {
            p.destroy();
        }
        for (Process p : processes) {
            p.waitFor();
        }
    }

    /** One batch of {@value #SEEDS} trials, from submission until its result is stored. */
    @Benchmark
    public String batch() throws Exception {
        String body = "{\"variants\":[\"base\"],\"firstSeed\":" + nextSeed + ",\"seedCount\":" + SEEDS + "}";
        nextSeed += SEEDS;
        HttpResponse<String> r = post("/api/s/" + token + "/batches", body);
        if (r.statusCode() != 202) {
            throw new IllegalStateException("batch refused: " + r.body());
        }
        long id = JSON.readTree(r.body()).get("runs").get(0).get("id").asLong();
        while (true) {
            JsonNode run = JSON.readTree(get("/api/s/" + token + "/runs/" + id).body());
            if (run.get("finished").asBoolean()) {
                if (!run.get("state").asString().equals("done")) {
                    throw new IllegalStateException("run ended " + run);
                }
                return run.get("state").asString();
            }
            Thread.sleep(100);
        }
    }

    private void start(Path jar, PostgresDatabase.Database db, Path logs, String name, String... args)
            throws IOException {
        String java = Path.of(System.getProperty("java.home"), "bin", "java").toString();
        List<String> command = new ArrayList<>(
                List.of(java, "-Xmx512m", "--add-modules", "jdk.incubator.vector", "-jar", jar.toString()));
        command.addAll(List.of(args));
        command.add("--spring.datasource.url=" + db.url());
        command.add("--spring.datasource.username=" + db.user());
        command.add("--spring.datasource.password=" + db.password());
        command.add("--driftlab.data-dir=" + logs.resolve(name + "-data"));
        processes.add(new ProcessBuilder(command)
                .redirectErrorStream(true)
                .redirectOutput(logs.resolve(name + ".log").toFile())
                .start());
    }

    private HttpResponse<String> get(String path) throws IOException, InterruptedException {
        return http.send(
                HttpRequest.newBuilder(URI.create(base + path))
                        .timeout(Duration.ofSeconds(60))
                        .build(),
                HttpResponse.BodyHandlers.ofString());
    }

    private HttpResponse<String> post(String path, String body) throws IOException, InterruptedException {
        return http.send(
                HttpRequest.newBuilder(URI.create(base + path))
                        .timeout(Duration.ofSeconds(60))
                        .header("Content-Type", "application/json")
                        .POST(HttpRequest.BodyPublishers.ofString(body))
                        .build(),
                HttpResponse.BodyHandlers.ofString());
    }
}
