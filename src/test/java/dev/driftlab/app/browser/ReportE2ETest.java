package dev.driftlab.app.browser;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.net.http.HttpResponse;
import java.util.List;
import java.util.Locale;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
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
import tools.jackson.databind.JsonNode;

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
                .contains("recovers")
                .contains("no injection")
                .contains("Paired comparison")
                .contains("Simulation results do not certify safety");
        List<WebElement> episodes = browser.findElements(By.cssSelector("tr.episode"));
        assertThat(episodes).hasSize(2);
        assertThat(episodes.get(0).getText()).contains("base").contains("85");
        // The helper reproduces the published worked values of the Wilson interval before it
        // checks the page: 95/100 -> [0.8882, 0.9785], 18/20 -> [0.6990, 0.9721] (formula of E. B.
        // Wilson, "Probable inference, the law of succession, and statistical inference", JASA
        // 22(158), 1927, evaluated by hand and rounded to 4 places).
        assertThat(wilson(95, 100)[0]).isCloseTo(0.8882, within(5e-5));
        assertThat(wilson(95, 100)[1]).isCloseTo(0.9785, within(5e-5));
        assertThat(wilson(18, 20)[0]).isCloseTo(0.6990, within(5e-5));
        assertThat(wilson(18, 20)[1]).isCloseTo(0.9721, within(5e-5));
        // each variant's recovery share carries the Wilson interval of its own count
        for (String variant : List.of("base", "no injection")) {
            WebElement row = browser.findElements(By.cssSelector("tr")).stream()
                    .filter(tr -> {
                        List<WebElement> tds = tr.findElements(By.tagName("td"));
                        return tds.size() > 2
                                && tds.get(0).getText().equals(variant)
                                && tds.get(2).getText().contains(" within ");
                    })
                    .findFirst()
                    .orElseThrow(() -> new AssertionError("no variants row for " + variant));
            String cell = row.findElements(By.tagName("td")).get(2).getText();
            Matcher m = Pattern.compile("(\\d+) / (\\d+) within .* \\(.* %, (.+ % to .+ %)\\)")
                    .matcher(cell);
            assertThat(m.matches()).as("recovery cell of %s: %s", variant, cell).isTrue();
            int k = Integer.parseInt(m.group(1));
            int n = Integer.parseInt(m.group(2));
            assertThat(n).isEqualTo(1); // one seed
            assertThat(m.group(3)).as(variant).isEqualTo(intervalText(k, n));
        }
        // every gate verdict: its interval is the Wilson interval of its passing count, and the
        // verdict text says what the row's class says (two gates and the default route-completed gate,
        // for two variants)
        List<WebElement> verdicts = browser.findElements(By.cssSelector("table.gates tr.pass, table.gates tr.fail"));
        assertThat(verdicts).hasSize(6);
        for (WebElement row : verdicts) {
            List<WebElement> tds = row.findElements(By.tagName("td"));
            // passing / exercised / all trials; the interval is over the exercised ones
            Matcher m = Pattern.compile("(\\d+) / (\\d+) / \\d+ \\(.*\\)")
                    .matcher(tds.get(3).getText());
            assertThat(m.matches()).as(tds.get(3).getText()).isTrue();
            assertThat(tds.get(4).getText())
                    .isEqualTo(intervalText(Integer.parseInt(m.group(1)), Integer.parseInt(m.group(2))));
            boolean pass = row.getDomAttribute("class").equals("pass");
            assertThat(tds.get(5).getText()).startsWith(pass ? "\u2713 pass" : "\u2717 fail");
        }
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
        // the episode's cells say exactly what the run's result document holds
        JsonNode kidnap = KidnapRuns.json("http://localhost:" + port + "/api/r/" + runs.base() + "/result")
                .get("trials")
                .get(0)
                .get("kidnaps")
                .get(0);
        assertThat(kidnap.get("at").asDouble()).isEqualTo(85.0);
        List<String> cells = episodes.get(0).findElements(By.tagName("td")).stream()
                .map(WebElement::getText)
                .toList();
        assertThat(cells)
                .containsExactly(
                        "85.00 s",
                        kidnap.get("noticedAfter").isNull()
                                ? "not noticed"
                                : seconds(kidnap.get("noticedAfter").asDouble()),
                        kidnap.get("recovered").asBoolean()
                                ? seconds(kidnap.get("recoveredAfter").asDouble())
                                : "not recovered");
        assertThat(browser.findElement(By.linkText("Permalink")).getDomAttribute("href"))
                .isEqualTo("/r/" + runs.base() + "/report");
        assertThat(browser.getPageSource()).contains("Key frames").contains("The run over time");
        Browser.screenshot(browser, "report-run");
    }

    /** Wilson score interval at 95 % (z = 1.959964), {lower, upper}. */
    private static double[] wilson(int k, int n) {
        double z = 1.959964;
        double p = (double) k / n;
        double d = 1 + z * z / n;
        double c = p + z * z / (2 * n);
        double h = z * Math.sqrt(p * (1 - p) / n + z * z / (4.0 * n * n));
        return new double[] {Math.max(0, (c - h) / d), Math.min(1, (c + h) / d)};
    }

    /** The interval as the report prints it, "20.7 % to 100.0 %". */
    private static String intervalText(int k, int n) {
        double[] ci = wilson(k, n);
        return String.format(Locale.ROOT, "%.1f %% to %.1f %%", ci[0] * 100, ci[1] * 100);
    }

    /** Seconds as the report prints them. */
    private static String seconds(double v) {
        return String.format(Locale.ROOT, Math.abs(v) >= 100 ? "%.0f s" : "%.2f s", v);
    }
}
