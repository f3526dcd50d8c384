package dev.driftlab.app.browser;

import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import org.junit.jupiter.api.Assumptions;
import org.openqa.selenium.OutputType;
import org.openqa.selenium.TakesScreenshot;
import org.openqa.selenium.WebDriver;
import org.openqa.selenium.chrome.ChromeDriver;
import org.openqa.selenium.chrome.ChromeDriverService;
import org.openqa.selenium.chrome.ChromeOptions;

/**
 * The real browser for end-to-end tests: Debian's headless Chromium driven through its own
 * chromedriver, nothing downloaded. Where Chromium is missing the tests skip with a printed reason,
 * except in CI ({@code CI=true}), where a missing browser fails them.
 */
public final class Browser {

    /** Where the system browser and its driver live. */
    public static final Path CHROMIUM = Path.of("/usr/bin/chromium");

    public static final Path CHROMEDRIVER = Path.of("/usr/bin/chromedriver");

    /** Screenshots taken by browser tests land here (a test artefact). */
    public static final Path SHOTS = Path.of("target", "e2e-screenshots");

    private Browser() {}

    /** Skips (or fails in CI) when the browser is not installed. */
    public static void requireInstalled() {
        boolean present = Files.isExecutable(CHROMIUM) && Files.isExecutable(CHROMEDRIVER);
        if (!present && "true".equalsIgnoreCase(System.getenv("CI"))) {
            throw new IllegalStateException("browser tests need " + CHROMIUM + " and " + CHROMEDRIVER
                    + " (apt-get install chromium chromium-driver); .ci/run installs them");
        }
        if (!present) {
            System.out.println("SKIPPED browser test: " + CHROMIUM + " or " + CHROMEDRIVER + " is not installed");
        }
        Assumptions.assumeTrue(present, "Chromium is not installed");
    }

    /** A fresh headless browser with its own empty profile (a fresh browser context). */
    public static WebDriver open(int width, int height) {
        requireInstalled();
        ChromeOptions options = new ChromeOptions();
        options.setBinary(CHROMIUM.toFile());
        options.addArguments(
                "--headless=new",
                "--no-sandbox",
                "--disable-gpu",
                "--disable-quic",
                "--no-first-run",
                "--disable-background-networking",
                "--disable-component-update",
                "--disable-sync",
                "--disable-dev-shm-usage",
                "--window-size=" + width + "," + height);
        ChromeDriverService service = new ChromeDriverService.Builder()
                .usingDriverExecutable(CHROMEDRIVER.toFile())
                .usingAnyFreePort()
                .build();
        WebDriver driver = new ChromeDriver(service, options);
        driver.manage().timeouts().pageLoadTimeout(Duration.ofSeconds(30));
        driver.manage().timeouts().scriptTimeout(Duration.ofSeconds(30));
        return driver;
    }

    /** Saves a screenshot under target/e2e-screenshots and returns its path. */
    public static Path screenshot(WebDriver driver, String name) {
        try {
            Files.createDirectories(SHOTS);
            Path file = SHOTS.resolve(name + ".png");
            Files.write(file, ((TakesScreenshot) driver).getScreenshotAs(OutputType.BYTES));
            return file;
        } catch (java.io.IOException e) {
            throw new java.io.UncheckedIOException(e);
        }
    }
}
