package dev.driftlab.app.reports.web;

import dev.driftlab.app.reports.ReportRenders;
import dev.driftlab.app.reports.RunReports;
import dev.driftlab.app.runs.RunBoard;
import dev.driftlab.app.runs.persistence.RunRepository.RunRow;
import dev.driftlab.app.scenarios.ScenarioStore;
import dev.driftlab.app.sharing.Grant;
import dev.driftlab.app.sharing.ShareLinks;
import dev.driftlab.report.DrawingBudget;
import dev.driftlab.report.HtmlReport;
import dev.driftlab.report.PdfReport;
import dev.driftlab.report.Report;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import java.util.regex.Matcher;
import org.springframework.http.HttpHeaders;
import org.springframework.http.HttpStatus;
import org.springframework.http.MediaType;
import org.springframework.http.ResponseEntity;
import org.springframework.stereotype.Controller;
import org.springframework.web.bind.annotation.ExceptionHandler;
import org.springframework.web.bind.annotation.GetMapping;
import org.springframework.web.bind.annotation.PathVariable;
import org.springframework.web.bind.annotation.RequestParam;
import org.springframework.web.servlet.ModelAndView;

/**
 * Recovery reports: a run's or its batch's report as a printable page and as a PDF. The run's own
 * read-only token is the permalink; the scenario link redirects there.
 */
@Controller
class ReportPages {

    private final ShareLinks links;
    private final RunBoard board;
    private final RunReports reports;
    private final ReportRenders renders;

    ReportPages(ShareLinks links, ScenarioStore store, RunBoard board, ReportRenders renders) {
        this.links = links;
        this.board = board;
        this.reports = new RunReports(store, board);
        this.renders = renders;
    }

    /** The bounds of this controller's renders, so a test can occupy them. */
    ReportRenders renders() {
        return renders;
    }

    @GetMapping("/s/{token}/runs/{id}/report")
    String fromScenario(@PathVariable String token, @PathVariable long id) {
        Grant g = links.require(token);
        return "redirect:/r/" + board.of(g.scenarioId(), id).viewToken() + "/report";
    }

    @GetMapping("/s/{token}/runs/{id}/batch-report")
    String batchFromScenario(@PathVariable String token, @PathVariable long id) {
        Grant g = links.require(token);
        return "redirect:/r/" + board.of(g.scenarioId(), id).viewToken() + "/batch-report";
    }

    @GetMapping("/r/{runToken}/report")
    ResponseEntity<String> run(@PathVariable String runToken) {
        RunRow r = board.byToken(runToken);
        return page(renders.page("run/" + r.id(), List.of(r), () -> html(reports.ofRun(r), tools(r, false))));
    }

    @GetMapping("/r/{runToken}/report.pdf")
    ResponseEntity<byte[]> runPdf(@PathVariable String runToken) {
        RunRow r = board.byToken(runToken);
        return pdf(renders.pdf("run/" + r.id(), List.of(r), () -> PdfReport.render(reports.ofRun(r))), "run-" + r.id());
    }

    @GetMapping("/r/{runToken}/batch-report")
    ResponseEntity<String> batch(@PathVariable String runToken) {
        RunRow r = board.byToken(runToken);
        return page(renders.page("batch/" + r.batchKey(), batchOf(r), () -> html(reports.ofBatch(r), tools(r, true))));
    }

    @GetMapping("/r/{runToken}/batch-report.pdf")
    ResponseEntity<byte[]> batchPdf(@PathVariable String runToken) {
        RunRow r = board.byToken(runToken);
        return pdf(
                renders.pdf("batch/" + r.batchKey(), batchOf(r), () -> PdfReport.render(reports.ofBatch(r))),
                "batch-" + r.id());
    }

    /**
     * Before and after: this run's batch against the batch of a pasted run link of the same
     * scenario, the earlier revision (or run) as the base of the paired comparison.
     */
    @GetMapping("/r/{runToken}/compare")
    ResponseEntity<String> compare(
            @PathVariable String runToken, @RequestParam(name = "with", required = false) String with) {
        RunRow r = board.byToken(runToken);
        RunRow[] pair = ordered(r, partner(r, with));
        return page(renders.page(
                "compare/" + pair[0].batchKey() + "/" + pair[1].batchKey() + "/" + r.id(),
                both(pair),
                () -> html(reports.compare(pair[0], pair[1]), tools(r, true))));
    }

    @GetMapping("/r/{runToken}/compare.pdf")
    ResponseEntity<byte[]> comparePdf(
            @PathVariable String runToken, @RequestParam(name = "with", required = false) String with) {
        RunRow r = board.byToken(runToken);
        RunRow[] pair = ordered(r, partner(r, with));
        return pdf(
                renders.pdf(
                        "compare/" + pair[0].batchKey() + "/" + pair[1].batchKey(),
                        both(pair),
                        () -> PdfReport.render(reports.compare(pair[0], pair[1]))),
                "compare-" + pair[0].id() + "-" + pair[1].id());
    }

    /** The run of a pasted link, refused with a message naming the field when it cannot be compared. */
    private RunRow partner(RunRow r, String with) {
        if (with == null || with.isBlank()) {
            throw new NotComparable("with: paste the link of a run of the batch to compare with");
        }
        RunRow other = board.byLink(with)
                .orElseThrow(() -> new NotComparable("with: that is not a run link; run links contain /r/"));
        if (other.scenarioId() != r.scenarioId()) {
            throw new NotComparable("with: that run belongs to another scenario; only batches of one scenario compare");
        }
        if (other.batchKey().equals(r.batchKey())) {
            throw new NotComparable("with: that run is of this same batch; its batch report already compares them");
        }
        return other;
    }

    /** A comparison that cannot be made; the message names the field. */
    static final class NotComparable extends RuntimeException {
        NotComparable(String message) {
            super(message);
        }
    }

    @ExceptionHandler(NotComparable.class)
    ModelAndView notComparable(NotComparable e) {
        ModelAndView mv = new ModelAndView("system/problem");
        mv.setStatus(HttpStatus.UNPROCESSABLE_CONTENT);
        mv.addObject("heading", "Not compared");
        mv.addObject("message", e.getMessage());
        return mv;
    }

    private List<RunRow> batchOf(RunRow r) {
        return board.batch(r.scenarioId(), r.batchKey());
    }

    private List<RunRow> both(RunRow[] pair) {
        List<RunRow> runs = new ArrayList<>(batchOf(pair[0]));
        runs.addAll(batchOf(pair[1]));
        return runs;
    }

    /** Earlier revision first; within one revision, the earlier run. */
    private static RunRow[] ordered(RunRow a, RunRow b) {
        boolean aFirst =
                a.revisionNumber() != b.revisionNumber() ? a.revisionNumber() < b.revisionNumber() : a.id() < b.id();
        return aFirst ? new RunRow[] {a, b} : new RunRow[] {b, a};
    }

    /**
     * The page with its drawings within {@link DrawingBudget#PAGE}, each checked before it is drawn,
     * so a plan over the budget is never built.
     */
    private static String html(Report report, String tools) {
        return HtmlReport.render(report, DrawingBudget.PAGE)
                .replaceFirst("</head>", Matcher.quoteReplacement(STYLES + "</head>"))
                .replaceFirst("<body>", Matcher.quoteReplacement("<body>" + tools));
    }

    private static ResponseEntity<String> page(String html) {
        return ResponseEntity.ok()
                .contentType(new MediaType(MediaType.TEXT_HTML, StandardCharsets.UTF_8))
                .body(html);
    }

    private static final String STYLES = "<link rel=\"stylesheet\" href=\"/assets/css/player.css\">";

    /** Links above the report; the run token is checked well-formed, so it is safe in markup. */
    private static String tools(RunRow r, boolean batch) {
        String base = "/r/" + r.viewToken();
        String pdf = base + (batch ? "/batch-report.pdf" : "/report.pdf");
        StringBuilder sb = new StringBuilder("<nav class=\"report-tools\" aria-label=\"Report\">");
        sb.append("<a href=\"").append(pdf).append("\" download>Download PDF</a>");
        sb.append("<a href=\"")
                .append(base)
                .append(batch ? "/batch-report" : "/report")
                .append("\">Permalink</a>");
        sb.append("<a href=\"").append(base).append("/play\">Open the player</a>");
        sb.append("<a href=\"").append(base).append("\">Run details</a>");
        sb.append(
                batch
                        ? "<a href=\"" + base + "/report\">This run only</a>"
                        : "<a href=\"" + base + "/batch-report\">Whole batch</a>");
        sb.append("<span>Print with the browser; this bar stays off paper.</span>");
        if (batch) {
            sb.append("<form class=\"report-compare\" method=\"get\" action=\"")
                    .append(base)
                    .append(
                            "/compare\"><label for=\"compare-with\">Before and after: compare with the batch at</label>")
                    .append("<input id=\"compare-with\" name=\"with\" type=\"text\" maxlength=\"300\" size=\"28\"")
                    .append(" placeholder=\"paste a run link of this scenario\">")
                    .append("<button type=\"submit\" class=\"quiet\">Compare</button></form>");
        }
        sb.append("</nav>");
        return sb.toString();
    }

    private static ResponseEntity<byte[]> pdf(byte[] pdf, String name) {
        return ResponseEntity.ok()
                .contentType(MediaType.APPLICATION_PDF)
                .header(HttpHeaders.CONTENT_DISPOSITION, "attachment; filename=\"driftlab-report-" + name + ".pdf\"")
                .body(pdf);
    }
}
