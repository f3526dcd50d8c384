package dev.driftlab.app;

import static org.assertj.core.api.Assertions.assertThat;

import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import org.junit.jupiter.api.Test;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.test.web.server.LocalServerPort;

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
}
