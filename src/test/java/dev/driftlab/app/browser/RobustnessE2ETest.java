package dev.driftlab.app.browser;

import static org.assertj.core.api.Assertions.assertThat;

import dev.driftlab.scenario.Scenarios;
import java.io.IOException;
import java.io.InputStream;
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
import java.util.Map;
import java.util.Set;
import java.util.concurrent.CompletableFuture;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;

/**
 * The hostile probe's cases against the real server, started from the built jar as its own process
 * with a 512 MB heap: view links on every mutating API endpoint named in the OpenAPI document,
 * chunked bodies far over the limit at once, script payloads in every text field of a scenario,
 * many page loads at once. Afterwards the server must still answer.
 */
@Tag("e2e")
class RobustnessE2ETest {

    /** Mutating endpoints a view link may use: running and reading, never changing or cancelling. */
    private static final Set<String> VIEW_MAY = Set.of(
            "post /api/s/{token}/batches",
            "post /api/s/{token}/runs/{id}/rerun",
            "post /api/s/{token}/runs/{id}/replay");

    private static final String SCRIPT = "<script>alert('probe')</script>";
    private static final String ATTRIBUTE = "\"><img src=x onerror=alert('probe')>";

    private static Process server;
    private static String base;
    private static final HttpClient http =
            HttpClient.newBuilder().connectTimeout(Duration.ofSeconds(10)).build();
    private static final JsonMapper json = JsonMapper.builder().build();

    @BeforeAll
    static void startTheJarWithASmallHeap() throws Exception {
        Path jar = Path.of("target/driftlab.jar");
        assertThat(jar).as("the jar the package phase builds").exists();
        int port;
        try (ServerSocket s = new ServerSocket(0)) {
            port = s.getLocalPort();
        }
        Path data = Files.createTempDirectory("driftlab-probe");
        String java = Path.of(System.getProperty("java.home"), "bin", "java").toString();
        server = new ProcessBuilder(
                        java,
                        "-Xmx512m",
                        "-XX:+ExitOnOutOfMemoryError",
                        "--add-modules",
                        "jdk.incubator.vector",
                        "-jar",
                        jar.toString(),
                        "--server.address=127.0.0.1",
                        "--server.port=" + port,
                        "--driftlab.data-dir=" + data)
                .redirectErrorStream(true)
                .redirectOutput(data.resolve("server.log").toFile())
                .start();
        base = "http://127.0.0.1:" + port;
        long deadline = System.nanoTime() + Duration.ofMinutes(3).toNanos();
        while (true) {
            assertThat(server.isAlive()).as("server process, log in " + data).isTrue();
            try {
                if (get("/").statusCode() == 200) {
                    return;
                }
            } catch (IOException notYet) {
                // still starting
            }
            if (System.nanoTime() > deadline) {
                throw new AssertionError("the server did not start within 3 minutes; log in " + data);
            }
            Thread.sleep(500);
        }
    }

    @AfterAll
    static void stop() throws Exception {
        if (server != null) {
            server.destroy();
            server.waitFor();
        }
    }

    private static HttpResponse<String> get(String path) throws IOException, InterruptedException {
        return http.send(
                HttpRequest.newBuilder(URI.create(base + path))
                        .timeout(Duration.ofSeconds(60))
                        .build(),
                HttpResponse.BodyHandlers.ofString());
    }

    private static HttpResponse<String> postJson(String path, String body) throws IOException, InterruptedException {
        return http.send(
                HttpRequest.newBuilder(URI.create(base + path))
                        .timeout(Duration.ofSeconds(60))
                        .header("Content-Type", "application/json")
                        .POST(HttpRequest.BodyPublishers.ofString(body))
                        .build(),
                HttpResponse.BodyHandlers.ofString());
    }

    @Test
    void theProbesCases_areRefused_andTheServerStillAnswers() throws Exception {
        // script payloads in every text field a scenario has
        String scenario = Scenarios.corridor()
                .withName("Probe " + SCRIPT)
                .json()
                .replace("\"Test scenario\"", json.writeValueAsString("desc " + ATTRIBUTE))
                .replace("\"Test corridor\"", json.writeValueAsString("room " + SCRIPT))
                .replace("\"Side room\"", json.writeValueAsString("side " + ATTRIBUTE));
        HttpResponse<String> created = postJson("/api/scenarios", scenario);
        assertThat(created.statusCode()).as(created.body()).isEqualTo(201);
        JsonNode links = json.readTree(created.body());
        String view = links.get("viewToken").asString();
        String edit = links.get("editToken").asString();
        assertThat(created.body()).doesNotContain(SCRIPT);

        for (String page :
                List.of("/", "/s/" + view, "/s/" + edit, "/s/" + view + "/history", "/s/" + edit + "/editor")) {
            HttpResponse<String> r = get(page);
            assertThat(r.statusCode()).as(page).isEqualTo(200);
            assertThat(r.body()).as(page).doesNotContain(SCRIPT).doesNotContain(ATTRIBUTE);
        }

        HttpResponse<String> batch = postJson("/api/s/" + view + "/batches", "{\"seeds\":[1]}");
        assertThat(batch.statusCode()).as(batch.body()).isEqualTo(202);
        long runId = json.readTree(batch.body()).get("runs").get(0).get("id").asLong();

        // a view link on every mutating endpoint of the API, as the OpenAPI document lists them
        JsonNode paths = json.readTree(get("/v3/api-docs").body()).get("paths");
        int tried = 0;
        for (Map.Entry<String, JsonNode> p : paths.properties()) {
            if (!p.getKey().contains("{token}")) {
                continue;
            }
            for (String method : List.of("post", "put", "patch", "delete")) {
                if (!p.getValue().has(method) || VIEW_MAY.contains(method + " " + p.getKey())) {
                    continue;
                }
                String path = p.getKey()
                        .replace("{token}", view)
                        .replace("{id}", Long.toString(runId))
                        .replace("{access}", "view");
                HttpResponse<String> r = http.send(
                        HttpRequest.newBuilder(URI.create(base + path))
                                .timeout(Duration.ofSeconds(60))
                                .header("Content-Type", "application/json")
                                .method(
                                        method.toUpperCase(java.util.Locale.ROOT),
                                        HttpRequest.BodyPublishers.ofString("{}"))
                                .build(),
                        HttpResponse.BodyHandlers.ofString());
                // refused, whatever the reason given first (a missing parameter may be named before
                // the link is looked at); what matters is that nothing changes, checked below
                assertThat(r.statusCode())
                        .as("%s %s with a view link: %s", method, p.getKey(), r.body())
                        .isBetween(400, 499);
                tried++;
            }
        }
        assertThat(tried).as("mutating endpoints tried with a view link").isGreaterThanOrEqualTo(5);
        // nothing changed: both links still open the scenario at its first revision, the run goes on
        assertThat(get("/api/s/" + view).statusCode()).isEqualTo(200);
        assertThat(get("/api/s/" + edit).statusCode()).isEqualTo(200);
        JsonNode revisions = json.readTree(get("/api/s/" + edit + "/revisions").body());
        assertThat(revisions.size())
                .as("revisions after the probe: %s", revisions)
                .isEqualTo(1);
        JsonNode run = json.readTree(get("/api/s/" + view + "/runs/" + runId).body());
        assertThat(run.get("state").asString()).isNotEqualTo("cancelled");

        // chunked bodies far over the limit, three at once: each refused, none held in memory
        List<CompletableFuture<HttpResponse<String>>> big = new ArrayList<>();
        for (int i = 0; i < 3; i++) {
            big.add(http.sendAsync(
                    HttpRequest.newBuilder(URI.create(base + "/api/scenarios"))
                            .timeout(Duration.ofSeconds(120))
                            .header("Content-Type", "application/json")
                            .POST(HttpRequest.BodyPublishers.ofInputStream(() -> new Filler(200L << 20)))
                            .build(),
                    HttpResponse.BodyHandlers.ofString()));
        }
        for (CompletableFuture<HttpResponse<String>> f : big) {
            try {
                assertThat(f.get().statusCode()).isEqualTo(413);
            } catch (java.util.concurrent.ExecutionException e) {
                // the server may close the connection once it has answered 413 mid-upload
                assertThat(e.getCause()).isInstanceOf(IOException.class);
            }
        }

        // many page loads at once
        List<CompletableFuture<HttpResponse<String>>> pages = new ArrayList<>();
        for (int i = 0; i < 30; i++) {
            pages.add(http.sendAsync(
                    HttpRequest.newBuilder(URI.create(base + (i % 2 == 0 ? "/" : "/s/" + view)))
                            .timeout(Duration.ofSeconds(120))
                            .build(),
                    HttpResponse.BodyHandlers.ofString()));
        }
        for (CompletableFuture<HttpResponse<String>> f : pages) {
            assertThat(f.get().statusCode()).isEqualTo(200);
        }

        assertThat(server.isAlive()).isTrue();
        assertThat(get("/").statusCode()).isEqualTo(200);
        assertThat(get("/api/s/" + view).statusCode()).isEqualTo(200);
    }

    /** An endless-looking JSON string of spaces, produced as it is read (never held in memory). */
    private static final class Filler extends InputStream {
        private long left;
        private boolean opened;

        Filler(long bytes) {
            this.left = bytes;
        }

        @Override
        public int read() {
            if (!opened) {
                opened = true;
                return '[';
            }
            if (left-- <= 0) {
                return -1;
            }
            return ' ';
        }

        @Override
        public int read(byte[] b, int off, int len) {
            if (left <= 0) {
                return -1;
            }
            int n = (int) Math.min(len, left);
            if (!opened) {
                opened = true;
                b[off] = '[';
                java.util.Arrays.fill(b, off + 1, off + n, (byte) ' ');
            } else {
                java.util.Arrays.fill(b, off, off + n, (byte) ' ');
            }
            left -= n;
            return n;
        }
    }
}
