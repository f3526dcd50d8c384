package dev.driftlab.report;

import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.util.Map;
import org.thymeleaf.TemplateEngine;
import org.thymeleaf.context.Context;
import org.thymeleaf.standard.StandardDialect;
import org.thymeleaf.templatemode.TemplateMode;
import org.thymeleaf.templateresolver.ClassLoaderTemplateResolver;

/**
 * Renders a report as one self-contained HTML page: styles inline, plots as inline SVG, no scripts
 * and no external files, so it can be attached to a CI build, mailed or printed. The markup is the
 * template {@code report-templates/report.html} (Thymeleaf used as a plain library, the same for
 * the command line and the web app), the styles {@code report-templates/report.css}, inlined at
 * render time; the figures come from {@link ReportView}.
 */
public final class HtmlReport {

    private static final String FOLDER = "report-templates/";

    private static final TemplateEngine ENGINE = engine();

    private static final String CSS = css();

    private HtmlReport() {}

    /** The page as text, every drawing in it (a file written to disk). */
    public static String render(Report r) {
        return render(r, DrawingBudget.NONE);
    }

    /**
     * The page as text, its drawings within the budget: each drawing's size is worked out before it
     * is drawn, and one over the budget is never drawn (a note stands in its place).
     */
    public static String render(Report r, DrawingBudget budget) {
        return page(r, false, budget);
    }

    /**
     * The same page as well-formed XHTML (void elements closed, XHTML namespace), for renderers
     * that read XML such as the PDF renderer.
     */
    public static String renderXhtml(Report r) {
        return renderXhtml(r, DrawingBudget.NONE);
    }

    /** The XHTML page with its drawings within the budget, as {@link #render(Report, DrawingBudget)}. */
    public static String renderXhtml(Report r, DrawingBudget budget) {
        return page(r, true, budget);
    }

    /**
     * The suite report as one self-contained page (template {@code report-templates/suite.html}):
     * the verdict and the matrix of scenarios and profiles first, then regressions, improvements
     * and the trend.
     */
    public static String render(SuiteReport r) {
        return suite(r, false);
    }

    /** The suite page as well-formed XHTML, for the PDF renderer. */
    public static String renderXhtml(SuiteReport r) {
        return suite(r, true);
    }

    private static String suite(SuiteReport r, boolean xhtml) {
        Context c = new Context(java.util.Locale.ROOT, Map.of("v", new SuiteView(r), "xhtml", xhtml, "css", CSS));
        return ENGINE.process("suite", c);
    }

    private static String page(Report r, boolean xhtml, DrawingBudget budget) {
        Context c =
                new Context(java.util.Locale.ROOT, Map.of("v", new ReportView(r, budget), "xhtml", xhtml, "css", CSS));
        return ENGINE.process("report", c);
    }

    private static TemplateEngine engine() {
        ClassLoaderTemplateResolver resolver = new ClassLoaderTemplateResolver(HtmlReport.class.getClassLoader());
        resolver.setPrefix(FOLDER);
        resolver.setSuffix(".html");
        // the template closes every void element, and HTML mode writes markup as written, so one
        // template serves both the browser and the XML reader of the PDF renderer
        resolver.setTemplateMode(TemplateMode.HTML);
        resolver.setCharacterEncoding(StandardCharsets.UTF_8.name());
        resolver.setCacheable(true);
        StandardDialect dialect = new StandardDialect();
        dialect.setVariableExpressionEvaluator(new ReportExpressions());
        TemplateEngine engine = new TemplateEngine();
        engine.setDialect(dialect);
        engine.setTemplateResolver(resolver);
        return engine;
    }

    private static String css() {
        try (InputStream in = HtmlReport.class.getClassLoader().getResourceAsStream(FOLDER + "report.css")) {
            if (in == null) {
                throw new IllegalStateException(FOLDER + "report.css is missing from the class path");
            }
            return new String(in.readAllBytes(), StandardCharsets.UTF_8);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }
}
