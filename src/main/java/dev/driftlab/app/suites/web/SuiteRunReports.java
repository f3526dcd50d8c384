package dev.driftlab.app.suites.web;

import dev.driftlab.app.reports.ReportRenders;
import dev.driftlab.app.suites.SuiteRuns;
import dev.driftlab.app.suites.persistence.SuiteRepository.SuiteRunRow;
import dev.driftlab.report.SuiteView;
import jakarta.servlet.http.HttpServletRequest;
import jakarta.servlet.http.HttpServletResponse;
import java.util.Map;
import java.util.Set;
import java.util.concurrent.atomic.AtomicInteger;
import org.springframework.stereotype.Component;
import org.thymeleaf.ITemplateEngine;
import org.thymeleaf.context.WebContext;
import org.thymeleaf.web.servlet.JakartaServletWebApplication;

/**
 * The report part of a suite run's page ({@code templates/suites/report.html}). Remaking it reads
 * every cell's trials, so it goes through the report pages' bound and cache ({@link
 * ReportRenders#suitePage}) like the downloads: made under the page bound, and kept once the suite
 * run has finished (its report never changes then), so later loads and the last poll read it from
 * the cache. A running suite run has no report yet.
 */
@Component
public final class SuiteRunReports {

    private final SuiteRuns runs;
    private final ReportRenders renders;
    private final ITemplateEngine templates;
    private final AtomicInteger builds = new AtomicInteger();

    // the servlet context is taken from each request, so that the bean also exists in a process
    // without a web server (a worker), where no page is ever rendered
    SuiteRunReports(SuiteRuns runs, ReportRenders renders, ITemplateEngine templates) {
        this.runs = runs;
        this.renders = renders;
        this.templates = templates;
    }

    /**
     * The report as HTML for the page of a finished suite run.
     *
     * @param p the run's progress (its cells' runs link the matrix to their batch reports)
     * @param self the run's permalink
     * @throws dev.driftlab.app.system.RenderGate.Busy when as many report pages as allowed are being made
     */
    String html(SuiteRuns.Progress p, String self, HttpServletRequest request, HttpServletResponse response) {
        SuiteRunRow run = p.run();
        return renders.suitePage(run.id() + "/page", run.finished(), () -> {
            builds.incrementAndGet();
            Map<String, Object> model = Map.of("v", SuiteView.of(runs.report(run)), "p", p, "self", self);
            JakartaServletWebApplication web =
                    JakartaServletWebApplication.buildApplication(request.getServletContext());
            WebContext context = new WebContext(web.buildExchange(request, response), request.getLocale(), model);
            return templates.process("suites/report", Set.of("report"), context);
        });
    }

    /** Reports made so far (not read from the cache); for tests. */
    int builds() {
        return builds.get();
    }
}
