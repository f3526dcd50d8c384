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
 * chromedriver, nothing downloaded. Both are looked up on the {@code PATH} ({@code chromium},
 * {@code chromedriver}), falling back to {@code /usr/bin}, the same way {@code .ci/run} looks for
 * them. Where either is missing the tests fail, naming what to install; a developer who means to
 * leave the browser tests out passes {@code -Ddriftlab.skipBrowserTests=true}, and only then do
 * they skip.
 */
public final class Browser {

    /** System property that, set to {@code true}, skips the browser tests instead of failing them. */
    public static final String SKIP_PROPERTY = "driftlab.skipBrowserTests";

    // before CHROMIUM and CHROMEDRIVER: static fields start in file order, and find() reads it
    private static final Path FALLBACK_DIR = Path.of("/usr/bin");

    /** Where the system browser and its driver live (PATH first, then /usr/bin). */
    public static final Path CHROMIUM = find("chromium", System.getenv("PATH"));

    public static final Path CHROMEDRIVER = find("chromedriver", System.getenv("PATH"));

    /** Screenshots taken by browser tests land here (a test artefact). */
    public static final Path SHOTS = Path.of("target", "e2e-screenshots");

    private Browser() {}

    /**
     * The first executable {@code name} in the directories of {@code path} (a {@code PATH} value),
     * else {@code /usr/bin/name}, which may not exist.
     */
    static Path find(String name, String path) {
        if (path != null) {
            for (String dir : path.split(java.io.File.pathSeparator)) {
                if (dir.isEmpty()) {
                    continue;
                }
                Path candidate = Path.of(dir, name);
                if (Files.isRegularFile(candidate) && Files.isExecutable(candidate)) {
                    return candidate;
                }
            }
        }
        return FALLBACK_DIR.resolve(name);
    }

    /**
     * Fails when the browser is not installed. With {@code -Ddriftlab.skipBrowserTests=true} the
     * browser tests skip instead, installed or not.
     */
    public static void requireInstalled() {
        if (Boolean.getBoolean(SKIP_PROPERTY)) {
            System.out.println("SKIPPED browser test: -D" + SKIP_PROPERTY + "=true");
            Assumptions.abort("-D" + SKIP_PROPERTY + "=true");
        }
        if (!Files.isExecutable(CHROMIUM) || !Files.isExecutable(CHROMEDRIVER)) {
            throw new IllegalStateException("browser tests need chromium and chromedriver on the PATH or in /usr/bin"
                    + " (looked at " + CHROMIUM + " and " + CHROMEDRIVER + "): apt-get install chromium"
                    + " chromium-driver (.ci/run does), or pass -D" + SKIP_PROPERTY + "=true to skip them");
        }
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
