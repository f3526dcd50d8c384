package dev.driftlab.app.browser;

import static org.assertj.core.api.Assertions.assertThat;

import java.time.Duration;
import java.util.List;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;
import org.openqa.selenium.By;
import org.openqa.selenium.JavascriptExecutor;
import org.openqa.selenium.Keys;
import org.openqa.selenium.WebDriver;
import org.openqa.selenium.WebElement;
import org.openqa.selenium.interactions.Actions;
import org.openqa.selenium.support.ui.Select;
import org.openqa.selenium.support.ui.WebDriverWait;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.test.web.server.LocalServerPort;
import tools.jackson.databind.JsonNode;

/**
 * The run player in a real browser on the sample kidnap scenario: stepping over the kidnap shows
 * the true robot jump while the estimate stays, and playing on reaches the recovery.
 */
@Tag("e2e")
@SpringBootTest(webEnvironment = SpringBootTest.WebEnvironment.RANDOM_PORT)
class PlayerE2ETest {

    /** Okabe-Ito bluish green, the true robot's fill in view.js. */
    private static final int[] TRUTH = {0, 158, 115};

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
    void kidnap_truthJumps_estimateStays_thenRecovers() throws Exception {
        KidnapRuns.Pair runs = KidnapRuns.on(port);
        String base = "http://localhost:" + port;
        JsonNode scene = KidnapRuns.json(base + "/api/r/" + runs.base() + "/scene");
        double kidnapAt = scene.get("kidnaps").get(0).get("at").asDouble();
        double recoveredAfter =
                scene.get("kidnaps").get(0).get("recoveredAfter").asDouble();
        int kidnapFrame = firstFrameAt(scene, kidnapAt);
        int recoveredFrame = firstFrameAt(scene, kidnapAt + recoveredAfter);

        browser.get(base + "/r/" + runs.base() + "/play");
        waitReady();
        WebElement kidnapMark = browser.findElements(By.cssSelector("#mark-list button")).stream()
                .filter(b -> b.getText().contains("kidnap"))
                .findFirst()
                .orElseThrow();
        kidnapMark.click();
        waitReady();
        assertThat(frame()).isEqualTo(kidnapFrame);

        // the frames either side of the kidnap: the largest truth jump among them is the kidnap
        press(Keys.ARROW_LEFT);
        press(Keys.ARROW_LEFT);
        double bestJump = 0;
        double estimateMove = Double.NaN;
        int[] truthBefore = null;
        int[] truthAfter = null;
        for (int step = 0; step < 4; step++) {
            double[] before = readout();
            int[] pxBefore = truthPixel();
            press(Keys.ARROW_RIGHT);
            double[] after = readout();
            double jump = Math.hypot(after[0] - before[0], after[1] - before[1]);
            if (jump > bestJump) {
                bestJump = jump;
                estimateMove = Math.hypot(after[2] - before[2], after[3] - before[3]);
                truthBefore = pxBefore;
                truthAfter = truthPixel();
            }
        }
        assertThat(bestJump).as("true pose jump at the kidnap, m").isGreaterThan(2.0);
        assertThat(estimateMove).as("estimate move at the kidnap, m").isLessThan(0.5);

        // step back onto the frame just after the jump and read the canvas
        browser.get(base + "/r/" + runs.base() + "/play");
        waitReady();
        seek(kidnapFrame);
        int[] here = truthPixel();
        if (here[0] != truthAfter[0] || here[1] != truthAfter[1]) {
            press(Keys.ARROW_RIGHT);
            here = truthPixel();
        }
        assertThat(colourAt(here)).as("true robot drawn where it was carried").isEqualTo(TRUTH);
        assertThat(colourAt(truthBefore))
                .as("nothing of the true robot left where it was")
                .isNotEqualTo(TRUTH);
        Browser.screenshot(browser, "player-kidnap");

        new Select(browser.findElement(By.id("speed"))).selectByValue("8");
        browser.findElement(By.id("play")).click();
        new WebDriverWait(browser, Duration.ofSeconds(90)).until(d -> frame() >= recoveredFrame);
        browser.findElement(By.id("play")).click();
        waitReady();
        double[] now = readout();
        assertThat(Math.hypot(now[2] - now[0], now[3] - now[1]))
                .as("position error after the recovery, m")
                .isLessThan(0.6);
        assertThat(browser.findElements(By.cssSelector(".plot .uplot"))).hasSize(4);
        Browser.screenshot(browser, "player-recovered");
    }

    @Test
    void compare_twoVariantsSideBySide_stayInStep() throws Exception {
        KidnapRuns.Pair runs = KidnapRuns.on(port);
        browser.get("http://localhost:" + port + "/r/" + runs.base() + "/play?with=" + runs.other());
        waitReady();
        assertThat(browser.findElements(By.cssSelector("canvas.view-canvas"))).hasSize(2);
        shiftRight();
        press(Keys.ARROW_RIGHT);
        waitReady();
        String a = browser.findElement(By.id("readout-a")).getDomAttribute("data-frame");
        String b = browser.findElement(By.id("readout-b")).getDomAttribute("data-frame");
        assertThat(a).isEqualTo("11").isEqualTo(b);
        // same seed, same simulated world: the true poses agree while the filters may not
        double[] ra = readout("readout-a");
        double[] rb = readout("readout-b");
        assertThat(ra[0]).isCloseTo(rb[0], org.assertj.core.data.Offset.offset(1e-3));
        assertThat(ra[1]).isCloseTo(rb[1], org.assertj.core.data.Offset.offset(1e-3));
        Browser.screenshot(browser, "player-compare");
    }

    @Test
    void verdict_isShownInWordsBesideTheState_andThePagesPassAxe() throws Exception {
        KidnapRuns.Pair runs = KidnapRuns.on(port);
        String base = "http://localhost:" + port;
        String verdict =
                KidnapRuns.json(base + "/api/r/" + runs.base()).get("verdict").asString();
        assertThat(verdict).isNotBlank();

        for (String page : List.of("/r/" + runs.base(), "/r/" + runs.base() + "/play")) {
            browser.get(base + page);
            if (page.endsWith("/play")) {
                waitReady();
            }
            WebElement shown = browser.findElement(By.cssSelector(".run-state .run-verdict"));
            WebElement word = shown.findElement(By.className("verdict-word"));
            assertThat(shown.getDomAttribute("data-verdict")).as(page).isEqualTo(verdict);
            assertThat(word.isDisplayed()).as(page).isTrue();
            assertThat(word.getText()).as(page).isEqualTo(verdict.replace('-', ' '));
            assertThat(shown.findElement(By.className("verdict-symbol")).getDomAttribute("aria-hidden"))
                    .isEqualTo("true");
            assertThat(Axe.violations(browser)).as("axe-core on " + page).isEmpty();
        }
        Browser.screenshot(browser, "player-verdict");

        // on the player page: named plots with their data, a spoken slider, buttons in words
        new WebDriverWait(browser, Duration.ofSeconds(30))
                .until(d -> d.findElements(By.cssSelector(".plot-data table")).size() == 4);
        for (WebElement c : browser.findElements(By.cssSelector(".plot canvas"))) {
            assertThat(c.getDomAttribute("role")).isEqualTo("img");
            assertThat(c.getDomAttribute("aria-label")).startsWith("Plot of ");
        }
        assertThat(browser.findElements(By.cssSelector(".plot-data tbody tr")).size())
                .isGreaterThan(4);
        assertThat(browser.findElement(By.id("scrub")).getDomAttribute("aria-valuetext"))
                .contains("frame 0 of");
        assertThat(browser.findElement(By.id("step-back")).getAccessibleName().strip())
                .isEqualTo("frame back");
        assertThat(browser.findElement(By.id("next-mark")).getAccessibleName().strip())
                .isEqualTo("next mark");
        // Space on a layer checkbox toggles the layer and leaves play alone
        WebElement particles = browser.findElement(By.cssSelector("[data-layer=particles]"));
        particles.sendKeys(Keys.SPACE);
        assertThat(particles.isSelected()).isFalse();
        assertThat(browser.findElement(By.id("player")).getDomAttribute("data-playing"))
                .isNotEqualTo("true");
    }

    private static int firstFrameAt(JsonNode scene, double t) {
        JsonNode times = scene.get("series").get("time");
        for (int i = 0; i < times.size(); i++) {
            if (times.get(i).asDouble() >= t - 1e-9) {
                return i;
            }
        }
        return times.size() - 1;
    }

    private void seek(int target) {
        press(Keys.HOME);
        // every key press waits for the player; the deadline catches a player that stops advancing
        long deadline = System.nanoTime() + Duration.ofMinutes(3).toNanos();
        while (frame() + 10 <= target) {
            failAfter(deadline, target);
            shiftRight();
        }
        while (frame() < target) {
            failAfter(deadline, target);
            press(Keys.ARROW_RIGHT);
        }
    }

    private void failAfter(long deadline, int target) {
        if (System.nanoTime() - deadline > 0) {
            throw new AssertionError("the player did not reach frame " + target + " within 3 minutes; at " + frame());
        }
    }

    private void shiftRight() {
        new Actions(browser)
                .keyDown(Keys.SHIFT)
                .sendKeys(Keys.ARROW_RIGHT)
                .keyUp(Keys.SHIFT)
                .perform();
        waitReady();
    }

    private void press(CharSequence keys) {
        new Actions(browser).sendKeys(keys).perform();
        waitReady();
    }

    private void waitReady() {
        new WebDriverWait(browser, Duration.ofSeconds(60))
                .until(d -> "true".equals(d.findElement(By.id("player")).getDomAttribute("data-ready")));
    }

    private int frame() {
        return Integer.parseInt(browser.findElement(By.id("player")).getDomAttribute("data-frame"));
    }

    private double[] readout() {
        return readout("readout-a");
    }

    private double[] readout(String id) {
        WebElement dl = browser.findElement(By.id(id));
        return new double[] {
            Double.parseDouble(dl.getDomAttribute("data-truth-x")),
            Double.parseDouble(dl.getDomAttribute("data-truth-y")),
            Double.parseDouble(dl.getDomAttribute("data-estimate-x")),
            Double.parseDouble(dl.getDomAttribute("data-estimate-y"))
        };
    }

    private int[] truthPixel() {
        String[] p = browser.findElement(By.id("view-a"))
                .getDomAttribute("data-truth-px")
                .split(",");
        return new int[] {Integer.parseInt(p[0]), Integer.parseInt(p[1])};
    }

    private int[] colourAt(int[] p) {
        @SuppressWarnings("unchecked")
        List<Number> rgb = (List<Number>) ((JavascriptExecutor) browser)
                .executeScript(
                        "const d = document.getElementById('view-a').getContext('2d')"
                                + ".getImageData(arguments[0], arguments[1], 1, 1).data; return [d[0], d[1], d[2]];",
                        p[0],
                        p[1]);
        return new int[] {
            rgb.get(0).intValue(), rgb.get(1).intValue(), rgb.get(2).intValue()
        };
    }
}
