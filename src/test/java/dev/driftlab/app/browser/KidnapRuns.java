package dev.driftlab.app.browser;

import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.time.Duration;
import java.util.HashMap;
import java.util.Map;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;

/**
 * The sample kidnap scenario run once per server through the JSON API, as a user would: a copy of
 * the sample, one seed, the base settings and the variant without injection, frames recorded.
 * Browser tests that share a Spring context share these runs, so the engine runs them once.
 */
public final class KidnapRuns {

    /**
     * The finished pair of runs.
     *
     * @param base run token of the base variant
     * @param other run token of the variant without injection
     */
    public record Pair(String base, String other) {}

    private static final Map<Integer, Pair> DONE = new HashMap<>();
    private static final JsonMapper JSON = JsonMapper.builder().build();
    private static final HttpClient HTTP =
            HttpClient.newBuilder().connectTimeout(Duration.ofSeconds(5)).build();

    private KidnapRuns() {}

    /** The runs on the server at this port, submitted and waited for on first use. */
    public static synchronized Pair on(int port) throws Exception {
        Pair p = DONE.get(port);
        if (p == null) {
            p = submit("http://localhost:" + port);
            DONE.put(port, p);
        }
        return p;
    }

    /** GET as text. */
    public static String get(String url) throws Exception {
        HttpResponse<String> r =
                HTTP.send(HttpRequest.newBuilder(URI.create(url)).build(), HttpResponse.BodyHandlers.ofString());
        if (r.statusCode() != 200) {
            throw new IllegalStateException(url + " answered " + r.statusCode() + ": " + r.body());
        }
        return r.body();
    }

    /** GET as bytes. */
    public static HttpResponse<byte[]> getBytes(String url) throws Exception {
        return HTTP.send(HttpRequest.newBuilder(URI.create(url)).build(), HttpResponse.BodyHandlers.ofByteArray());
    }

    /** GET as JSON. */
    public static JsonNode json(String url) throws Exception {
        return JSON.readTree(get(url));
    }

    /** POST JSON, answered with JSON. */
    public static JsonNode post(String url, String body) throws Exception {
        HttpResponse<String> r = HTTP.send(
                HttpRequest.newBuilder(URI.create(url))
                        .header("Content-Type", "application/json")
                        .POST(HttpRequest.BodyPublishers.ofString(body))
                        .build(),
                HttpResponse.BodyHandlers.ofString());
        if (r.statusCode() / 100 != 2) {
            throw new IllegalStateException(url + " answered " + r.statusCode() + ": " + r.body());
        }
        return JSON.readTree(r.body());
    }

    private static Pair submit(String base) throws Exception {
        String edit = post(base + "/api/samples/storage-hall-kidnap.json/copy", "")
                .get("editToken")
                .asString();
        JsonNode batch = post(
                base + "/api/s/" + edit + "/batches",
                "{\"variants\":[\"base\",\"no injection\"],\"seeds\":[1],\"recordFrames\":true}");
        String key = batch.get("batch").asString();
        long deadline = System.nanoTime() + Duration.ofMinutes(10).toNanos();
        while (!batch.get("finished").asBoolean()) {
            if (System.nanoTime() > deadline) {
                throw new IllegalStateException("the kidnap runs did not finish in 10 minutes: " + batch);
            }
            Thread.sleep(250);
            batch = json(base + "/api/s/" + edit + "/batches/" + key);
        }
        String a = "";
        String b = "";
        for (JsonNode run : batch.get("runs")) {
            if (!"done".equals(run.get("state").asString())) {
                throw new IllegalStateException("a kidnap run did not finish: " + run);
            }
            if ("base".equals(run.get("variant").asString())) {
                a = run.get("viewToken").asString();
            } else {
                b = run.get("viewToken").asString();
            }
        }
        return new Pair(a, b);
    }
}
