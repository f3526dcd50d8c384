package dev.driftlab.app;

import static org.assertj.core.api.Assertions.assertThat;

import dev.driftlab.report.Report;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import org.junit.jupiter.api.Test;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.test.web.server.LocalServerPort;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;

/** The whole app starts on a real port and serves the home page, its assets and the schema. */
@SpringBootTest(webEnvironment = SpringBootTest.WebEnvironment.RANDOM_PORT)
class DriftlabApplicationSmokeTest {

    @LocalServerPort
    int port;

    private HttpResponse<String> fetch(String path) throws Exception {
        return HttpClient.newHttpClient()
                .send(
                        HttpRequest.newBuilder(URI.create("http://localhost:" + port + path))
                                .build(),
                        HttpResponse.BodyHandlers.ofString());
    }

    @Test
    void homeAssetsAndSchema_areServed() throws Exception {
        HttpResponse<String> home = fetch("/");
        assertThat(home.statusCode()).isEqualTo(200);
        assertThat(home.body()).contains("Storage hall: robot carried away mid-route");

        assertThat(fetch("/assets/css/driftlab.css").statusCode()).isEqualTo(200);
        assertThat(fetch("/schema/scenario-1.schema.json").body()).contains("driftlab-scenario/1");
        String htmxPath = home.body().replaceAll("(?s).*src=\"(/webjars/htmx\\.org/[^\"]+)\".*", "$1");
        assertThat(fetch(htmxPath).statusCode()).isEqualTo(200);
    }

    @Test
    void apiDocumentAndHealth_areServed() throws Exception {
        HttpResponse<String> doc = fetch("/v3/api-docs");
        assertThat(doc.statusCode()).isEqualTo(200);
        assertThat(doc.body())
                .contains("/api/scenarios")
                .contains("/api/s/{token}/revisions")
                .contains("/api/s/{token}/batches")
                .contains("/api/s/{token}/runs/{id}/frames/{chunk}");
        JsonNode info = JsonMapper.shared().readTree(doc.body()).path("info");
        assertThat(info.path("title").asString()).isEqualTo("Driftlab API");
        assertThat(info.path("version").asString()).isEqualTo("1");
        assertThat(info.path("description").asString())
                .contains("Monte Carlo localization")
                .contains(Report.CAUTION);
        assertThat(fetch("/actuator/health").body()).contains("UP");
    }

    @Test
    void apiPage_listsEveryOperationOfTheDocument_andLeavesTheDocumentsServerAlone() throws Exception {
        // the page replaces a bundled viewer; it must show what the document holds (common practice,
        // no source)
        JsonNode doc = JsonMapper.shared().readTree(fetch("/v3/api-docs").body());
        HttpResponse<String> page = fetch("/api-docs.html");

        assertThat(page.statusCode()).isEqualTo(200);
        assertThat(page.headers().firstValue("Content-Type"))
                .hasValueSatisfying(t -> assertThat(t).startsWith("text/html"));
        assertThat(page.body()).contains("Driftlab API, version 1").contains("href=\"/v3/api-docs\"");
        int operations = 0;
        for (var path : doc.path("paths").properties()) {
            for (var op : path.getValue().properties()) {
                String row = op.getKey().toUpperCase(java.util.Locale.ROOT)
                        + "</code></td>\n          <th scope=\"row\"><code>" + path.getKey() + "</code>";
                assertThat(page.body()).as(row).contains(row);
                assertThat(page.body())
                        .contains(org.springframework.web.util.HtmlUtils.htmlEscape(
                                op.getValue().path("summary").asString()));
                operations++;
            }
        }
        assertThat(operations).isGreaterThan(20);
        assertThat(page.body()).contains(operations + " operations.");
        // the page asks springdoc for the document as if at its own address: the document's server
        // address stays the app's root
        assertThat(JsonMapper.shared()
                        .readTree(fetch("/v3/api-docs").body())
                        .path("servers")
                        .path(0)
                        .path("url")
                        .asString())
                .isEqualTo("http://localhost:" + port);
    }

    @Test
    void oversizeUpload_isRefusedWith413_andStoresNothing() throws Exception {
        HttpClient client = HttpClient.newBuilder()
                .cookieHandler(new java.net.CookieManager())
                .build();
        HttpResponse<String> home = client.send(
                HttpRequest.newBuilder(URI.create("http://localhost:" + port + "/"))
                        .build(),
                HttpResponse.BodyHandlers.ofString());
        String headers =
                home.body().replaceAll("(?s).*hx-headers=\"([^\"]*)\".*", "$1").replace("&quot;", "\"");
        String name = headers.replaceAll(".*\\{\"([^\"]+)\".*", "$1");
        String token = headers.replaceAll(".*: \"([^\"]+)\".*", "$1");
        int before = fetch("/api/scenarios").body().split("viewToken").length;
        String boundary = "driftlabboundary";
        byte[] filler = new byte[3 * 1024 * 1024];
        java.util.Arrays.fill(filler, (byte) ' ');
        var body = new java.io.ByteArrayOutputStream();
        body.write(("--" + boundary + "\r\nContent-Disposition: form-data; name=\"file\"; filename=\"big.json\"\r\n"
                        + "Content-Type: application/json\r\n\r\n")
                .getBytes(java.nio.charset.StandardCharsets.UTF_8));
        body.write(filler);
        body.write(("\r\n--" + boundary + "--\r\n").getBytes(java.nio.charset.StandardCharsets.UTF_8));

        HttpResponse<String> r = client.send(
                HttpRequest.newBuilder(URI.create("http://localhost:" + port + "/scenarios/import"))
                        .header("Content-Type", "multipart/form-data; boundary=" + boundary)
                        .header(name, token)
                        .POST(HttpRequest.BodyPublishers.ofByteArray(body.toByteArray()))
                        .build(),
                HttpResponse.BodyHandlers.ofString());

        assertThat(r.statusCode()).isEqualTo(413);
        assertThat(r.body()).contains("larger than the 2 MB upload limit");
        assertThat(fetch("/api/scenarios").body().split("viewToken").length).isEqualTo(before);
    }

    /** A body of unknown length (chunked): only counting what is read can stop it. */
    private static HttpRequest.BodyPublisher chunked(int bytes) {
        byte[] filler = new byte[bytes];
        java.util.Arrays.fill(filler, (byte) ' ');
        filler[0] = '"';
        return HttpRequest.BodyPublishers.ofInputStream(() -> new java.io.ByteArrayInputStream(filler));
    }

    @Test
    void chunkedBodiesOverTheLimit_areRefusedWith413_inTheFormOfTheirClient() throws Exception {
        HttpClient client = HttpClient.newBuilder()
                .version(HttpClient.Version.HTTP_1_1)
                .cookieHandler(new java.net.CookieManager())
                .build();
        HttpResponse<String> home = client.send(
                HttpRequest.newBuilder(URI.create("http://localhost:" + port + "/"))
                        .build(),
                HttpResponse.BodyHandlers.ofString());
        String headers =
                home.body().replaceAll("(?s).*hx-headers=\"([^\"]*)\".*", "$1").replace("&quot;", "\"");
        String name = headers.replaceAll(".*\\{\"([^\"]+)\".*", "$1");
        String csrf = headers.replaceAll(".*: \"([^\"]+)\".*", "$1");
        String view = home.body().replaceAll("(?s).*href=\"/s/([A-Za-z0-9_-]+)\".*", "$1");
        int size = (int) (2.5 * 1024 * 1024);

        HttpResponse<String> api = client.send(
                HttpRequest.newBuilder(URI.create("http://localhost:" + port + "/api/scenarios"))
                        .header("Content-Type", "application/json")
                        .POST(chunked(size))
                        .build(),
                HttpResponse.BodyHandlers.ofString());
        HttpResponse<String> check = client.send(
                HttpRequest.newBuilder(URI.create("http://localhost:" + port + "/s/" + view + "/editor/check"))
                        .header("Content-Type", "application/json")
                        .header("HX-Request", "true")
                        .header(name, csrf)
                        .POST(chunked(size))
                        .build(),
                HttpResponse.BodyHandlers.ofString());

        assertThat(api.statusCode()).isEqualTo(413);
        assertThat(api.headers().firstValue("Content-Type"))
                .hasValueSatisfying(t -> assertThat(t).contains("application/problem+json"));
        assertThat(api.body()).contains("body: larger than the 2 MB limit");
        assertThat(check.statusCode()).isEqualTo(413);
        assertThat(check.body()).contains("body: larger than the 2 MB limit");
    }
}
