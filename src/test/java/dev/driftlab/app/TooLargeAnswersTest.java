package dev.driftlab.app;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.ByteArrayInputStream;
import java.io.ByteArrayOutputStream;
import java.net.CookieManager;
import java.net.URI;
import java.net.URLEncoder;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.charset.StandardCharsets;
import java.util.Arrays;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.test.web.server.LocalServerPort;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;

/**
 * One 413 answer per kind of client, on a real port (chunked bodies need a real connector): a
 * browser's form post gets a page, a script's call (the editor's fetch, htmx, the API) gets a
 * problem document, whatever the body's encoding; and nothing is stored. The formats follow RFC
 * 9110 section 15.5.14 (413 Content Too Large) and RFC 9457 (problem documents).
 */
@SpringBootTest(webEnvironment = SpringBootTest.WebEnvironment.RANDOM_PORT)
class TooLargeAnswersTest {

    private static final JsonMapper JSON = JsonMapper.shared();
    private static final String BOUNDARY = "driftlabboundary";
    private static final int OVER = 3 * 1024 * 1024;

    @LocalServerPort
    int port;

    private HttpClient client;
    private String edit;
    private String csrfHeader;
    private String csrfToken;

    @BeforeEach
    void aScenarioAndABrowserSession() throws Exception {
        client = HttpClient.newBuilder()
                .version(HttpClient.Version.HTTP_1_1)
                .cookieHandler(new CookieManager())
                .build();
        HttpResponse<String> created = client.send(
                HttpRequest.newBuilder(uri("/api/scenarios"))
                        .header("Content-Type", "application/json")
                        .POST(HttpRequest.BodyPublishers.ofString(
                                dev.driftlab.scenario.Scenarios.corridor().json()))
                        .build(),
                HttpResponse.BodyHandlers.ofString());
        assertThat(created.statusCode()).as(created.body()).isEqualTo(201);
        edit = JSON.readTree(created.body()).get("editToken").asString();
        String page = get("/s/" + edit + "/edit").body();
        String headers =
                page.replaceAll("(?s).*hx-headers=\"([^\"]*)\".*", "$1").replace("&quot;", "\"");
        csrfHeader = headers.replaceAll(".*\\{\"([^\"]+)\".*", "$1");
        csrfToken = headers.replaceAll(".*: \"([^\"]+)\".*", "$1");
    }

    private URI uri(String path) {
        return URI.create("http://localhost:" + port + path);
    }

    private HttpResponse<String> get(String path) throws Exception {
        return client.send(HttpRequest.newBuilder(uri(path)).build(), HttpResponse.BodyHandlers.ofString());
    }

    /** The hidden CSRF field of the first form of a page, as a browser posts it. */
    private static String[] hiddenCsrf(String page) {
        Matcher m = Pattern.compile("<input type=\"hidden\" name=\"([^\"]+)\" value=\"([^\"]+)\"/?>")
                .matcher(page);
        while (m.find()) {
            if (m.group(1).contains("csrf")) {
                return new String[] {m.group(1), m.group(2)};
            }
        }
        throw new AssertionError("no hidden CSRF field in the page");
    }

    private int revisions() throws Exception {
        return JSON.readTree(get("/api/s/" + edit + "/revisions").body()).size();
    }

    private int scenarios() throws Exception {
        JsonNode list = JSON.readTree(get("/api/scenarios").body());
        return list.toString().split("viewToken").length;
    }

    /** A multipart body with one file part of {@code bytes} spaces, sent chunked (no length). */
    private static HttpRequest.BodyPublisher chunkedMultipart(String[] field, String fileField, int bytes) {
        ByteArrayOutputStream body = new ByteArrayOutputStream();
        byte[] filler = new byte[bytes];
        Arrays.fill(filler, (byte) ' ');
        StringBuilder head = new StringBuilder();
        if (field != null) {
            head.append("--" + BOUNDARY + "\r\nContent-Disposition: form-data; name=\"" + field[0] + "\"\r\n\r\n")
                    .append(field[1])
                    .append("\r\n");
        }
        head.append("--" + BOUNDARY + "\r\nContent-Disposition: form-data; name=\"" + fileField
                + "\"; filename=\"big.bin\"\r\nContent-Type: application/octet-stream\r\n\r\n");
        body.writeBytes(head.toString().getBytes(StandardCharsets.UTF_8));
        body.writeBytes(filler);
        body.writeBytes(("\r\n--" + BOUNDARY + "--\r\n").getBytes(StandardCharsets.UTF_8));
        byte[] all = body.toByteArray();
        return HttpRequest.BodyPublishers.ofInputStream(() -> new ByteArrayInputStream(all));
    }

    @Test
    void oversizeFormPost_ofABrowser_getsAPage_andNothingIsStored() throws Exception {
        String[] csrf = hiddenCsrf(get("/s/" + edit + "/edit").body());
        String document = " ".repeat(OVER);
        String form = csrf[0] + "=" + URLEncoder.encode(csrf[1], StandardCharsets.UTF_8)
                + "&baseRevision=1&author=Ana&message=big&document=" + document;

        HttpResponse<String> r = client.send(
                HttpRequest.newBuilder(uri("/s/" + edit + "/edit"))
                        .header("Content-Type", "application/x-www-form-urlencoded")
                        .header("Accept", "text/html,application/xhtml+xml")
                        .POST(HttpRequest.BodyPublishers.ofString(form))
                        .build(),
                HttpResponse.BodyHandlers.ofString());

        assertThat(r.statusCode()).as(r.body()).isEqualTo(413);
        assertThat(r.headers().firstValue("Content-Type"))
                .hasValueSatisfying(t -> assertThat(t).startsWith("text/html"));
        assertThat(r.body()).contains("<h1>Too large</h1>").contains("larger than the 2 MB limit");
        assertThat(revisions()).isEqualTo(1);
    }

    @Test
    void oversizeChunkedUpload_ofTheEditorsScript_getsAProblemDocument_andNothingIsStored() throws Exception {
        // the editor's fetch: CSRF header, no Accept of its own, a multipart body of unknown length
        HttpResponse<String> r = client.send(
                HttpRequest.newBuilder(uri("/s/" + edit + "/editor/import"))
                        .header("Content-Type", "multipart/form-data; boundary=" + BOUNDARY)
                        .header(csrfHeader, csrfToken)
                        .POST(chunkedMultipart(null, "image", OVER))
                        .build(),
                HttpResponse.BodyHandlers.ofString());

        assertThat(r.statusCode()).as(r.body()).isEqualTo(413);
        assertThat(r.headers().firstValue("Content-Type"))
                .hasValueSatisfying(t -> assertThat(t).startsWith("application/problem+json"));
        assertThat(JSON.readTree(r.body()).get("detail").asString())
                .isEqualTo("image: larger than the 2 MB upload limit; nothing was stored.");
        assertThat(revisions()).isEqualTo(1);
    }

    @Test
    void oversizeChunkedUpload_ofABrowserForm_getsAPage_andNothingIsStored() throws Exception {
        String[] csrf = hiddenCsrf(get("/").body());
        int before = scenarios();

        HttpResponse<String> r = client.send(
                HttpRequest.newBuilder(uri("/scenarios/import"))
                        .header("Content-Type", "multipart/form-data; boundary=" + BOUNDARY)
                        .header("Accept", "text/html,application/xhtml+xml")
                        .POST(chunkedMultipart(csrf, "file", OVER))
                        .build(),
                HttpResponse.BodyHandlers.ofString());

        assertThat(r.statusCode()).as(r.body()).isEqualTo(413);
        assertThat(r.headers().firstValue("Content-Type"))
                .hasValueSatisfying(t -> assertThat(t).startsWith("text/html"));
        assertThat(r.body()).contains("Too large").contains("larger than the 2 MB upload limit");
        assertThat(scenarios()).isEqualTo(before);
    }

    @Test
    void oversizeChunkedUpload_ofTheApi_getsAProblemDocument() throws Exception {
        HttpResponse<String> r = client.send(
                HttpRequest.newBuilder(uri("/api/scenarios"))
                        .header("Content-Type", "multipart/form-data; boundary=" + BOUNDARY)
                        .POST(chunkedMultipart(null, "file", OVER))
                        .build(),
                HttpResponse.BodyHandlers.ofString());

        assertThat(r.statusCode()).as(r.body()).isEqualTo(413);
        assertThat(r.headers().firstValue("Content-Type"))
                .hasValueSatisfying(t -> assertThat(t).startsWith("application/problem+json"));
    }
}
