package dev.driftlab.report;

import java.util.Locale;

/**
 * A size budget for the drawings of a report page. A site plan of ten thousand rooms is a drawing of
 * tens of thousands of elements; the PDF renderer builds an object tree per element and needed
 * gigabytes for one such page. Drawings over the budget are left out, and the page says so where
 * each one stood, so a reader knows the document is not complete rather than finding a blank.
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

    public DrawingBudget {
        if (maxElementsPerDrawing < 1 || maxElementsInAll < maxElementsPerDrawing) {
            throw new IllegalArgumentException("budget: per drawing at least 1 and no more than in all");
        }
    }

    /** The result of applying the budget. */
    public record Applied(String page, int omitted) {}

    /**
     * The page with every outermost {@code <svg>} element over the budget replaced by a note. The
     * page is the renderer's own output, so drawings are well-formed: an {@code <svg} opening never
     * appears inside text (the renderers escape {@code <}).
     */
    public Applied apply(String page) {
        StringBuilder out = new StringBuilder(Math.min(page.length(), 1 << 20));
        int spent = 0;
        int omitted = 0;
        int from = 0;
        while (true) {
            int start = page.indexOf("<svg", from);
            if (start < 0) {
                break;
            }
            int end = endOf(page, start);
            if (end < 0) {
                break;
            }
            int elements = elements(page, start, end);
            out.append(page, from, start);
            if (elements > maxElementsPerDrawing || spent + elements > maxElementsInAll) {
                omitted++;
                out.append(String.format(
                        Locale.ROOT,
                        "<p class=\"drawing-omitted\"><strong>Drawing left out:</strong> it has %,d elements;"
                                + " this document draws at most %,d per drawing and %,d in all, so that it stays"
                                + " small enough to make. The figures and tables are complete.</p>",
                        elements,
                        maxElementsPerDrawing,
                        maxElementsInAll));
            } else {
                spent += elements;
                out.append(page, start, end);
            }
            from = end;
        }
        out.append(page, from, page.length());
        return new Applied(out.toString(), omitted);
    }

    /** Index just after the {@code </svg>} closing the one opened at {@code start}; -1 if none. */
    private static int endOf(String page, int start) {
        int depth = 0;
        int i = start;
        while (i < page.length()) {
            int open = page.indexOf("<svg", i);
            int close = page.indexOf("</svg>", i);
            if (close < 0) {
                return -1;
            }
            if (open >= 0 && open < close) {
                depth++;
                i = open + 4;
            } else {
                depth--;
                i = close + 6;
                if (depth == 0) {
                    return i;
                }
            }
        }
        return -1;
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
