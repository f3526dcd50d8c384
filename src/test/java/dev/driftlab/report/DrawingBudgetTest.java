package dev.driftlab.report;

import static org.assertj.core.api.Assertions.assertThat;

import dev.driftlab.evaluation.BatchSummary;
import dev.driftlab.geometry.Polygon;
import dev.driftlab.recording.Frame;
import dev.driftlab.scenario.Room;
import dev.driftlab.scenario.Scenario;
import dev.driftlab.scenario.ScenarioFiles;
import dev.driftlab.scenario.Scenarios;
import dev.driftlab.trial.BatchResult;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Optional;
import java.util.OptionalInt;
import java.util.concurrent.atomic.AtomicInteger;
import org.apache.pdfbox.Loader;
import org.apache.pdfbox.pdmodel.PDDocument;
import org.apache.pdfbox.text.PDFTextStripper;
import org.junit.jupiter.api.Test;

/** Drawings over the budget are never drawn, a note stands in their place; the rest of the page stays. */
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
    void spending_drawingsThatFitAreDrawn_oneOverItsOwnBoundIsNeverDrawn() {
        DrawingBudget.Spending spending = new DrawingBudget(4, 6).spending();
        AtomicInteger drawn = new AtomicInteger();

        String small = spending.draw(3, () -> {
            drawn.incrementAndGet();
            return "<svg><rect/><rect/></svg>";
        });
        String large = spending.draw(5, () -> {
            drawn.incrementAndGet();
            return "never";
        });

        assertThat(small).isEqualTo("<svg><rect/><rect/></svg>");
        assertThat(large).startsWith("<p class=\"drawing-omitted\">").contains("it has 5 elements");
        assertThat(drawn).hasValue(1);
        assertThat(spending.omitted()).isEqualTo(1);
    }

    @Test
    void spending_pastTheTotal_laterDrawingsAreLeftOut() {
        DrawingBudget.Spending spending = new DrawingBudget(2, 4).spending();

        List<String> out = List.of(
                spending.drawn("<svg><rect/></svg>"),
                spending.drawn("<svg><rect/></svg>"),
                spending.drawn("<svg><rect/></svg>"));

        assertThat(out.subList(0, 2)).containsOnly("<svg><rect/></svg>");
        assertThat(out.get(2)).startsWith("<p class=\"drawing-omitted\">");
    }

    @Test
    void planElements_areCountedBeforeDrawing_exactlyAsDrawn() throws IOException {
        List<Scenario> scenarios = new java.util.ArrayList<>(List.of(manyRooms(50)));
        try (var files = Files.list(Path.of("sample-projects"))) {
            for (Path f :
                    files.filter(p -> p.toString().endsWith(".json")).sorted().toList()) {
                ScenarioFiles.check(Files.readString(f)).scenario().ifPresent(scenarios::add);
            }
        }
        assertThat(scenarios).hasSizeGreaterThan(3);

        for (Scenario s : scenarios) {
            SitePlanSvg.Plan plan = SitePlanSvg.plan(s);
            assertThat(plan.elements()).as(s.name()).isEqualTo(openingTags(plan.svg()));
        }
    }

    @Test
    void frameElements_areCountedBeforeDrawing_exactlyAsDrawn() {
        Scenario s = manyRooms(20);
        SitePlanSvg.Plan plan = SitePlanSvg.plan(s);
        double[] beams = new double[360];
        Frame frame = FrameSvgTest.frame(7_001, beams.length, 3);

        String svg = FrameSvg.render(s, frame, beams, "a frame");

        assertThat(FrameSvg.elements(plan.elements(), frame, beams)).isEqualTo(openingTags(svg));
    }

    /**
     * The report page of a site over the page budget: the plan is never drawn, so making the whole
     * page costs less memory than drawing the plan alone would. Drawing first and cutting the
     * drawing out afterwards (as the page once did) costs the drawing and more.
     */
    @Test
    void page_ofASiteOverTheBudget_neverDrawsThePlan() {
        Scenario s = manyRooms(9_000);
        Report report = reportOf(s);
        HtmlReport.render(reportOf(Scenarios.corridor().build()), DrawingBudget.PAGE); // template compiled

        long plan = allocatedBy(() -> SitePlanSvg.render(s).length());
        String[] page = new String[1];
        long whole = allocatedBy(() -> {
            page[0] = HtmlReport.render(report, DrawingBudget.PAGE);
            return page[0].length();
        });

        assertThat(page[0]).contains("Drawing left out").doesNotContain("class=\"site-plan\"");
        assertThat(whole)
                .as("bytes allocated by the page, against %,d by the plan's drawing", plan)
                .isLessThan(plan / 2);
    }

    private static long allocatedBy(java.util.function.IntSupplier work) {
        var threads = (com.sun.management.ThreadMXBean) java.lang.management.ManagementFactory.getThreadMXBean();
        long before = threads.getCurrentThreadAllocatedBytes();
        int keep = work.getAsInt();
        long after = threads.getCurrentThreadAllocatedBytes();
        assertThat(keep).isPositive();
        return after - before;
    }

    private static int openingTags(String svg) {
        int n = 0;
        for (int i = 0; i < svg.length() - 1; i++) {
            if (svg.charAt(i) == '<' && svg.charAt(i + 1) != '/') {
                n++;
            }
        }
        return n;
    }
}
