package dev.driftlab.report;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

/**
 * Small server-rendered SVG charts for reports that must work without scripts (self-contained
 * HTML, PDF): line charts over time with event markers, histograms and interval charts. Colours are
 * the Okabe-Ito palette, distinguishable with the common colour-vision deficiencies.
 */
public final class SvgChart {

    /** Okabe and Ito (2008) colour-blind-safe palette, without black. */
    static final String[] PALETTE = {"#0072B2", "#E69F00", "#009E73", "#CC79A7", "#56B4E9", "#D55E00", "#F0E442"};

    private static final int W = 640;
    private static final int H = 220;
    private static final int LEFT = 56;
    private static final int RIGHT = 16;
    private static final int TOP = 40;
    private static final int BOTTOM = 36;

    private SvgChart() {}

    /**
     * One named line.
     *
     * @param name legend text
     * @param y values, NaN leaves a gap
     */
    public record Series(String name, double[] y) {}

    /**
     * A line chart of several series over a shared x axis, with optional vertical markers.
     *
     * @param title chart title
     * @param xLabel x axis label with unit
     * @param yLabel y axis label with unit
     * @param x x values, increasing
     * @param series lines, each the same length as x
     * @param markers x positions of vertical markers (e.g. kidnap times)
     * @param markerLabel legend text for the markers
     */
    public static String lines(
            String title,
            String xLabel,
            String yLabel,
            double[] x,
            List<Series> series,
            double[] markers,
            String markerLabel) {
        double x0 = x.length == 0 ? 0 : x[0];
        double x1 = x.length == 0 ? 1 : x[x.length - 1];
        double yMin = Double.POSITIVE_INFINITY;
        double yMax = Double.NEGATIVE_INFINITY;
        for (Series s : series) {
            for (double v : s.y()) {
                if (Double.isFinite(v)) {
                    yMin = Math.min(yMin, v);
                    yMax = Math.max(yMax, v);
                }
            }
        }
        if (!(yMax > yMin)) {
            yMin = Double.isFinite(yMin) ? yMin - 1 : 0;
            yMax = yMin + 2;
        }
        yMin = Math.min(0, yMin);
        Frame f = new Frame(x0, x1 > x0 ? x1 : x0 + 1, yMin, yMax + (yMax - yMin) * 0.05);
        StringBuilder sb = open(title);
        f.axes(sb, xLabel, yLabel);
        for (double m : markers) {
            double px = f.px(m);
            sb.append(String.format(
                    Locale.ROOT,
                    "<line class=\"marker\" x1=\"%.1f\" y1=\"%d\" x2=\"%.1f\" y2=\"%d\" stroke=\"#D55E00\" "
                            + "stroke-dasharray=\"4 3\" stroke-width=\"1.5\"/>",
                    px,
                    TOP,
                    px,
                    H - BOTTOM));
        }
        int step = Math.max(1, x.length / 1500);
        for (int k = 0; k < series.size(); k++) {
            Series s = series.get(k);
            StringBuilder path = new StringBuilder();
            boolean pen = false;
            for (int i = 0; i < x.length; i += step) {
                double v = s.y()[i];
                if (!Double.isFinite(v)) {
                    pen = false;
                    continue;
                }
                path.append(pen ? 'L' : 'M').append(String.format(Locale.ROOT, "%.1f,%.1f", f.px(x[i]), f.py(v)));
                pen = true;
            }
            sb.append("<path fill=\"none\" stroke-width=\"1.6\" stroke=\"")
                    .append(PALETTE[k % PALETTE.length])
                    .append("\" d=\"")
                    .append(path)
                    .append("\"><title>")
                    .append(SitePlanSvg.esc(s.name()))
                    .append("</title></path>");
        }
        List<String[]> legend = new ArrayList<>();
        for (int k = 0; k < series.size(); k++) {
            legend.add(new String[] {PALETTE[k % PALETTE.length], series.get(k).name()});
        }
        if (markers.length > 0) {
            legend.add(new String[] {"#D55E00", markerLabel});
        }
        legend(sb, legend);
        return sb.append("</svg>").toString();
    }

    /**
     * A histogram of values per group, bars side by side.
     *
     * @param title chart title
     * @param xLabel value axis label with unit
     * @param groups group names
     * @param values values per group
     * @param bins number of bins
     */
    public static String histogram(String title, String xLabel, List<String> groups, List<double[]> values, int bins) {
        double lo = Double.POSITIVE_INFINITY;
        double hi = Double.NEGATIVE_INFINITY;
        for (double[] vs : values) {
            for (double v : vs) {
                if (Double.isFinite(v)) {
                    lo = Math.min(lo, v);
                    hi = Math.max(hi, v);
                }
            }
        }
        if (!Double.isFinite(lo)) {
            lo = 0;
            hi = 1;
        }
        lo = Math.min(0, lo);
        if (!(hi > lo)) {
            hi = lo + 1;
        }
        double width = (hi - lo) / bins;
        int[][] counts = new int[values.size()][bins];
        int top = 1;
        for (int g = 0; g < values.size(); g++) {
            for (double v : values.get(g)) {
                if (Double.isFinite(v)) {
                    int b = (int) Math.min(bins - 1, Math.floor((v - lo) / width));
                    counts[g][b]++;
                    top = Math.max(top, counts[g][b]);
                }
            }
        }
        Frame f = new Frame(lo, hi, 0, top * 1.1);
        StringBuilder sb = open(title);
        f.axes(sb, xLabel, "trials");
        double binPx = f.px(lo + width) - f.px(lo);
        double barPx = Math.max(1, (binPx - 2) / Math.max(1, values.size()));
        for (int g = 0; g < values.size(); g++) {
            for (int b = 0; b < bins; b++) {
                if (counts[g][b] == 0) {
                    continue;
                }
                double x = f.px(lo + b * width) + 1 + g * barPx;
                double y = f.py(counts[g][b]);
                sb.append(String.format(
                        Locale.ROOT,
                        "<rect x=\"%.1f\" y=\"%.1f\" width=\"%.1f\" height=\"%.1f\" fill=\"%s\"><title>%s: %d in "
                                + "%.2f to %.2f</title></rect>",
                        x,
                        y,
                        barPx,
                        f.py(0) - y,
                        PALETTE[g % PALETTE.length],
                        SitePlanSvg.esc(groups.get(g)),
                        counts[g][b],
                        lo + b * width,
                        lo + (b + 1) * width));
            }
        }
        List<String[]> legend = new ArrayList<>();
        for (int g = 0; g < groups.size(); g++) {
            legend.add(new String[] {PALETTE[g % PALETTE.length], groups.get(g)});
        }
        legend(sb, legend);
        return sb.append("</svg>").toString();
    }

    /**
     * Shares with their intervals, one dot and whisker per item, on a 0 to 100 % axis, with an
     * optional required-share line.
     *
     * @param title chart title
     * @param labels item labels (x axis)
     * @param share observed shares, 0 to 1
     * @param lower interval lower bounds
     * @param upper interval upper bounds
     * @param required required share drawn as a line, NaN for none
     */
    public static String intervals(
            String title, List<String> labels, double[] share, double[] lower, double[] upper, double required) {
        int n = labels.size();
        Frame f = new Frame(0, Math.max(1, n), 0, 1);
        StringBuilder sb = open(title);
        f.axesCategorical(sb, labels, "share of trials");
        if (Double.isFinite(required)) {
            sb.append(String.format(
                    Locale.ROOT,
                    "<line x1=\"%d\" x2=\"%d\" y1=\"%.1f\" y2=\"%.1f\" stroke=\"#D55E00\" stroke-dasharray=\"5 3\"/>"
                            + "<text x=\"%d\" y=\"%.1f\" class=\"small\" fill=\"#D55E00\">required %.0f %%</text>",
                    LEFT,
                    W - RIGHT,
                    f.py(required),
                    f.py(required),
                    W - RIGHT - 90,
                    f.py(required) - 4,
                    required * 100));
        }
        for (int i = 0; i < n; i++) {
            double cx = f.px(i + 0.5);
            String colour = PALETTE[i % PALETTE.length];
            sb.append(String.format(
                    Locale.ROOT,
                    "<line x1=\"%.1f\" x2=\"%.1f\" y1=\"%.1f\" y2=\"%.1f\" stroke=\"%s\" stroke-width=\"2\"/>"
                            + "<line x1=\"%.1f\" x2=\"%.1f\" y1=\"%.1f\" y2=\"%.1f\" stroke=\"%s\" stroke-width=\"2\"/>"
                            + "<line x1=\"%.1f\" x2=\"%.1f\" y1=\"%.1f\" y2=\"%.1f\" stroke=\"%s\" stroke-width=\"2\"/>"
                            + "<circle cx=\"%.1f\" cy=\"%.1f\" r=\"5\" fill=\"%s\"><title>%s: %.1f %% (%.1f %% to %.1f %%)"
                            + "</title></circle>",
                    cx,
                    cx,
                    f.py(lower[i]),
                    f.py(upper[i]),
                    colour,
                    cx - 8,
                    cx + 8,
                    f.py(lower[i]),
                    f.py(lower[i]),
                    colour,
                    cx - 8,
                    cx + 8,
                    f.py(upper[i]),
                    f.py(upper[i]),
                    colour,
                    cx,
                    f.py(share[i]),
                    colour,
                    SitePlanSvg.esc(labels.get(i)),
                    share[i] * 100,
                    lower[i] * 100,
                    upper[i] * 100));
        }
        return sb.append("</svg>").toString();
    }

    private static StringBuilder open(String title) {
        StringBuilder sb = new StringBuilder(4096);
        sb.append(String.format(
                Locale.ROOT,
                "<svg xmlns=\"http://www.w3.org/2000/svg\" class=\"chart\" viewBox=\"0 0 %d %d\" width=\"%d\" "
                        + "height=\"%d\" role=\"img\" aria-label=\"%s\">",
                W,
                H,
                W,
                H,
                SitePlanSvg.esc(title)));
        sb.append("<style>text{font:11px system-ui,sans-serif;fill:#3b4651}.title{font-weight:600;font-size:12px}"
                + ".small{font-size:10px}.grid{stroke:#e3e6e9}.axis{stroke:#8a949e}</style>");
        sb.append("<text class=\"title\" x=\"")
                .append(LEFT)
                .append("\" y=\"16\">")
                .append(SitePlanSvg.esc(title))
                .append("</text>");
        return sb;
    }

    private static void legend(StringBuilder sb, List<String[]> items) {
        double x = W - RIGHT;
        for (int i = items.size() - 1; i >= 0; i--) {
            String label = items.get(i)[1];
            double w = 18 + label.length() * 6.0;
            x -= w;
            sb.append(String.format(
                    Locale.ROOT,
                    "<rect x=\"%.1f\" y=\"22\" width=\"10\" height=\"10\" fill=\"%s\"/><text x=\"%.1f\" y=\"31\" "
                            + "class=\"small\">%s</text>",
                    x,
                    items.get(i)[0],
                    x + 13,
                    SitePlanSvg.esc(label)));
        }
    }

    /** Data-to-pixel mapping and axes. */
    private record Frame(double x0, double x1, double y0, double y1) {
        double px(double x) {
            return LEFT + (x - x0) / (x1 - x0) * (W - LEFT - RIGHT);
        }

        double py(double y) {
            return H - BOTTOM - (y - y0) / (y1 - y0) * (H - TOP - BOTTOM);
        }

        void axes(StringBuilder sb, String xLabel, String yLabel) {
            for (double t : ticks(y0, y1)) {
                sb.append(String.format(
                        Locale.ROOT,
                        "<line class=\"grid\" x1=\"%d\" x2=\"%d\" y1=\"%.1f\" y2=\"%.1f\"/><text x=\"%d\" y=\"%.1f\" "
                                + "text-anchor=\"end\" class=\"small\">%s</text>",
                        LEFT,
                        W - RIGHT,
                        py(t),
                        py(t),
                        LEFT - 4,
                        py(t) + 3,
                        label(t)));
            }
            for (double t : ticks(x0, x1)) {
                sb.append(String.format(
                        Locale.ROOT,
                        "<text x=\"%.1f\" y=\"%d\" text-anchor=\"middle\" class=\"small\">%s</text>",
                        px(t),
                        H - BOTTOM + 14,
                        label(t)));
            }
            axisLines(sb, xLabel, yLabel);
        }

        void axesCategorical(StringBuilder sb, List<String> labels, String yLabel) {
            for (double t = 0; t <= 1.0001; t += 0.25) {
                sb.append(String.format(
                        Locale.ROOT,
                        "<line class=\"grid\" x1=\"%d\" x2=\"%d\" y1=\"%.1f\" y2=\"%.1f\"/><text x=\"%d\" y=\"%.1f\" "
                                + "text-anchor=\"end\" class=\"small\">%.0f %%</text>",
                        LEFT,
                        W - RIGHT,
                        py(t),
                        py(t),
                        LEFT - 4,
                        py(t) + 3,
                        t * 100));
            }
            for (int i = 0; i < labels.size(); i++) {
                sb.append(String.format(
                        Locale.ROOT,
                        "<text x=\"%.1f\" y=\"%d\" text-anchor=\"middle\" class=\"small\">%s</text>",
                        px(i + 0.5),
                        H - BOTTOM + 14,
                        SitePlanSvg.esc(labels.get(i))));
            }
            axisLines(sb, "", yLabel);
        }

        private void axisLines(StringBuilder sb, String xLabel, String yLabel) {
            sb.append(String.format(
                    Locale.ROOT,
                    "<line class=\"axis\" x1=\"%d\" x2=\"%d\" y1=\"%d\" y2=\"%d\"/>"
                            + "<line class=\"axis\" x1=\"%d\" x2=\"%d\" y1=\"%d\" y2=\"%d\"/>"
                            + "<text x=\"%d\" y=\"%d\" text-anchor=\"middle\" class=\"small\">%s</text>"
                            + "<text transform=\"translate(12,%d) rotate(-90)\" text-anchor=\"middle\" class=\"small\">%s"
                            + "</text>",
                    LEFT,
                    W - RIGHT,
                    H - BOTTOM,
                    H - BOTTOM,
                    LEFT,
                    LEFT,
                    TOP,
                    H - BOTTOM,
                    (LEFT + W - RIGHT) / 2,
                    H - 6,
                    SitePlanSvg.esc(xLabel),
                    (TOP + H - BOTTOM) / 2,
                    SitePlanSvg.esc(yLabel)));
        }
    }

    /** About five round tick values covering [lo, hi]. */
    static List<Double> ticks(double lo, double hi) {
        double span = hi - lo;
        double raw = span / 5;
        double mag = Math.pow(10, Math.floor(Math.log10(raw)));
        double norm = raw / mag;
        double step = (norm < 1.5 ? 1 : norm < 3 ? 2 : norm < 7 ? 5 : 10) * mag;
        List<Double> out = new ArrayList<>();
        for (double t = Math.ceil(lo / step) * step; t <= hi + 1e-9 * span; t += step) {
            out.add(Math.abs(t) < 1e-12 * span ? 0.0 : t);
        }
        return out;
    }

    private static String label(double v) {
        if (v == Math.rint(v) && Math.abs(v) < 1e9) {
            return String.format(Locale.ROOT, "%.0f", v);
        }
        return String.format(Locale.ROOT, "%.2g", v);
    }
}
