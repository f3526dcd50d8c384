package dev.driftlab.app.scenarios.web;

import static org.assertj.core.api.Assertions.assertThat;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.get;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.content;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.header;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.status;

import dev.driftlab.app.scenarios.SampleLibrary;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.boot.webmvc.test.autoconfigure.WebMvcTest;
import org.springframework.context.annotation.Import;
import org.springframework.test.web.servlet.MockMvc;

@WebMvcTest(HomeController.class)
@Import(SampleLibrary.class)
class HomeControllerTest {

    @Autowired
    MockMvc mvc;

    @Autowired
    SampleLibrary samples;

    @Test
    void home_listsEverySample_withDescriptionVerdictAndPlan() throws Exception {
        String html = mvc.perform(get("/"))
                .andExpect(status().isOk())
                .andReturn()
                .getResponse()
                .getContentAsString();

        assertThat(samples.all()).hasSizeGreaterThanOrEqualTo(4);
        for (SampleLibrary.Sample s : samples.all()) {
            assertThat(html).contains("data-file=\"" + s.file() + "\"");
            assertThat(html).contains(org.springframework.web.util.HtmlUtils.htmlEscape(s.name()));
        }
        assertThat(html).contains("Valid");
        assertThat(countOf(html, "<svg")).isEqualTo(samples.all().size());
        assertThat(html).contains("Simulation results do not certify safety");
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

    private static int countOf(String s, String part) {
        int n = 0;
        for (int i = s.indexOf(part); i >= 0; i = s.indexOf(part, i + 1)) {
            n++;
        }
        return n;
    }
}
