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

        assertThat(html).startsWith("<ul id=\"scenario-list\"").doesNotContain("<html");
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
