package dev.driftlab.report;

import static org.assertj.core.api.Assertions.assertThat;

import dev.driftlab.evaluation.BatchSummary;
import dev.driftlab.evaluation.TrialOutcome;
import dev.driftlab.scenario.Scenario;
import dev.driftlab.scenario.Scenarios;
import dev.driftlab.trial.BatchResult;
import java.util.List;
import java.util.Optional;
import java.util.OptionalInt;
import org.junit.jupiter.api.Test;

/** The page rendered from the template: one self-contained file, every section, text escaped. */
class HtmlReportTest {

    @Test
    void batch_hasEverySectionInOrder_andTheVerdictInWordsNotOnlyColour() {
        String html = HtmlReport.render(BatchReportSizeTest.fiftySeeds());

        assertThat(html)
                .containsSubsequence(
                        "<h1>Localization report: ",
                        "id=\"verdict\"",
                        "Verdict: ",
                        "<dl class=\"facts\">",
                        "<strong>Caution.</strong> " + Report.CAUTION,
                        "<h2>Gates</h2>",
                        "<h2>Variants</h2>",
                        "<h2>Kidnapped-robot recovery</h2>",
                        "<h3>Kidnap episodes</h3>",
                        "<h2>Paired comparison with the base</h2>",
                        "<h2>Site plan</h2>",
                        "<h2>Trials</h2>",
                        "100 trials</summary>",
                        "<h2>Glossary</h2>",
                        "<footer>" + Report.CAUTION + "</footer>")
                .containsPattern("<span aria-hidden=\"true\">.</span> Verdict: (pass|fail) \u2014 ")
                .contains("<dt>Seeds</dt><dd>1 to 50 (50)</dd>");
    }

    @Test
    void page_isSelfContained_withTheStylesInlinedAndPlotsAtFullWidth() {
        String html = HtmlReport.render(BatchReportSizeTest.fiftySeeds());

        assertThat(html)
                .doesNotContain("<script")
                .doesNotContain("<link")
                .doesNotContainPattern("<th:block|\\sth:[a-z]+=");
        assertThat(html).contains("<style>body{").contains(".charts svg{width:100%");
        assertThat(html).doesNotContain("calc(50%");
    }

    @Test
    void xhtml_carriesTheNamespace_andThePageForBrowsersTheSameText() {
        Report r = BatchReportSizeTest.fiftySeeds();

        String html = HtmlReport.render(r);
        String xhtml = HtmlReport.renderXhtml(r);

        assertThat(xhtml).contains("<html lang=\"en\" xmlns=\"http://www.w3.org/1999/xhtml\">");
        assertThat(html).contains("<html lang=\"en\">").contains("<meta charset=\"utf-8\"/>");
        assertThat(xhtml.replace(" xmlns=\"http://www.w3.org/1999/xhtml\"", "")).isEqualTo(html);
    }

    @Test
    void scenarioText_isEscaped_andAReportWithoutTrialsStillRenders() {
        Scenario s =
                Scenarios.corridor().withName("<script>alert(1)</script> & co").build();
        List<TrialOutcome> none = List.of();
        Report r = Report.of(
                Report.Kind.BATCH,
                s,
                "a \"quoted\" source",
                new long[0],
                new BatchResult(none, BatchSummary.of(none, s), 0, false, 0),
                Optional.empty(),
                OptionalInt.empty(),
                new int[0],
                "2026-01-01T00:00:00Z");

        String html = HtmlReport.render(r);

        assertThat(html)
                .doesNotContain("<script>")
                .contains("&lt;script&gt;alert(1)&lt;/script&gt; &amp; co")
                .contains("<h2>Gates</h2>")
                .contains("<dt>Seeds</dt><dd>none</dd>")
                .doesNotContain("Kidnapped-robot recovery");
    }
}
