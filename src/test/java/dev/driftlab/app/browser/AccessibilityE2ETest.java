package dev.driftlab.app.browser;

import static org.assertj.core.api.Assertions.assertThat;

import java.time.Duration;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;
import org.openqa.selenium.By;
import org.openqa.selenium.WebDriver;
import org.openqa.selenium.support.ui.WebDriverWait;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.test.web.server.LocalServerPort;

/**
 * axe-core (WCAG 2.1 A and AA rules) on every page of the app: none may have a serious or
 * critical violation. The pages are listed here so that a new page is added here too, the API page
 * among them (our own list of the OpenAPI document's operations, which replaced a bundled viewer
 * that failed button-name, label, select-name, nested-interactive and color-contrast).
 */
@Tag("e2e")
@SpringBootTest(webEnvironment = SpringBootTest.WebEnvironment.RANDOM_PORT)
class AccessibilityE2ETest {

    @LocalServerPort
    int port;

    private WebDriver browser;

    @AfterEach
    void close() {
        if (browser != null) {
            browser.quit();
        }
    }

    @Test
    void everyPage_hasNoSeriousOrCriticalAxeViolation() throws Exception {
        String base = "http://localhost:" + port;
        KidnapRuns.Pair runs = KidnapRuns.on(port);
        String edit = KidnapRuns.post(base + "/api/samples/storage-hall-kidnap.json/copy", "")
                .get("editToken")
                .asString();
        String doc = KidnapRuns.get(base + "/s/" + edit + "/export")
                .replaceFirst("\"name\"\\s*:\\s*\"", "\"name\": \"Second revision of ");
        KidnapRuns.post(base + "/api/s/" + edit + "/revisions?base=1&message=renamed", doc);
        // twelve seeds are more than one unit holds, so the run page shows its table of units
        // (checked while it runs, so a unit has a process and a progress bar part filled)
        long units = KidnapRuns.post(
                        base + "/api/s/" + edit + "/batches",
                        "{\"variants\":[\"base\"],\"firstSeed\":100,\"seedCount\":12}")
                .get("runs")
                .get(0)
                .get("id")
                .asLong();
        waitForUnits(base + "/s/" + edit + "/runs/" + units);
        // a suite of one sample with a profile, run to its report
        String suiteEdit = KidnapRuns.post(
                        base + "/api/suites",
                        "{\"name\": \"Checked suite\", \"seeds\": 1, \"scenarios\": [{\"link\": \"" + edit
                                + "\"}], \"profiles\": [{\"format\": \"driftlab-profile/1\", \"name\":"
                                + " \"fewer\", \"localizer\": {\"particles\": {\"count\": 100}}}]}")
                .get("editLink")
                .asString();
        String suiteRun = KidnapRuns.post(base + "/api/suites/" + suiteEdit + "/runs", "")
                .get("link")
                .asString();
        waitForSuiteRun(base + "/api/suite-runs/" + suiteRun);

        Map<String, String> pages = new LinkedHashMap<>();
        pages.put("home", "/");
        pages.put("scenario", "/s/" + edit);
        pages.put("history", "/s/" + edit + "/history");
        pages.put("revision compare", "/s/" + edit + "/compare?from=1&to=2");
        pages.put("editor", "/s/" + edit + "/editor");
        pages.put("run", "/r/" + runs.base());
        pages.put("player", "/r/" + runs.base() + "/play");
        pages.put("run report", "/r/" + runs.base() + "/report");
        pages.put("batch report", "/r/" + runs.base() + "/batch-report");
        pages.put("run compare report", "/r/" + runs.base() + "/compare?with=" + runs.other());
        pages.put("API", "/api-docs.html");
        pages.put("run with units", "/s/" + edit + "/runs/" + units);
        pages.put("workers", "/workers");
        pages.put("new suite", "/suites/new");
        pages.put("suite (edit link)", "/suites/" + suiteEdit);
        pages.put("suite run report", "/suite-runs/" + suiteRun);

        browser = Browser.open(1280, 900);
        List<String> found = new ArrayList<>();
        for (Map.Entry<String, String> page : pages.entrySet()) {
            browser.get(base + page.getValue());
            settle(page.getKey());
            for (String v : Axe.serious(browser)) {
                found.add(page.getKey() + " " + page.getValue() + ": " + v);
            }
        }
        KidnapRuns.post(base + "/api/s/" + edit + "/runs/" + units + "/cancel", "");
        assertThat(found).as("serious or critical axe violations").isEmpty();
    }

    /** Waits until a suite run has its report. */
    private static void waitForSuiteRun(String url) throws Exception {
        long deadline = System.nanoTime() + Duration.ofMinutes(3).toNanos();
        while (!KidnapRuns.json(url).get("state").asString().equals("finished")) {
            if (System.nanoTime() > deadline) {
                throw new IllegalStateException("suite run " + url + " did not finish within 3 minutes");
            }
            Thread.sleep(200);
        }
    }

    /** Waits until the run's page shows a unit taken by a process. */
    private static void waitForUnits(String url) throws Exception {
        long deadline = System.nanoTime() + Duration.ofMinutes(2).toNanos();
        while (!KidnapRuns.get(url).contains("<td>running</td>")) {
            if (System.nanoTime() > deadline) {
                throw new IllegalStateException("no unit of " + url + " started within 2 minutes");
            }
            Thread.sleep(100);
        }
    }

    /** The script-built pages are checked once they are built. */
    private void settle(String page) {
        WebDriverWait wait = new WebDriverWait(browser, Duration.ofSeconds(60));
        if (page.equals("editor")) {
            wait.until(d -> "true".equals(d.findElement(By.id("editor")).getDomAttribute("data-ready")));
        } else if (page.equals("workers")) {
            wait.until(
                    d -> !d.findElements(By.cssSelector("#workers-board table")).isEmpty());
        } else if (page.equals("player")) {
            wait.until(d -> "true".equals(d.findElement(By.id("player")).getDomAttribute("data-ready"))
                    && !d.findElements(By.cssSelector(".plot-data")).isEmpty());
        }
    }
}
