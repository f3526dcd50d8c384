package dev.driftlab.bench;

import dev.driftlab.report.BatchReportSizeTest;
import dev.driftlab.report.HtmlReport;
import dev.driftlab.report.PdfReport;
import dev.driftlab.report.Report;
import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.Warmup;

/**
 * Rendering the recovery report of a 50-seed, two-variant batch (trials built directly, no
 * simulation): the HTML page and its PDF. Target: the page in under a second.
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
@Fork(1)
@Warmup(iterations = 2, time = 2)
@Measurement(iterations = 3, time = 2)
public class ReportBenchmark {

    private Report report;

    @Setup
    public void setUp() {
        report = BatchReportSizeTest.fiftySeeds();
    }

    @Benchmark
    public String fiftySeedBatchPage() {
        return HtmlReport.render(report);
    }

    @Benchmark
    public byte[] fiftySeedBatchPdf() {
        return PdfReport.render(report);
    }
}
