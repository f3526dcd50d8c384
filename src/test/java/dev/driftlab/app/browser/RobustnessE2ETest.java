package dev.driftlab.app.browser;

import static org.assertj.core.api.Assertions.assertThat;

import dev.driftlab.app.JarProcesses;
import dev.driftlab.scenario.Scenarios;
import java.io.IOException;
import java.io.InputStream;
import java.net.CookieManager;
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
 * chunked bodies far over the limit at once, PNG decompression bombs at once, a scenario just under
 * the size limits with its reports, scene and drawings asked for at once, token tricks, script
 * payloads in every text field on every page that shows them, many page loads at once. After each,
 * the server must still answer.
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

    private static JarProcesses jar;

    @BeforeAll
    static void startTheJarWithASmallHeap() throws Exception {
        // a 512 MB heap, ended at once by an out-of-memory error: the probe must not get near it
        jar = JarProcesses.onOwnData("probe");
        server = jar.startServer();
        base = jar.base();
    }

    @AfterAll
    static void stop() throws Exception {
        if (jar != null) {
            jar.close();
        }
    }

    private static HttpResponse<String> get(String path) throws IOException, InterruptedException {
        return jar.get(path);
    }

    private static HttpResponse<String> postJson(String path, String body) throws IOException, InterruptedException {
        return jar.post(path, body);
    }

    /** A browser-like client: keeps cookies, so page posts carry the CSRF cookie with the header. */
    private static final HttpClient browser = HttpClient.newBuilder()
            .connectTimeout(Duration.ofSeconds(10))
            .cookieHandler(new CookieManager())
            .version(HttpClient.Version.HTTP_1_1)
            .build();

    /** The CSRF header name and value a page hands its scripts in {@code hx-headers}. */
    private static String[] csrf() throws IOException, InterruptedException {
        String page = browser.send(
                        HttpRequest.newBuilder(URI.create(base + "/"))
                                .timeout(Duration.ofSeconds(60))
                                .build(),
                        HttpResponse.BodyHandlers.ofString())
                .body();
        String headers =
                page.replaceAll("(?s).*hx-headers=\"([^\"]*)\".*", "$1").replace("&quot;", "\"");
        return new String[] {
            headers.replaceAll(".*\\{\"([^\"]+)\".*", "$1"), headers.replaceAll(".*: \"([^\"]+)\".*", "$1")
        };
    }

    private static JsonNode created(HttpResponse<String> r) {
        assertThat(r.statusCode()).as(r.body()).isEqualTo(201);
        return json.readTree(r.body());
    }

    /** Submits one seed of every variant and returns the first run's id. */
    private static long runOf(String view) throws IOException, InterruptedException {
        HttpResponse<String> batch = postJson("/api/s/" + view + "/batches", "{\"seeds\":[1]}");
        assertThat(batch.statusCode()).as(batch.body()).isEqualTo(202);
        return json.readTree(batch.body()).get("runs").get(0).get("id").asLong();
    }

    private static String runToken(String view, long id) throws IOException, InterruptedException {
        return json.readTree(get("/api/s/" + view + "/runs/" + id).body())
                .get("viewToken")
                .asString();
    }

    private static void stillAnswers() throws IOException, InterruptedException {
        assertThat(server.isAlive()).as("server process").isTrue();
        long t0 = System.nanoTime();
        assertThat(get("/").statusCode()).isEqualTo(200);
        assertThat(Duration.ofNanos(System.nanoTime() - t0)).isLessThan(Duration.ofSeconds(20));
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

        // the same for a suite: its view link on every mutating suite endpoint but running it
        HttpResponse<String> suite = postJson(
                "/api/suites",
                "{\"name\": " + json.writeValueAsString("Suite " + SCRIPT) + ", \"description\": "
                        + json.writeValueAsString(ATTRIBUTE) + ", \"seeds\": 1, \"scenarios\": [{\"link\": \""
                        + view + "\"}]}");
        JsonNode suiteLinks = created(suite);
        String suiteView = suiteLinks.get("viewLink").asString();
        String suiteEdit = suiteLinks.get("editLink").asString();
        int suiteTried = 0;
        for (Map.Entry<String, JsonNode> p : paths.properties()) {
            if (!p.getKey().startsWith("/api/suites/{token}") || !p.getValue().has("post")) {
                continue;
            }
            if (p.getKey().equals("/api/suites/{token}/runs")) {
                continue; // a view link may run a suite
            }
            String path = p.getKey()
                    .replace("{token}", suiteView)
                    .replace("{id}", "1")
                    .replace("{access}", "edit");
            HttpResponse<String> r = postJson(path + (path.endsWith("/revisions") ? "?base=1" : ""), "{}");
            assertThat(r.statusCode())
                    .as("post %s with a suite's view link: %s", p.getKey(), r.body())
                    .isBetween(400, 499);
            assertThat(r.body()).doesNotContain(suiteEdit);
            suiteTried++;
        }
        assertThat(suiteTried)
                .as("mutating suite endpoints tried with a view link")
                .isGreaterThanOrEqualTo(4);
        assertThat(json.readTree(get("/api/suites/" + suiteEdit).body())
                        .get("revision")
                        .asInt())
                .isEqualTo(1);
        for (String page : List.of("/", "/suites/" + suiteView, "/suites/" + suiteEdit)) {
            HttpResponse<String> r = get(page);
            assertThat(r.statusCode()).as(page).isEqualTo(200);
            assertThat(r.body()).as(page).doesNotContain(SCRIPT).doesNotContain(ATTRIBUTE);
        }
        assertThat(get("/suites/" + suiteView).body()).doesNotContain(suiteEdit);

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

    /**
     * A PNG of 40,000 x 40,000 grey pixels, all black, deflated to about 1.6 MB: decoded it would take
     * gigabytes (the probe's bomb). Layout from the PNG specification (ISO/IEC 15948): signature,
     * IHDR, one IDAT of the whole zlib stream, IEND.
     */
    private static byte[] pngBomb(int side) throws IOException {
        java.io.ByteArrayOutputStream zipped = new java.io.ByteArrayOutputStream(2 << 20);
        java.util.zip.Deflater d = new java.util.zip.Deflater(java.util.zip.Deflater.BEST_COMPRESSION);
        byte[] row = new byte[side + 1]; // filter byte 0, then black pixels
        byte[] buf = new byte[1 << 16];
        for (int r = 0; r < side; r++) {
            d.setInput(row);
            while (!d.needsInput()) {
                zipped.write(buf, 0, d.deflate(buf));
            }
        }
        d.finish();
        while (!d.finished()) {
            zipped.write(buf, 0, d.deflate(buf));
        }
        d.end();
        java.io.ByteArrayOutputStream bytes = new java.io.ByteArrayOutputStream();
        java.io.DataOutputStream out = new java.io.DataOutputStream(bytes);
        out.write(new byte[] {(byte) 0x89, 'P', 'N', 'G', '\r', '\n', 0x1a, '\n'});
        java.nio.ByteBuffer ihdr = java.nio.ByteBuffer.allocate(13);
        ihdr.putInt(side).putInt(side).put(new byte[] {8, 0, 0, 0, 0});
        pngChunk(out, "IHDR", ihdr.array());
        pngChunk(out, "IDAT", zipped.toByteArray());
        pngChunk(out, "IEND", new byte[0]);
        return bytes.toByteArray();
    }

    private static void pngChunk(java.io.DataOutputStream out, String type, byte[] data) throws IOException {
        byte[] t = type.getBytes(java.nio.charset.StandardCharsets.US_ASCII);
        out.writeInt(data.length);
        out.write(t);
        out.write(data);
        java.util.zip.CRC32 crc = new java.util.zip.CRC32();
        crc.update(t);
        crc.update(data);
        out.writeInt((int) crc.getValue());
    }

    private static HttpRequest.BodyPublisher multipart(String boundary, String field, byte[] file) {
        java.io.ByteArrayOutputStream body = new java.io.ByteArrayOutputStream(file.length + 512);
        body.writeBytes(("--" + boundary + "\r\nContent-Disposition: form-data; name=\"cellSize\"\r\n\r\n0.05\r\n"
                        + "--" + boundary + "\r\nContent-Disposition: form-data; name=\"" + field
                        + "\"; filename=\"plan.png\"\r\nContent-Type: image/png\r\n\r\n")
                .getBytes(java.nio.charset.StandardCharsets.UTF_8));
        body.writeBytes(file);
        body.writeBytes(("\r\n--" + boundary + "--\r\n").getBytes(java.nio.charset.StandardCharsets.UTF_8));
        return HttpRequest.BodyPublishers.ofByteArray(body.toByteArray());
    }

    @Test
    void pngBombs_severalAtOnce_areRefusedNamingTheSize_andTheServerStillAnswers() throws Exception {
        JsonNode links = created(postJson("/api/scenarios", Scenarios.corridor().json()));
        String edit = links.get("editToken").asString();
        byte[] bomb = pngBomb(40_000);
        assertThat(bomb.length).as("the bomb fits the 2 MB upload limit").isBetween(1 << 20, 2_000_000);
        String[] csrf = csrf();

        List<CompletableFuture<HttpResponse<String>>> sent = new ArrayList<>();
        for (int i = 0; i < 4; i++) {
            sent.add(browser.sendAsync(
                    HttpRequest.newBuilder(URI.create(base + "/s/" + edit + "/editor/import"))
                            .timeout(Duration.ofSeconds(120))
                            .header("Content-Type", "multipart/form-data; boundary=probeboundary")
                            .header(csrf[0], csrf[1])
                            .POST(multipart("probeboundary", "image", bomb))
                            .build(),
                    HttpResponse.BodyHandlers.ofString()));
        }
        for (CompletableFuture<HttpResponse<String>> f : sent) {
            HttpResponse<String> r = f.get();
            assertThat(r.statusCode()).as(r.body()).isEqualTo(422);
            JsonNode refused = json.readTree(r.body());
            assertThat(refused.get("field").asString()).isEqualTo("image");
            assertThat(refused.get("message").asString())
                    .contains("40000 x 40000 pixels")
                    .contains("2000 pixels a side");
        }
        stillAnswers();
    }

    /** The corridor scenario with {@code rooms} more small rooms in rows beside it. */
    private static String manyRooms(int rooms) {
        Scenarios.Builder b = Scenarios.corridor().withName("Many rooms");
        for (int i = 0; i < rooms; i++) {
            b.withRoom(new dev.driftlab.scenario.Room(
                    "r" + i,
                    "R" + i,
                    dev.driftlab.geometry.Polygon.rectangle(30 + (i % 100) * 3, (i / 100) * 3, 2, 2)));
        }
        // written compactly, as a client would send it to stay under the limit
        return json.writeValueAsString(json.readTree(b.json()));
    }

    @Test
    void aScenarioJustUnderTheLimits_itsReportsSceneAndDrawingsAtOnce_answerOrAreBusy() throws Exception {
        int rooms = 9_900;
        String document = manyRooms(rooms);
        while (document.length() > 2_000_000) {
            rooms -= 200;
            document = manyRooms(rooms);
        }
        assertThat(rooms).as("rooms in a document under 2 MB").isGreaterThan(8_000);
        JsonNode links = created(postJson("/api/scenarios", document));
        String view = links.get("viewToken").asString();
        String edit = links.get("editToken").asString();
        long id = runOf(view);
        // the reports and the scene need a run, not a finished one: cancel it so it costs no worker time
        HttpResponse<String> cancel = postJson("/api/s/" + edit + "/runs/" + id + "/cancel", "{}");
        assertThat(cancel.statusCode()).as(cancel.body()).isBetween(200, 299);
        String run = runToken(view, id);

        List<String> paths = new ArrayList<>();
        for (int i = 0; i < 3; i++) {
            paths.addAll(List.of(
                    "/r/" + run + "/report.pdf",
                    "/r/" + run + "/report",
                    "/r/" + run + "/batch-report",
                    "/r/" + run + "/batch-report.pdf",
                    "/api/r/" + run + "/scene"));
        }
        paths.addAll(List.of(
                "/s/" + view,
                "/s/" + view,
                "/s/" + edit + "/editor",
                "/s/" + view + "/history",
                "/r/" + run,
                "/r/" + run + "/play",
                "/",
                "/"));
        List<CompletableFuture<HttpResponse<String>>> sent = new ArrayList<>();
        for (String p : paths) {
            sent.add(http.sendAsync(
                    HttpRequest.newBuilder(URI.create(base + p))
                            .timeout(Duration.ofSeconds(180))
                            .build(),
                    HttpResponse.BodyHandlers.ofString()));
        }
        int answered = 0;
        for (int i = 0; i < paths.size(); i++) {
            HttpResponse<String> r = sent.get(i).get();
            if (r.statusCode() == 503) {
                assertThat(r.headers().firstValue("Retry-After"))
                        .as(paths.get(i))
                        .isPresent();
            } else {
                assertThat(r.statusCode()).as("%s: %s", paths.get(i), r.body()).isEqualTo(200);
                answered++;
            }
        }
        assertThat(answered).as("requests answered in full").isGreaterThanOrEqualTo(paths.size() / 2);
        HttpResponse<String> page = get("/r/" + run + "/report");
        if (page.statusCode() == 200) {
            assertThat(page.body()).contains("Drawing left out");
        }
        stillAnswers();
        assertThat(get("/api/s/" + view).statusCode()).isEqualTo(200);
    }

    /**
     * What a refusal must never show: a link the request did not carry itself (a problem document
     * names the address asked for), or the server's insides.
     */
    private static void leaksNothing(String what, HttpResponse<String> r, List<String> secrets) {
        for (String secret : secrets) {
            if (!what.contains(secret)) {
                assertThat(r.body()).as("%s leaks a link", what).doesNotContain(secret);
            }
        }
        assertThat(r.body())
                .as(what)
                .doesNotContain("Exception")
                .doesNotContain("at dev.driftlab")
                .doesNotContain("org.springframework")
                .doesNotContain("root:");
    }

    @Test
    void tokenTricks_areRefusedWith404Or403_andLeakNothing() throws Exception {
        JsonNode a = created(
                postJson("/api/scenarios", Scenarios.corridor().withName("A").json()));
        JsonNode b = created(
                postJson("/api/scenarios", Scenarios.corridor().withName("B").json()));
        String viewA = a.get("viewToken").asString();
        String editA = a.get("editToken").asString();
        String viewB = b.get("viewToken").asString();
        String editB = b.get("editToken").asString();
        long runB = runOf(viewB);
        String runTokenB = runToken(viewB, runB);
        List<String> secrets = List.of(viewA, editA, viewB, editB, runTokenB);

        // wrong lengths, another scenario's run, a link of one kind where another kind belongs
        List<String> notFound = List.of(
                "/s/abc",
                "/s/" + viewA + "x",
                "/s/" + viewA.substring(1),
                "/s/" + viewA + viewA,
                "/api/s/" + viewA.substring(2),
                "/s/" + viewA + "/runs/" + runB,
                "/api/s/" + viewA + "/runs/" + runB,
                "/s/" + viewA + "/runs/" + runB + "/report",
                "/api/s/" + viewA + "/runs/" + runB + "/scene",
                "/api/s/" + viewA + "/runs/" + runB + "/result",
                "/r/" + viewB,
                "/r/" + viewB + "/report",
                "/api/r/" + editB + "/scene",
                "/s/" + runTokenB,
                "/api/s/" + runTokenB,
                "/r/" + runTokenB.substring(1) + "/report.pdf");
        for (String p : notFound) {
            HttpResponse<String> r = get(p);
            assertThat(r.statusCode()).as("%s: %s", p, r.body()).isEqualTo(404);
            leaksNothing(p, r, secrets);
        }

        // a view link where the edit link is needed
        HttpResponse<String> editPage = get("/s/" + viewA + "/edit");
        assertThat(editPage.statusCode()).as(editPage.body()).isIn(403, 404);
        leaksNothing("edit page with a view link", editPage, secrets);
        String[] csrf = csrf();
        for (String p : List.of("/s/" + viewA + "/links/view/revoke", "/s/" + viewA + "/links/edit/reissue")) {
            HttpResponse<String> r = browser.send(
                    HttpRequest.newBuilder(URI.create(base + p))
                            .timeout(Duration.ofSeconds(60))
                            .header(csrf[0], csrf[1])
                            .POST(HttpRequest.BodyPublishers.noBody())
                            .build(),
                    HttpResponse.BodyHandlers.ofString());
            assertThat(r.statusCode()).as("%s: %s", p, r.body()).isIn(403, 404);
            leaksNothing(p, r, secrets);
        }
        HttpResponse<String> save = postJson(
                "/api/s/" + viewA + "/revisions?base=1",
                Scenarios.corridor().withName("A2").json());
        assertThat(save.statusCode()).as(save.body()).isIn(403, 404);
        leaksNothing("/api/s/" + viewA + "/revisions", save, secrets);

        // encoded and traversal-looking tokens: refused by the container (400) or not found
        List<String> odd = List.of(
                "/s/..%2F..%2Fetc%2Fpasswd",
                "/s/%2e%2e/" + viewA,
                "/s/" + viewA + "%2F..%2F" + editA,
                "/s/" + viewA + "%00",
                "/r/..%2F" + runTokenB + "/report",
                "/api/s/%252e%252e%252f" + viewA,
                "/s/%20" + viewA);
        for (String p : odd) {
            HttpResponse<String> r = get(p);
            assertThat(r.statusCode()).as("%s: %s", p, r.body()).isIn(400, 403, 404);
            leaksNothing(p, r, secrets);
        }
        // nothing changed: every link still opens its scenario
        for (String t : List.of(viewA, editA, viewB, editB)) {
            assertThat(get("/api/s/" + t).statusCode()).isEqualTo(200);
        }
        assertThat(get("/r/" + runTokenB).statusCode()).isEqualTo(200);
        stillAnswers();
    }

    private static final String PAYLOAD = SCRIPT + " " + ATTRIBUTE;

    /** How both the page templates and the drawings escape the payload's start. */
    private static final String ESCAPED = " &lt;script&gt;alert(";

    /** Keys of the texts a person writes in a scenario: names, descriptions and ids, anywhere. */
    private static final Set<String> TEXT_KEYS = Set.of("name", "description", "id");

    /** Keys that refer to an id given elsewhere (a door's room), changed along with it. */
    private static final Set<String> REFERENCE_KEYS = Set.of("room");

    /**
     * Appends the payload to every text of a scenario document and to every reference to one,
     * collecting the texts as they were.
     */
    private static void poison(JsonNode node, java.util.Set<String> texts) {
        if (node instanceof tools.jackson.databind.node.ObjectNode o) {
            for (String key : List.copyOf(o.propertyNames())) {
                JsonNode v = o.get(key);
                if ((TEXT_KEYS.contains(key) || REFERENCE_KEYS.contains(key)) && v.isString()) {
                    if (TEXT_KEYS.contains(key)) {
                        texts.add(v.asString());
                    }
                    o.put(key, v.asString() + " " + PAYLOAD);
                } else {
                    poison(v, texts);
                }
            }
        } else if (node.isArray()) {
            for (JsonNode n : node) {
                poison(n, texts);
            }
        }
    }

    private static String encoded(String s) {
        return java.net.URLEncoder.encode(s, java.nio.charset.StandardCharsets.UTF_8);
    }

    /** A page, asked again after a pause while the server answers busy. */
    private static HttpResponse<String> page(String path) throws Exception {
        HttpResponse<String> r = get(path);
        for (int i = 0; i < 5 && r.statusCode() == 503; i++) {
            Thread.sleep(3_000);
            r = get(path);
        }
        return r;
    }

    /**
     * Script payloads in every text field of a scenario with rooms, a door, fixtures, a fault,
     * variants and gates, and in the author and message of two revisions: no page shows any of them
     * unescaped, and each page shows escaped the fields it is meant to show (so the check is not
     * passed by a page that leaves them out).
     */
    @Test
    void scriptPayloadsInEveryTextField_areEscapedOnEveryPageThatShowsThem() throws Exception {
        JsonNode tree = json.readTree(Files.readString(Path.of("sample-projects/storage-hall-kidnap.json")));
        java.util.Set<String> texts = new java.util.TreeSet<>();
        poison(tree, texts);
        assertThat(texts).hasSizeGreaterThan(20);
        String document = json.writeValueAsString(tree);
        String author = "Ana " + PAYLOAD;
        String message = "First cut " + PAYLOAD;
        JsonNode links = created(http.send(
                HttpRequest.newBuilder(URI.create(
                                base + "/api/scenarios?author=" + encoded(author) + "&message=" + encoded(message)))
                        .timeout(Duration.ofSeconds(60))
                        .header("Content-Type", "application/json")
                        .POST(HttpRequest.BodyPublishers.ofString(document))
                        .build(),
                HttpResponse.BodyHandlers.ofString()));
        String view = links.get("viewToken").asString();
        String edit = links.get("editToken").asString();
        String second = document.replace("Storage hall: robot carried away", "Storage hall: robot taken away");
        HttpResponse<String> saved = http.send(
                HttpRequest.newBuilder(URI.create(base + "/api/s/" + edit + "/revisions?base=1&author="
                                + encoded("Bo " + PAYLOAD) + "&message=" + encoded("Second cut " + PAYLOAD)))
                        .timeout(Duration.ofSeconds(60))
                        .header("Content-Type", "application/json")
                        .POST(HttpRequest.BodyPublishers.ofString(second))
                        .build(),
                HttpResponse.BodyHandlers.ofString());
        assertThat(saved.statusCode()).as(saved.body()).isEqualTo(201);
        HttpResponse<String> submitted = postJson(
                "/api/s/" + view + "/batches",
                "{\"seeds\":[1],\"variants\":[\"base\"," + json.writeValueAsString("no injection " + PAYLOAD) + "]}");
        assertThat(submitted.statusCode()).as(submitted.body()).isEqualTo(202);
        long id = json.readTree(submitted.body()).get("runs").get(0).get("id").asLong();
        String run = runToken(view, id);
        String batch = json.readTree(get("/api/s/" + view + "/runs/" + id).body())
                .get("batch")
                .asString();
        // every variant's run done, so the reports show every variant's row
        long deadline = System.nanoTime() + Duration.ofSeconds(150).toNanos();
        while (!json.readTree(get("/api/s/" + view + "/batches/" + batch).body())
                        .get("finished")
                        .asBoolean()
                && System.nanoTime() < deadline) {
            Thread.sleep(1_000);
        }

        String name = "Storage hall: robot taken away mid-route";
        String gate = "recovers";
        String variant = "no injection";
        // page -> texts it must show (escaped); every page is also searched for the raw payload
        Map<String, List<String>> pages = new java.util.LinkedHashMap<>();
        pages.put("/", List.of(name));
        pages.put("/s/" + view, List.of(name, "A 24 m by 16 m storage hall", "Storage hall", "Rack W1"));
        pages.put("/s/" + edit, List.of(name));
        pages.put("/s/" + view + "/history", List.of(name, "Ana", "First cut", "Bo", "Second cut"));
        pages.put("/s/" + view + "/compare?from=1&to=2", List.of("Storage hall: robot carried away mid-route"));
        pages.put("/s/" + edit + "/editor", List.of(name, variant, gate));
        pages.put("/s/" + edit + "/edit", List.of(name, "Rack W1", "carried-off", variant, gate));
        pages.put("/s/" + view + "/runs", List.of(variant));
        pages.put("/s/" + view + "/runs/" + id, List.of(name));
        pages.put("/r/" + run, List.of(name));
        pages.put("/r/" + run + "/report", List.of(name, gate, "Storage hall"));
        pages.put("/r/" + run + "/batch-report", List.of(name, gate, variant, "final-error"));
        pages.put("/r/" + run + "/play", List.of(variant));
        java.util.Set<String> shown = new java.util.TreeSet<>();
        org.assertj.core.api.SoftAssertions soft = new org.assertj.core.api.SoftAssertions();
        for (Map.Entry<String, List<String>> e : pages.entrySet()) {
            HttpResponse<String> r = page(e.getKey());
            assertThat(r.statusCode()).as(e.getKey()).isEqualTo(200);
            assertThat(r.body())
                    .as(e.getKey())
                    .doesNotContain("<script>alert(")
                    // escaped, the attribute breaker is plain text ("&quot;&gt;&lt;img ...") and harmless
                    .doesNotContain("<img src=x");
            for (String start : e.getValue()) {
                // the whole text as written (the payload follows it)
                String t = texts.stream()
                        .filter(x -> x.startsWith(start))
                        .findFirst()
                        .orElse(start);
                soft.assertThat(r.body().contains(t + ESCAPED))
                        .as("%s shows %s escaped", e.getKey(), t)
                        .isTrue();
            }
            for (String t : texts) {
                if (r.body().contains(t + ESCAPED)) {
                    shown.add(t);
                }
            }
        }
        soft.assertAll();
        assertThat(shown).as("text fields shown escaped on some page").containsAll(texts);
        stillAnswers();
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
