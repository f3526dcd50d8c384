package dev.driftlab.app.browser;

import static org.assertj.core.api.Assertions.assertThat;

import java.net.http.HttpResponse;
import java.util.List;
import org.apache.pdfbox.Loader;
import org.apache.pdfbox.pdmodel.PDDocument;
import org.apache.pdfbox.text.PDFTextStripper;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;
import org.openqa.selenium.By;
import org.openqa.selenium.WebDriver;
import org.openqa.selenium.WebElement;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.test.web.server.LocalServerPort;

/**
 * The recovery report of the sample kidnap batch in a real browser: the episode, the Wilson
 * interval, the gate verdicts, the key frames; then the PDF download has the same text.
 */
@Tag("e2e")
@SpringBootTest(webEnvironment = SpringBootTest.WebEnvironment.RANDOM_PORT)
class ReportE2ETest {

    @LocalServerPort
    int port;

    private WebDriver browser;

    @BeforeEach
    void open() {
        browser = Browser.open(1280, 800);
    }

    @AfterEach
    void close() {
        if (browser != null) {
            browser.quit();
        }
    }

    @Test
    void batchReport_showsEpisodesIntervalVerdicts_andThePdfSaysTheSame() throws Exception {
        KidnapRuns.Pair runs = KidnapRuns.on(port);
        String base = "http://localhost:" + port;
        browser.get(base + "/r/" + runs.base() + "/play");
        browser.findElement(By.linkText("Batch report")).click();

        assertThat(browser.getCurrentUrl()).endsWith("/r/" + runs.base() + "/batch-report");
        String text = browser.findElement(By.tagName("body")).getText();
        assertThat(text)
                .contains("Kidnapped-robot recovery")
                .contains("Wilson")
                .contains("recovers")
                .contains("no injection")
                .contains("Paired comparison")
                .contains("Simulation results do not certify safety");
        List<WebElement> episodes = browser.findElements(By.cssSelector("tr.episode"));
        assertThat(episodes).hasSize(2);
        assertThat(episodes.get(0).getText()).contains("base").contains("85");
        assertThat(browser.findElements(By.cssSelector("td")).stream()
                        .map(WebElement::getText)
                        .anyMatch(t -> t.contains("pass") || t.contains("fail")))
                .isTrue();
        assertThat(browser.findElements(By.cssSelector("figure svg, .keyframes svg"))
                        .size())
                .isGreaterThanOrEqualTo(3);
        Browser.screenshot(browser, "report-batch");

        String pdfHref = browser.findElement(By.linkText("Download PDF")).getDomAttribute("href");
        HttpResponse<byte[]> pdf = KidnapRuns.getBytes(base + pdfHref);
        assertThat(pdf.statusCode()).isEqualTo(200);
        assertThat(pdf.headers().firstValue("Content-Type")).hasValue("application/pdf");
        try (PDDocument doc = Loader.loadPDF(pdf.body())) {
            String pdfText = new PDFTextStripper().getText(doc).replaceAll("\\s+", " ");
            assertThat(pdfText)
                    .contains("Storage hall")
                    .contains("Kidnapped-robot recovery")
                    .contains("recovers")
                    .contains("Simulation results do not certify safety");
        }
    }

    @Test
    void runReport_hasTheKidnapEpisodeAndAPermalink() throws Exception {
        KidnapRuns.Pair runs = KidnapRuns.on(port);
        browser.get("http://localhost:" + port + "/r/" + runs.base() + "/report");
        List<WebElement> episodes = browser.findElements(By.cssSelector("tr.episode"));
        assertThat(episodes).hasSize(1);
        assertThat(episodes.get(0).getText()).contains("85").containsAnyOf("recovered", " s");
        assertThat(browser.findElement(By.linkText("Permalink")).getDomAttribute("href"))
                .isEqualTo("/r/" + runs.base() + "/report");
        assertThat(browser.getPageSource()).contains("Key frames").contains("The run over time");
        Browser.screenshot(browser, "report-run");
    }
}
