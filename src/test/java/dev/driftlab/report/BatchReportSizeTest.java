package dev.driftlab.report;

import static org.assertj.core.api.Assertions.assertThat;

import dev.driftlab.evaluation.BatchSummary;
import dev.driftlab.evaluation.Episode;
import dev.driftlab.evaluation.KidnapOutcome;
import dev.driftlab.evaluation.TrialOutcome;
import dev.driftlab.geometry.Pose;
import dev.driftlab.scenario.Gate;
import dev.driftlab.scenario.GateMetric;
import dev.driftlab.scenario.Scenario;
import dev.driftlab.scenario.Scenarios;
import dev.driftlab.trial.BatchResult;
import java.io.IOException;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import java.util.OptionalInt;
import java.util.SplittableRandom;
import org.apache.pdfbox.Loader;
import org.apache.pdfbox.pdmodel.PDDocument;
import org.apache.pdfbox.text.PDFTextStripper;
import org.junit.jupiter.api.Test;

/**
 * A recovery report of 50 seeds and two variants, from trial outcomes built directly: every episode
 * listed, the XHTML variant well-formed, the PDF carries the text. How fast it renders is measured in
 * {@code ReportBenchmark}, not here.
 */
public class BatchReportSizeTest {

    public static Report fiftySeeds() {
        return seeds(50);
    }

    /** The same report over {@code count} seeds, two variants each. */
    static Report seeds(int count) {
        Scenario s = Scenarios.corridor()
                .withKidnapAt(30, Pose.of(15, 1, 0))
                .withGate(new Gate("recovers", GateMetric.RECOVERY_TIME, 20, 0.9))
                .build();
        SplittableRandom rng = new SplittableRandom(42);
        List<TrialOutcome> trials = new ArrayList<>();
        long[] seeds = new long[count];
        for (int i = 0; i < count; i++) {
            seeds[i] = i + 1;
            for (String v : List.of("base", "more particles")) {
                double rec = rng.nextDouble() < 0.9 ? 2 + 25 * rng.nextDouble() : Double.NaN;
                trials.add(new TrialOutcome(
                        v,
                        i + 1,
                        60,
                        0.1 + 0.2 * rng.nextDouble(),
                        0.1,
                        0.05,
                        0.01,
                        1 + rng.nextDouble(),
                        List.<Episode>of(),
                        List.of(new KidnapOutcome(30, 0.5 + rng.nextDouble(), rec)),
                        0,
                        500,
                        dev.driftlab.evaluation.TrialEnd.completed(60, 0, 0),
                        List.of(),
                        0.02,
                        0.1));
            }
        }
        return Report.of(
                Report.Kind.BATCH,
                s,
                "Test corridor, revision 3",
                seeds,
                new BatchResult(trials, BatchSummary.of(trials, s), 100, false, 12),
                Optional.empty(),
                OptionalInt.empty(),
                new int[0],
                "2026-01-01T00:00:00Z");
    }

    @Test
    void fiftySeeds_everyEpisodeListed_gateAndIntervalShown() {
        String html = HtmlReport.render(fiftySeeds());
        assertThat(html.split("class=\"episode\"", -1)).hasSize(101);
        assertThat(html)
                .contains("Wilson")
                .contains("recovers")
                .contains("more particles")
                .contains(Report.CAUTION);
    }

    @Test
    void xhtmlVariant_isWellFormedXml() throws Exception {
        String xhtml = HtmlReport.renderXhtml(fiftySeeds());
        var factory = javax.xml.parsers.DocumentBuilderFactory.newInstance();
        factory.setNamespaceAware(true);
        var doc = factory.newDocumentBuilder()
                .parse(new java.io.ByteArrayInputStream(xhtml.getBytes(java.nio.charset.StandardCharsets.UTF_8)));
        assertThat(doc.getDocumentElement().getNamespaceURI()).isEqualTo("http://www.w3.org/1999/xhtml");
    }

    @Test
    void pdf_hasTheReportText() throws IOException {
        byte[] pdf = PdfReport.render(fiftySeeds());
        try (PDDocument doc = Loader.loadPDF(pdf)) {
            String text = new PDFTextStripper().getText(doc).replaceAll("\\s+", " ");
            assertThat(text)
                    .contains("Kidnapped-robot recovery")
                    .contains("recovers")
                    .contains("more particles")
                    .contains("Simulation results do not certify safety");
        }
    }

    @Test
    void trialTable_ofAVeryLargeBatch_listsTheFirstThousand_andSaysSo() {
        Report r = seeds(600); // 1,200 trials

        String html = HtmlReport.render(r);

        String table = html.substring(html.indexOf("<h2>Trials</h2>"), html.indexOf("<h2>Glossary</h2>"));
        int rows = table.split("<tr>", -1).length - 1;
        assertThat(rows).as("trial rows and the heading row").isEqualTo(ReportView.MAX_TRIAL_ROWS + 1);
        assertThat(html)
                .contains("The first 1000 of 1200 trials are listed; the result document has them all.")
                .contains("<summary>1200 trials</summary>");
    }
}
