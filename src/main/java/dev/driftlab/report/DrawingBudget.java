package dev.driftlab.report;

import java.util.Locale;

/**
 * A size budget for the drawings of a report page. A site plan of ten thousand rooms is a drawing of
 * tens of thousands of elements; the PDF renderer builds an object tree per element and needed
 * gigabytes for one such page, and a browser page holding it, its key frames and their copies while
 * being made took as much again. Each drawing's size is worked out from the model before it is
 * drawn ({@link SitePlanSvg.Plan#elements()}, {@code FrameSvg.elements}); drawings over the budget
 * are never drawn, and the page says so where each one stood, so a reader knows the document is not
 * complete rather than finding a blank.
 *
 * @param maxElementsPerDrawing elements one drawing may have (nested drawings count with their
 *     outer one)
 * @param maxElementsInAll elements all drawings of the page may have together; drawings past it are
 *     left out in page order
 */
public record DrawingBudget(int maxElementsPerDrawing, int maxElementsInAll) {

    /** The budget of a PDF: the renderer costs far more per element than a browser does. */
    public static final DrawingBudget PDF = new DrawingBudget(8_000, 40_000);

    /** The budget of a report page shown in a browser. */
    public static final DrawingBudget PAGE = new DrawingBudget(40_000, 160_000);

    /** A budget with no practical bound, for documents written to disk (the command line). */
    public static final DrawingBudget NONE = new DrawingBudget(Integer.MAX_VALUE, Integer.MAX_VALUE);

    public DrawingBudget {
        if (maxElementsPerDrawing < 1 || maxElementsInAll < maxElementsPerDrawing) {
            throw new IllegalArgumentException("budget: per drawing at least 1 and no more than in all");
        }
    }

    /**
     * Spending of one document, drawing by drawing in page order: each drawing's size is asked
     * before it is drawn, so a drawing over the budget is never built at all (checking the cost
     * before doing the work: common practice, no source).
     */
    public Spending spending() {
        return new Spending();
    }

    /** What one document has spent; not shared between documents or threads. */
    public final class Spending {
        private long spent;
        private int omitted;

        private Spending() {}

        /**
         * The drawing when its elements fit what is left, else the note that stands in its place.
         *
         * @param elements opening tags the drawing will have, counted before drawing it
         * @param draw makes the drawing; called only when it fits
         */
        public String draw(int elements, java.util.function.Supplier<String> draw) {
            if (elements > maxElementsPerDrawing || spent + elements > maxElementsInAll) {
                omitted++;
                return note(elements);
            }
            spent += elements;
            return draw.get();
        }

        /**
         * A drawing of a size known only once drawn, small by construction (a chart: a few
         * elements per series, bin or label), charged or left out like any other.
         */
        public String drawn(String svg) {
            int elements = elements(svg, 0, svg.length());
            return draw(elements, () -> svg);
        }

        /** Drawings left out so far. */
        public int omitted() {
            return omitted;
        }
    }

    /** The note standing where a drawing over the budget would have been. */
    String note(int elements) {
        return String.format(
                Locale.ROOT,
                "<p class=\"drawing-omitted\"><strong>Drawing left out:</strong> it has %,d elements;"
                        + " this document draws at most %,d per drawing and %,d in all, so that it stays"
                        + " small enough to make. The figures and tables are complete.</p>",
                elements,
                maxElementsPerDrawing,
                maxElementsInAll);
    }

    /** Opening tags between two indexes. */
    private static int elements(String page, int start, int end) {
        int n = 0;
        for (int i = start; i < end - 1; i++) {
            if (page.charAt(i) == '<' && page.charAt(i + 1) != '/') {
                n++;
            }
        }
        return n;
    }
}
