package dev.driftlab.app;

import java.io.IOException;
import java.net.ServerSocket;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.file.Files;
import java.nio.file.Path;
import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.ResultSet;
import java.sql.SQLException;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;

/**
 * Driftlab processes started from the built jar, as a team runs them: one server and any number of
 * workers, on one embedded PostgreSQL database or each on its own H2 file. Every process writes its
 * log beside its data under {@link #logs()}; {@link #close()} stops them all. Used by the tests and
 * benchmarks that need real separate processes (a worker killed with SIGKILL, a small heap, work
 * spread over processes).
 */
public final class JarProcesses implements AutoCloseable {

    /** The jar the package phase builds. */
    public static final Path JAR = Path.of("target/driftlab.jar");

    private static final HttpClient HTTP =
            HttpClient.newBuilder().connectTimeout(Duration.ofSeconds(10)).build();

    private final List<Process> processes = new ArrayList<>();
    private final Path logs;
    private final Optional<PostgresDatabase.Database> db;
    private String base;

    private JarProcesses(Path logs, Optional<PostgresDatabase.Database> db) {
        this.logs = logs;
        this.db = db;
    }

    /** Processes sharing a fresh embedded PostgreSQL database. */
    public static JarProcesses onPostgres(String what) throws IOException {
        requireJar();
        return new JarProcesses(Files.createTempDirectory("driftlab-" + what), Optional.of(PostgresDatabase.create()));
    }

    /** Processes each on its own H2 file under the log folder. */
    public static JarProcesses onOwnData(String what) throws IOException {
        requireJar();
        return new JarProcesses(Files.createTempDirectory("driftlab-" + what), Optional.empty());
    }

    private static void requireJar() {
        if (!Files.exists(JAR)) {
            throw new IllegalStateException("build the jar first: ./mvnw -q package -DskipTests");
        }
    }

    /**
     * Starts the server on a free local port and waits until it answers (3 minutes at most).
     *
     * @param args more arguments, e.g. {@code --driftlab.runs.execute=false}
     */
    public Process startServer(String... args) throws Exception {
        int port;
        try (ServerSocket s = new ServerSocket(0)) {
            port = s.getLocalPort();
        }
        base = "http://127.0.0.1:" + port;
        List<String> all = new ArrayList<>(List.of("--server.address=127.0.0.1", "--server.port=" + port));
        all.addAll(List.of(args));
        Process server = start("server", all);
        long deadline = System.nanoTime() + Duration.ofMinutes(3).toNanos();
        while (true) {
            if (!server.isAlive()) {
                throw new AssertionError("the server process ended; log in " + logs);
            }
            try {
                if (get("/api/samples").statusCode() == 200) {
                    return server;
                }
            } catch (IOException notYet) {
                // still starting
            }
            if (System.nanoTime() > deadline) {
                throw new AssertionError("the server did not start within 3 minutes; log in " + logs);
            }
            Thread.sleep(300);
        }
    }

    /** Starts a worker process ({@code worker} command) with these arguments. */
    public Process startWorker(String name, String... args) throws IOException {
        List<String> all = new ArrayList<>(List.of("worker"));
        all.addAll(List.of(args));
        return start(name, all);
    }

    private Process start(String name, List<String> args) throws IOException {
        String java = Path.of(System.getProperty("java.home"), "bin", "java").toString();
        List<String> command = new ArrayList<>(List.of(
                java,
                "-Xmx512m",
                "-XX:+ExitOnOutOfMemoryError",
                "--add-modules",
                "jdk.incubator.vector",
                "-jar",
                JAR.toAbsolutePath().toString()));
        command.addAll(args);
        if (db.isPresent()) {
            command.add("--spring.datasource.url=" + db.get().url());
            command.add("--spring.datasource.username=" + db.get().user());
            command.add("--spring.datasource.password=" + db.get().password());
        }
        command.add("--driftlab.data-dir=" + logs.resolve(name + "-data"));
        Process p = new ProcessBuilder(command)
                .redirectErrorStream(true)
                .redirectOutput(logs.resolve(name + ".log").toFile())
                .start();
        processes.add(p);
        return p;
    }

    /** The processes in the order they were started (the server first). */
    public List<Process> processes() {
        return List.copyOf(processes);
    }

    /** The folder with every process's log and data. */
    public Path logs() {
        return logs;
    }

    /** The server's address, e.g. {@code http://127.0.0.1:41234}. */
    public String base() {
        return base;
    }

    public HttpResponse<String> get(String path) throws IOException, InterruptedException {
        return HTTP.send(
                HttpRequest.newBuilder(URI.create(base + path))
                        .timeout(Duration.ofSeconds(60))
                        .build(),
                HttpResponse.BodyHandlers.ofString());
    }

    public HttpResponse<String> post(String path, String body) throws IOException, InterruptedException {
        return HTTP.send(
                HttpRequest.newBuilder(URI.create(base + path))
                        .timeout(Duration.ofSeconds(60))
                        .header("Content-Type", "application/json")
                        .POST(HttpRequest.BodyPublishers.ofString(body))
                        .build(),
                HttpResponse.BodyHandlers.ofString());
    }

    /** A connection to the shared PostgreSQL database. */
    public Connection connect() throws SQLException {
        PostgresDatabase.Database d = db.orElseThrow(() -> new IllegalStateException("these processes use H2 files"));
        return DriverManager.getConnection(d.url(), d.user(), d.password());
    }

    /** The first column of every row, as numbers. */
    public static List<Long> longs(Connection c, String sql) throws SQLException {
        List<Long> out = new ArrayList<>();
        try (var s = c.createStatement();
                ResultSet rs = s.executeQuery(sql)) {
            while (rs.next()) {
                out.add(rs.getLong(1));
            }
        }
        return out;
    }

    /** The first column of every row, as text. */
    public static List<String> strings(Connection c, String sql) throws SQLException {
        List<String> out = new ArrayList<>();
        try (var s = c.createStatement();
                ResultSet rs = s.executeQuery(sql)) {
            while (rs.next()) {
                out.add(rs.getString(1));
            }
        }
        return out;
    }

    /** Asks every process to stop and waits for it. */
    @Override
    public void close() throws InterruptedException {
        for (Process p : processes) {
            p.destroy();
        }
        for (Process p : processes) {
            p.waitFor();
        }
    }
}
