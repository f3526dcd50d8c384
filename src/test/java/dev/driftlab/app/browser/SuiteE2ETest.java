package dev.driftlab.app.browser;

import static org.assertj.core.api.Assertions.assertThat;

import java.time.Duration;
import java.util.List;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;
import org.openqa.selenium.By;
import org.openqa.selenium.WebDriver;
import org.openqa.selenium.WebElement;
import org.openqa.selenium.support.ui.WebDriverWait;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.test.web.server.LocalServerPort;

/**
 * A suite built in the browser from the samples: created from the home page, run with its
 * progress bar, its matrix read, and a cell followed to that cell's batch report.
 */
@Tag("e2e")
@SpringBootTest(webEnvironment = SpringBootTest.WebEnvironment.RANDOM_PORT)
class SuiteE2ETest {

    @LocalServerPort
    int port;

    private WebDriver browser;

    @BeforeEach
    void open() {
        browser = Browser.open(1280, 900);
    }

    @AfterEach
    void close() {
        if (browser != null) {
            browser.quit();
        }
    }

    @Test
    void suiteOfTwoSamples_builtRunAndRead_cellLeadsToItsBatchReport() {
        String base = "http://localhost:" + port;
        browser.get(base + "/");
        browser.findElement(By.id("new-suite")).click();
        browser.findElement(By.id("suite-name")).sendKeys("Browser suite");
        WebElement seeds = browser.findElement(By.id("suite-seeds"));
        seeds.clear();
        seeds.sendKeys("2");
        // pick two samples by their labels, as a keyboard or screen-reader user finds them
        List<WebElement> labels = browser.findElements(By.cssSelector("label[for^='sample-']"));
        int picked = 0;
        for (WebElement l : labels) {
            if (l.getText().contains("Open office") || l.getText().contains("Clinic corridor")) {
                browser.findElement(By.id(l.getDomAttribute("for"))).click();
                picked++;
            }
        }
        assertThat(picked).isEqualTo(2);
        browser.findElement(By.id("create-suite")).click();

        assertThat(browser.findElement(By.tagName("h1")).getText()).isEqualTo("Suite: Browser suite");
        assertThat(browser.findElements(By.cssSelector("table.grid tbody tr th a")))
                .hasSize(2);
        browser.findElement(By.id("run-suite")).click();

        // the progress bar is a real <progress> while the cells run; the page polls until the report
        assertThat(browser.findElement(By.id("suite-progress")).getTagName()).isEqualTo("progress");
        new WebDriverWait(browser, Duration.ofMinutes(3))
                .until(d -> !d.findElements(By.id("suite-matrix")).isEmpty());
        String verdict = browser.findElement(By.id("suite-verdict")).getText();
        assertThat(verdict).isIn("pass", "fail", "ended early", "not exercised", "incomplete");

        List<WebElement> rows = browser.findElements(By.cssSelector("#suite-matrix tbody tr"));
        assertThat(rows).hasSize(2);
        List<String> names = rows.stream()
                .map(r -> r.findElement(By.cssSelector("th span")).getText())
                .toList();
        assertThat(names).anyMatch(n -> n.contains("Open office")).anyMatch(n -> n.contains("Clinic corridor"));
        for (WebElement r : rows) {
            // every gate of the cell reads as a word (pass or fail), not a colour
            assertThat(r.findElement(By.cssSelector("td")).getText()).containsAnyOf("pass", "fail");
        }
        WebElement cell = rows.get(0).findElement(By.cssSelector("a.cell-link"));
        assertThat(cell.getText()).startsWith("Batch report: " + names.get(0) + ", as is");
        cell.click();
        new WebDriverWait(browser, Duration.ofSeconds(60))
                .until(d -> d.getCurrentUrl().contains("/batch-report"));
        // the cell's batch report is that scenario's report, of that cell's run alone
        assertThat(browser.getTitle()).isEqualTo("Localization report: " + names.get(0));
    }
}
