package dev.driftlab.app.system.web;

import static org.assertj.core.api.Assertions.assertThat;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.csrf;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.get;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.multipart;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.post;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.header;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.status;

import dev.driftlab.app.WebSlice;
import dev.driftlab.app.scenarios.ScenarioStore;
import dev.driftlab.app.scenarios.persistence.ScenarioRepository;
import dev.driftlab.app.sharing.ShareLinks;
import dev.driftlab.app.sharing.Tokens;
import dev.driftlab.scenario.Scenarios;
import java.nio.charset.StandardCharsets;
import java.util.List;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.http.MediaType;
import org.springframework.mock.web.MockMultipartFile;
import org.springframework.test.web.servlet.MockMvc;
import org.springframework.test.web.servlet.request.MockHttpServletRequestBuilder;

/** View links change nothing, guessed and revoked links look alike, CSRF holds, output is escaped. */
@WebSlice
class SecurityTest {

    @Autowired
    MockMvc mvc;

    @Autowired
    ScenarioStore store;

    @Autowired
    ShareLinks links;

    @Autowired
    ScenarioRepository scenarios;

    ScenarioStore.Created c;
    String doc;

    @BeforeEach
    void scenario() {
        doc = Scenarios.corridor().withName("Guarded").json();
        c = store.create(doc, "Ana", "start");
    }

    /** Every request that changes a scenario or its links, pages and API, with the token put in. */
    private List<MockHttpServletRequestBuilder> mutating(String t) {
        return List.of(
                post("/s/" + t + "/edit")
                        .param("baseRevision", "1")
                        .param("document", doc)
                        .with(csrf()),
                post("/s/" + t + "/duplicate").with(csrf()),
                post("/s/" + t + "/links/view/reissue").with(csrf()),
                post("/s/" + t + "/links/view/revoke").with(csrf()),
                post("/s/" + t + "/links/edit/reissue").with(csrf()),
                post("/s/" + t + "/links/edit/revoke").with(csrf()),
                post("/api/s/" + t + "/revisions")
                        .param("base", "1")
                        .contentType(MediaType.APPLICATION_JSON)
                        .content(doc),
                post("/api/s/" + t + "/duplicate"),
                post("/api/s/" + t + "/links/view/reissue"),
                post("/api/s/" + t + "/links/view/revoke"),
                post("/api/s/" + t + "/links/edit/reissue"),
                post("/api/s/" + t + "/links/edit/revoke"));
    }

    @Test
    void viewLink_cannotChangeAnything_onAnyMutatingEndpoint() throws Exception {
        long before = scenarios.count();
        for (MockHttpServletRequestBuilder r : mutating(c.viewToken())) {
            mvc.perform(r).andExpect(status().isForbidden());
        }
        mvc.perform(get("/s/" + c.viewToken() + "/edit")).andExpect(status().isForbidden());
        mvc.perform(get("/api/s/" + c.viewToken() + "/links")).andExpect(status().isForbidden());

        assertThat(scenarios.count()).isEqualTo(before);
        assertThat(store.history(c.scenarioId())).hasSize(1);
        assertThat(links.current(c.scenarioId()).view()).hasValue(c.viewToken());
        assertThat(links.current(c.scenarioId()).edit()).hasValue(c.editToken());
    }

    @Test
    void guessedToken_is404_everywhere_andLooksLikeARevokedOne() throws Exception {
        String guessed = Tokens.next();
        for (MockHttpServletRequestBuilder r : mutating(guessed)) {
            mvc.perform(r).andExpect(status().isNotFound());
        }
        for (String path : List.of("/s/%s", "/s/%s/history", "/s/%s/export", "/api/s/%s", "/api/s/%s/revisions")) {
            mvc.perform(get(path.formatted(guessed))).andExpect(status().isNotFound());
            mvc.perform(get(path.formatted("short"))).andExpect(status().isNotFound());
        }
        links.revoke(c.scenarioId(), dev.driftlab.app.sharing.Access.VIEW);

        String revoked = mvc.perform(get("/s/" + c.viewToken()))
                .andExpect(status().isNotFound())
                .andReturn()
                .getResponse()
                .getContentAsString();
        String unknown = mvc.perform(get("/s/" + guessed))
                .andExpect(status().isNotFound())
                .andReturn()
                .getResponse()
                .getContentAsString();
        assertThat(stripCsrf(revoked)).isEqualTo(stripCsrf(unknown));
        String apiRevoked = mvc.perform(get("/api/s/" + c.viewToken()))
                .andReturn()
                .getResponse()
                .getContentAsString();
        String apiUnknown =
                mvc.perform(get("/api/s/" + guessed)).andReturn().getResponse().getContentAsString();
        assertThat(apiRevoked.replace(c.viewToken(), "")).isEqualTo(apiUnknown.replace(guessed, ""));
    }

    @Test
    void formPosts_withoutCsrfToken_areRefused_andChangeNothing() throws Exception {
        long before = scenarios.count();

        mvc.perform(post("/s/" + c.editToken() + "/edit")
                        .param("baseRevision", "1")
                        .param("document", doc))
                .andExpect(status().isForbidden());
        mvc.perform(post("/scenarios/from-sample").param("sample", "office-carpet-stall.json"))
                .andExpect(status().isForbidden());
        mvc.perform(post("/s/" + c.editToken() + "/links/view/revoke").header("HX-Request", "true"))
                .andExpect(status().isForbidden());

        assertThat(store.history(c.scenarioId())).hasSize(1);
        assertThat(scenarios.count()).isEqualTo(before);
        assertThat(links.current(c.scenarioId()).view()).hasValue(c.viewToken());
    }

    @Test
    void scriptNamedScenario_isShownEscaped_onEveryPage() throws Exception {
        String evil = "<script>alert(1)</script>";
        ScenarioStore.Created e =
                store.create(Scenarios.corridor().withName(evil).json(), evil, evil);

        for (String path : List.of(
                "/", "/s/" + e.editToken(), "/s/" + e.viewToken() + "/history", "/s/" + e.editToken() + "/edit")) {
            String html = mvc.perform(get(path))
                    .andExpect(status().isOk())
                    .andReturn()
                    .getResponse()
                    .getContentAsString();
            assertThat(html).as(path).doesNotContain(evil).contains("&lt;script&gt;alert(1)&lt;/script&gt;");
        }
    }

    @Test
    void oversizeApiBody_isRefused_andStoresNothing() throws Exception {
        long before = scenarios.count();
        byte[] big = new byte[2 * 1024 * 1024 + 1];
        java.util.Arrays.fill(big, (byte) ' ');

        mvc.perform(post("/api/scenarios")
                        .contentType(MediaType.APPLICATION_JSON)
                        .content(big))
                .andExpect(status().isPayloadTooLarge());

        assertThat(scenarios.count()).isEqualTo(before);
    }

    @Test
    void importWithoutAFile_isRefusedNamingTheField() throws Exception {
        MockMultipartFile empty = new MockMultipartFile("file", "x.json", "application/json", new byte[0]);
        String html = mvc.perform(multipart("/scenarios/import").file(empty).with(csrf()))
                .andExpect(status().isUnprocessableContent())
                .andReturn()
                .getResponse()
                .getContentAsString(StandardCharsets.UTF_8);
        assertThat(html).contains("<code>file</code>");
    }

    @Test
    void pages_carryAStrictContentPolicy_andNoReferrer() throws Exception {
        var response = mvc.perform(get("/s/" + c.viewToken()))
                .andExpect(header().string("Referrer-Policy", "no-referrer"))
                .andReturn()
                .getResponse();
        // Content Security Policy Level 3 (W3C), section 2.2 (number from memory): a policy is a list of directives
        // separated by ";", each a name and space-separated sources. Scripts only from the app
        // itself: script-src is exactly 'self', with no inline scripts or eval.
        java.util.Map<String, List<String>> policy = directives(response.getHeader("Content-Security-Policy"));
        assertThat(policy).containsKey("script-src");
        assertThat(policy.get("script-src"))
                .containsExactly("'self'")
                .doesNotContain("'unsafe-inline'", "'unsafe-eval'", "*", "data:");
        // without script-src, default-src would govern scripts; it must be as strict
        assertThat(policy.get("default-src")).containsExactly("'self'");
    }

    /** Directive name (lower case) to its sources, from a Content-Security-Policy value. */
    private static java.util.Map<String, List<String>> directives(String header) {
        assertThat(header).as("Content-Security-Policy header").isNotBlank();
        java.util.Map<String, List<String>> out = new java.util.LinkedHashMap<>();
        for (String directive : header.split(";")) {
            String[] tokens = directive.strip().split("\\s+");
            if (tokens.length == 0 || tokens[0].isEmpty()) {
                continue;
            }
            // the first of duplicate directives counts (CSP3, parsing a serialized policy)
            out.putIfAbsent(
                    tokens[0].toLowerCase(java.util.Locale.ROOT),
                    List.of(tokens).subList(1, tokens.length));
        }
        return out;
    }

    private static String stripCsrf(String html) {
        return html.replaceAll("hx-headers=\"[^\"]*\"", "");
    }
}
