package dev.driftlab.app.reports.web;

import dev.driftlab.app.reports.ReportRenders;
import dev.driftlab.app.reports.RunReports;
import dev.driftlab.app.runs.RunBoard;
import dev.driftlab.app.runs.persistence.RunRepository.RunRow;
import dev.driftlab.app.scenarios.ScenarioStore;
import dev.driftlab.report.DrawingBudget;
import dev.driftlab.report.HtmlReport;
import dev.driftlab.report.JunitXml;
import dev.driftlab.report.Report;
import dev.driftlab.report.ResultJson;
import io.swagger.v3.oas.annotations.Operation;
import io.swagger.v3.oas.annotations.tags.Tag;
import java.nio.charset.StandardCharsets;
import java.util.List;
import java.util.function.Function;
import org.springframework.http.MediaType;
import org.springframework.http.ResponseEntity;
import org.springframework.web.bind.annotation.GetMapping;
import org.springframework.web.bind.annotation.PathVariable;
import org.springframework.web.bind.annotation.RestController;

/**
 * A batch's files as the command line's {@code batch} job writes them (result document, JUnit file,
 * report page), made by the same renderers from the trials the batch's runs stored, so a CI job
 * that ran its batch on a server ({@code driftlab.jar submit}) gets what a local run gives. Reached
 * through the run link of any run of the batch; made under the report pages' bound and cached once
 * every run is over.
 */
@RestController
@Tag(name = "Reports", description = "A batch's result document, JUnit file and report page as files")
class BatchFiles {

    private final RunBoard board;
    private final RunReports reports;
    private final ReportRenders renders;

    BatchFiles(ScenarioStore store, RunBoard board, ReportRenders renders) {
        this.board = board;
        this.reports = new RunReports(store, board);
        this.renders = renders;
    }

    @GetMapping(value = "/api/r/{runToken}/batch-result", produces = MediaType.APPLICATION_JSON_VALUE)
    @Operation(
            summary = "The result document of the run's whole batch, as the command line's batch job writes it",
            description = "Format driftlab-result/2. While runs are still going it holds the trials stored so"
                    + " far; 503 with Retry-After when as many reports as allowed are being made.")
    ResponseEntity<String> result(@PathVariable String runToken) {
        return file(runToken, "result", ResultJson::render, MediaType.APPLICATION_JSON);
    }

    @GetMapping(value = "/api/r/{runToken}/batch-junit.xml", produces = MediaType.APPLICATION_XML_VALUE)
    @Operation(summary = "The JUnit file of the run's whole batch: one test case per gate and variant")
    ResponseEntity<String> junit(@PathVariable String runToken) {
        return file(runToken, "junit", JunitXml::render, MediaType.APPLICATION_XML);
    }

    @GetMapping(value = "/api/r/{runToken}/batch-report.html", produces = MediaType.TEXT_HTML_VALUE)
    @Operation(
            summary = "The self-contained report page of the run's whole batch, as a file",
            description = "The page the command line writes, without the web page's tool bar; drawings are"
                    + " held to the report page's budget.")
    ResponseEntity<String> html(@PathVariable String runToken) {
        return file(
                runToken,
                "html",
                r -> HtmlReport.render(r, DrawingBudget.PAGE),
                new MediaType(MediaType.TEXT_HTML, StandardCharsets.UTF_8));
    }

    private ResponseEntity<String> file(String runToken, String what, Function<Report, String> render, MediaType type) {
        RunRow run = board.byToken(runToken);
        List<RunRow> runs = board.batch(run.scenarioId(), run.batchKey());
        String body = renders.file(
                "batch/" + run.batchKey() + "/" + what, runs, () -> render.apply(reports.ofBatchFiles(run)));
        return ResponseEntity.ok().contentType(type).body(body);
    }
}
