package dev.driftlab.app.browser;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.file.Path;
import java.time.Duration;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;
import org.openqa.selenium.By;
import org.openqa.selenium.WebDriver;
import org.openqa.selenium.WebElement;
import org.openqa.selenium.support.ui.Select;
import org.openqa.selenium.support.ui.WebDriverWait;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.test.web.server.LocalServerPort;

/**
 * The example dead-reckoning localizer on a team server, as its users meet it: the administrator
 * lists it by name; in the browser the run form offers it, a run of the kidnap sample judges it,
 * the batch report names it and shows it failing the recovery gate (dead reckoning cannot notice
 * being carried), the player says the particles were not reported instead of showing none, and
 * the workers page shows which process offers it.
 */
@Tag("e2e")
@SpringBootTest(
        webEnvironment = SpringBootTest.WebEnvironment.RANDOM_PORT,
        properties = {
            "driftlab.localizers.dead-reckoning.command='${java.home}/bin/java'"
                    + " sample-projects/localizers/DeadReckoning.java",
            "driftlab.localizers.dead-reckoning.description=odometry only"
        })
class OutsideLocalizerE2ETest {

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
    void runFormOffersTheListedLocalizer_andItsReportPlayerAndWorkersPageShowIt() throws Exception {
        String base = "http://localhost:" + port;
        String edit = KidnapRuns.post(base + "/api/samples/storage-hall-kidnap.json/copy", "")
                .get("editToken")
                .asString();
        browser.get(base + "/s/" + edit);

        Select localizer = new Select(browser.findElement(By.id("localizer")));
        assertThat(localizer.getOptions())
                .extracting(WebElement::getText)
                .containsExactly("built-in Monte Carlo localizer", "outside: dead-reckoning");
        // the command stays on the server
        assertThat(browser.getPageSource()).doesNotContain("DeadReckoning.java");
        assertThat(Axe.serious(browser))
                .as("axe-core on the scenario page with the run form")
                .isEmpty();
        localizer.selectByVisibleText("outside: dead-reckoning");
        WebElement seeds = browser.findElement(By.id("seedCount"));
        seeds.clear();
        seeds.sendKeys("1");
        browser.findElement(By.cssSelector("#runs input[name=recordFrames]")).click();
        for (WebElement v : browser.findElements(By.cssSelector("#runs input[name=variants]"))) {
            if (!v.isSelected()) {
                v.click();
            }
        }
        browser.findElement(By.cssSelector("#runs form button[type=submit]")).click();

        // both variants' runs, named with their localizer, until their results are there
        new WebDriverWait(browser, Duration.ofMinutes(4))
                .until(d -> d.findElements(By.xpath("//div[@id='runs']//a[normalize-space()='batch']"))
                                .size()
                        == 2);
        String runs = browser.findElement(By.id("runs")).getText();
        assertThat(runs).contains("base, localizer dead-reckoning").contains("no injection, localizer dead-reckoning");

        browser.findElement(By.xpath("//div[@id='runs']//a[normalize-space()='batch']"))
                .click();
        String report = browser.findElement(By.tagName("body")).getText();
        assertThat(report)
                .contains("dead-reckoning")
                .contains("Answer time per scan")
                .contains("Simulation results do not certify safety");
        // the recovery gate of the base variant fails, in words, not by colour alone
        WebElement recovers = browser.findElements(By.cssSelector("table.gates tbody tr")).stream()
                .filter(tr ->
                        tr.getText().startsWith("recovers") && tr.getText().contains("base"))
                .findFirst()
                .orElseThrow(() -> new AssertionError("no recovery gate row of base: " + report));
        assertThat(recovers.getText()).containsIgnoringCase("fail");
        assertThat(Axe.serious(browser)).as("axe-core on the batch report").isEmpty();
        Browser.screenshot(browser, "outside-localizer-report");

        // the player: the localizer sent no particles, and says so
        browser.get(base + "/s/" + edit);
        browser.findElement(By.xpath("//div[@id='runs']//a[normalize-space()='player']"))
                .click();
        new WebDriverWait(browser, Duration.ofSeconds(60))
                .until(d -> "true".equals(d.findElement(By.id("player")).getDomAttribute("data-ready")));
        assertThat(browser.findElement(By.tagName("body")).getText()).contains("not reported by the localizer");

        // the workers page: this process offers it
        browser.get(base + "/workers");
        assertThat(browser.findElement(By.tagName("table")).getText()).contains("dead-reckoning");
        assertThat(Axe.serious(browser)).as("axe-core on the workers page").isEmpty();
        assertThat(Path.of("sample-projects/localizers/DeadReckoning.java")).exists();
    }
}
