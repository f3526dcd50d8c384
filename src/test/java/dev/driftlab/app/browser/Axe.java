package dev.driftlab.app.browser;

import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.util.List;
import org.openqa.selenium.JavascriptExecutor;
import org.openqa.selenium.WebDriver;

/**
 * Runs the axe-core accessibility engine (Deque Systems, https://github.com/dequelabs/axe-core, the
 * copy bundled in its Selenium artifact) on the page open in a browser, with the WCAG 2.0 and 2.1
 * A and AA rules.
 */
public final class Axe {

    private static String script;

    private Axe() {}

    /**
     * The violations on the current page, one line each: rule, impact and the first offending
     * element; empty when axe finds none.
     */
    @SuppressWarnings("unchecked")
    public static List<String> violations(WebDriver browser) {
        JavascriptExecutor js = (JavascriptExecutor) browser;
        js.executeScript(script());
        Object out = js.executeAsyncScript("const done = arguments[arguments.length - 1];"
                + "axe.run(document, {runOnly: {type: 'tag', values: ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa']}})"
                + ".then(r => done(r.violations.map(v => v.id + ' (' + v.impact + '): ' + v.help + ' at '"
                + " + (v.nodes.length ? v.nodes[0].target.join(' ') : '?'))))"
                + ".catch(e => done(['axe did not run: ' + e]));");
        return (List<String>) out;
    }

    /** The violations axe rates serious or critical, the ones no page may have. */
    public static List<String> serious(WebDriver browser) {
        return violations(browser).stream()
                .filter(v -> v.contains("(serious)") || v.contains("(critical)") || v.startsWith("axe did not run"))
                .toList();
    }

    private static synchronized String script() {
        if (script == null) {
            try (InputStream in = Axe.class.getResourceAsStream("/axe.min.js")) {
                if (in == null) {
                    throw new IllegalStateException("axe.min.js is not on the test class path");
                }
                script = new String(in.readAllBytes(), StandardCharsets.UTF_8);
            } catch (IOException e) {
                throw new UncheckedIOException(e);
            }
        }
        return script;
    }
}
