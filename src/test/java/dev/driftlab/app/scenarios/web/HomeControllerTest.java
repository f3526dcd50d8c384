package dev.driftlab.app.scenarios.web;

import static org.assertj.core.api.Assertions.assertThat;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.csrf;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.get;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.multipart;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.post;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.content;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.header;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.redirectedUrlPattern;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.status;

import dev.driftlab.app.WebSlice;
import dev.driftlab.app.scenarios.SampleLibrary;
import dev.driftlab.app.scenarios.ScenarioStore;
import dev.driftlab.app.scenarios.persistence.ScenarioRepository;
import dev.driftlab.scenario.Scenarios;
import java.nio.charset.StandardCharsets;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.mock.web.MockMultipartFile;
import org.springframework.test.web.servlet.MockMvc;
import org.springframework.web.util.HtmlUtils;

@WebSlice
class HomeControllerTest {

    @Autowired
    MockMvc mvc;

    @Autowired
    SampleLibrary samples;

    @Autowired
    ScenarioRepository scenarios;

    @Autowired
    ScenarioStore store;

    private String body(org.springframework.test.web.servlet.RequestBuilder r) throws Exception {
        return mvc.perform(r)
                .andExpect(status().isOk())
                .andReturn()
                .getResponse()
                .getContentAsString();
    }

    @Test
    void listing_pageAndApi_showViewLinksButNeverAnEditToken() throws Exception {
        ScenarioStore.Created c =
                store.create(Scenarios.corridor().withName("Listed").json(), "Ana", "start");

        String html = body(get("/").param("q", "Listed"));
        String json = body(get("/api/scenarios").param("q", "Listed"));

        assertThat(html).contains("/s/" + c.viewToken()).doesNotContain(c.editToken());
        assertThat(json).contains(c.viewToken()).doesNotContain(c.editToken()).doesNotContain("editToken");
    }

    @Test
    void home_withManyLargeScenarios_staysUnderItsBudget_andPages() throws Exception {
        Scenarios.Builder big = Scenarios.corridor().withName("Large site");
        for (int i = 0; i < 600; i++) {
            big.withRoom(new dev.driftlab.scenario.Room(
                    "r" + i,
                    "Room " + i,
                    dev.driftlab.geometry.Polygon.rectangle(30 + (i % 30) * 3, (i / 30) * 3, 2, 2)));
        }
        String json = big.json();
        for (int i = 0; i < 30; i++) {
            store.create(json, "Ana", "large " + i);
        }
        long oneDrawing = store.search("Large site", 1).get(0).rendering().svg().length();

        String first = body(get("/").param("q", "Large site"));
        String second = body(get("/").param("q", "Large site").param("page", "2"));

        assertThat(oneDrawing).isGreaterThan(64 * 1024);
        assertThat(first.length()).isLessThan(512 * 1024);
        assertThat(first).contains("Plan too large to").contains("rel=\"next\"");
        assertThat(first.split("class=\"scenario-card\"", -1)).hasSize(HomeController.PAGE_SIZE + 1);
        assertThat(second.split("class=\"scenario-card\"", -1)).hasSize(30 - HomeController.PAGE_SIZE + 1);
    }

    @Test
    void home_listsTheLoadedSamples_withDescriptionVerdictPlanAndDownloads() throws Exception {
        String html = mvc.perform(get("/"))
                .andExpect(status().isOk())
                .andReturn()
                .getResponse()
                .getContentAsString();

        assertThat(samples.all()).hasSizeGreaterThanOrEqualTo(4);
        for (SampleLibrary.Sample s : samples.all()) {
            assertThat(html).contains("data-file=\"" + s.file() + "\"");
            assertThat(html).contains(HtmlUtils.htmlEscape(s.name()));
        }
        assertThat(html).contains("Valid").contains("<svg").contains("href=\"/s/");
        assertThat(html).contains("Simulation results do not certify safety");
        assertThat(html).contains("hx-headers=");
    }

    @Test
    void search_withHtmxHeader_answersOnlyTheListFragment() throws Exception {
        String html = mvc.perform(get("/").param("q", "storage").header("HX-Request", "true"))
                .andExpect(status().isOk())
                .andReturn()
                .getResponse()
                .getContentAsString();

        assertThat(html).startsWith("<div id=\"scenario-list\"").doesNotContain("<html");
        assertThat(html).contains("Storage hall").doesNotContain("Clinic corridor");
    }

    @Test
    void newFromSample_createsAScenario_andOpensItsEditLink() throws Exception {
        mvc.perform(post("/scenarios/from-sample")
                        .param("sample", "office-carpet-stall.json")
                        .param("author", "Ana")
                        .with(csrf()))
                .andExpect(status().is3xxRedirection())
                .andExpect(redirectedUrlPattern("/s/*"));
    }

    @Test
    void importValidFile_createsAScenario() throws Exception {
        MockMultipartFile file = new MockMultipartFile(
                "file",
                "mine.json",
                "application/json",
                Scenarios.corridor().withName("Imported one").json().getBytes(StandardCharsets.UTF_8));

        mvc.perform(multipart("/scenarios/import")
                        .file(file)
                        .param("author", "Ana")
                        .with(csrf()))
                .andExpect(status().is3xxRedirection())
                .andExpect(redirectedUrlPattern("/s/*"));
        assertThat(mvc.perform(get("/").param("q", "Imported one"))
                        .andReturn()
                        .getResponse()
                        .getContentAsString())
                .contains("Imported one");
    }

    @Test
    void importInvalidFile_isRefusedNamingTheProblem_andStoresNothing() throws Exception {
        long before = scenarios.count();
        MockMultipartFile file = new MockMultipartFile(
                "file",
                "bad.json",
                "application/json",
                "{\"format\": \"driftlab-scenario/1\"}".getBytes(StandardCharsets.UTF_8));

        String html = mvc.perform(multipart("/scenarios/import").file(file).with(csrf()))
                .andExpect(status().isUnprocessableContent())
                .andReturn()
                .getResponse()
                .getContentAsString();

        assertThat(html).contains("Not imported; nothing was stored").contains("<code>name</code>");
        assertThat(scenarios.count()).isEqualTo(before);
    }

    @Test
    void sampleFile_isDownloadable() throws Exception {
        mvc.perform(get("/samples/storage-hall-kidnap.json"))
                .andExpect(status().isOk())
                .andExpect(header().string("Content-Disposition", "attachment; filename=\"storage-hall-kidnap.json\""))
                .andExpect(
                        content().string(org.hamcrest.Matchers.containsString("\"format\": \"driftlab-scenario/1\"")));
    }

    @Test
    void unknownSample_is404() throws Exception {
        mvc.perform(get("/samples/nope.json")).andExpect(status().isNotFound());
    }
}
