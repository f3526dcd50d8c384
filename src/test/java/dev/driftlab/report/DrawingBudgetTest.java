package dev.driftlab.report;

import static org.assertj.core.api.Assertions.assertThat;

import dev.driftlab.evaluation.BatchSummary;
import dev.driftlab.geometry.Polygon;
import dev.driftlab.scenario.Room;
import dev.driftlab.scenario.Scenario;
import dev.driftlab.scenario.Scenarios;
import dev.driftlab.trial.BatchResult;
import java.io.IOException;
import java.util.List;
import java.util.Optional;
import java.util.OptionalInt;
import org.apache.pdfbox.Loader;
import org.apache.pdfbox.pdmodel.PDDocument;
import org.apache.pdfbox.text.PDFTextStripper;
import org.junit.jupiter.api.Test;

/** Drawings over the budget are left out with a note; the rest of the page stays as it was. */
class DrawingBudgetTest {

    /** A site of {@code rooms} small rooms in rows beside the test corridor. */
    static Scenario manyRooms(int rooms) {
        Scenarios.Builder b = Scenarios.corridor();
        for (int i = 0; i < rooms; i++) {
            b.withRoom(new Room("r" + i, "Room " + i, Polygon.rectangle(30 + (i % 100) * 3, (i / 100) * 3, 2, 2)));
        }
        return b.build();
    }

    private static Report reportOf(Scenario s) {
        return Report.of(
                Report.Kind.BATCH,
                s,
                "many rooms",
                new long[] {1},
                new BatchResult(List.of(), BatchSummary.of(List.of(), s), 1, false, 0),
                Optional.empty(),
                OptionalInt.empty(),
                new int[0],
                "2026-01-01T00:00:00Z");
    }

    @Test
    void pdf_ofASiteOverTheBudget_leavesThePlanOutAndSaysSo() throws IOException {
        byte[] pdf = PdfReport.render(reportOf(manyRooms(9_000)));

        try (PDDocument doc = Loader.loadPDF(pdf)) {
            String text = new PDFTextStripper().getText(doc).replaceAll("\\s+", " ");
            assertThat(text).contains("Drawing left out").contains("Simulation results do not certify safety");
        }
    }

    @Test
    void apply_smallDrawingsStay_nestedOnesCountWithTheirOuterOne() {
        String page = "<p>a</p><svg><g><svg><rect/><rect/></svg></g></svg><p>b</p><svg><rect/></svg>";

        DrawingBudget.Applied roomy = new DrawingBudget(10, 10).apply(page);
        DrawingBudget.Applied tight = new DrawingBudget(4, 6).apply(page);

        assertThat(roomy.page()).isEqualTo(page);
        assertThat(roomy.omitted()).isZero();
        assertThat(tight.omitted()).isEqualTo(1);
        assertThat(tight.page())
                .startsWith("<p>a</p><p class=\"drawing-omitted\">")
                .contains("it has 5 elements")
                .endsWith("<p>b</p><svg><rect/></svg>");
    }

    @Test
    void apply_pastTheTotal_laterDrawingsAreLeftOut() {
        String page = "<svg><rect/></svg><svg><rect/></svg><svg><rect/></svg>";

        DrawingBudget.Applied a = new DrawingBudget(2, 4).apply(page);

        assertThat(a.omitted()).isEqualTo(1);
        assertThat(a.page()).startsWith("<svg><rect/></svg><svg><rect/></svg><p class=\"drawing-omitted\">");
    }
}
