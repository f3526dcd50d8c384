package dev.driftlab.report;

import dev.driftlab.geometry.Bounds;
import dev.driftlab.geometry.Pose;
import dev.driftlab.recording.Frame;
import dev.driftlab.recording.FrameHypothesis;
import dev.driftlab.scenario.Scenario;
import java.util.Locale;

/**
 * Draws one recorded frame over the site plan as SVG, for reports and key-frame images: the
 * believed map, particles shaded by weight, scan end points seen from the true pose, the true
 * robot, the estimate and the hypotheses' one-sigma ellipses. North is up.
 */
public final class FrameSvg {

    private static final double SCALE = 24;
    private static final double MARGIN = 0.6;

    private FrameSvg() {}

    /**
     * Renders a frame.
     *
     * @param scenario the scenario the frame belongs to
     * @param frame the frame
     * @param beamAngles beam angles in the sensor frame, radians (one per range), for the scan layer
     * @param caption text under the picture
     */
    public static String render(Scenario scenario, Frame frame, double[] beamAngles, String caption) {
        return render(scenario, SitePlanSvg.render(scenario), frame, beamAngles, caption);
    }

    /**
     * Elements the drawing of a frame has, known before it is drawn.
     *
     * @param planElements {@link SitePlanSvg.Plan#elements()} of the scenario's plan
     */
    static int elements(int planElements, Frame frame, double[] beamAngles) {
        int n = 3 + (planElements - 1); // svg, background, nested plan svg in place of the plan's own
        int step = particleStep(frame);
        n += 1 + (frame.particleCount() + step - 1) / step;
        if (beamAngles.length == frame.ranges().length) {
            int beamStep = beamStep(beamAngles);
            n += 1 + (beamAngles.length + beamStep - 1) / beamStep;
        }
        n += 2 * frame.hypotheses().size(); // ellipse and its title
        n += 2 * 4; // estimate and truth: group, title, disc, heading line
        return n + 1; // caption
    }

    private static int particleStep(Frame frame) {
        return Math.max(1, frame.particleCount() / 3000);
    }

    private static int beamStep(double[] beamAngles) {
        return Math.max(1, beamAngles.length / 180);
    }

    /** A frame over a plan drawn already ({@link SitePlanSvg#render}), so many frames share one. */
    static String render(Scenario scenario, String plan, Frame frame, double[] beamAngles, String shownCaption) {
        // a localizer that shows no particles: say so, so an empty picture is not read as an empty belief
        String caption =
                frame.particleCount() == 0 ? shownCaption + " (the localizer reported no particles)" : shownCaption;
        Bounds b = SitePlanSvg.bounds(scenario).padded(MARGIN);
        double minX = b.minX();
        double maxY = b.maxY();
        double w = b.width() * SCALE;
        double h = b.height() * SCALE;
        StringBuilder sb = new StringBuilder(64 * 1024);
        sb.append(String.format(
                Locale.ROOT,
                "<svg xmlns=\"http://www.w3.org/2000/svg\" class=\"frame\" viewBox=\"0 0 %.1f %.1f\" width=\"%.0f\" "
                        + "height=\"%.0f\" role=\"img\" aria-label=\"%s\">",
                w,
                h + 22,
                w,
                h + 22,
                SitePlanSvg.esc(caption)));
        sb.append("<rect width=\"100%\" height=\"100%\" fill=\"#fbfbf8\"/>");
        // the plan drawing scales with the same factor when nested with a matching viewBox
        int vb = plan.indexOf("viewBox=\"") + 9;
        String viewBox = plan.substring(vb, plan.indexOf('"', vb));
        String inner = plan.substring(plan.indexOf('>') + 1);
        sb.append(String.format(
                        Locale.ROOT,
                        "<svg x=\"0\" y=\"0\" width=\"%.1f\" height=\"%.1f\" viewBox=\"%s\">",
                        w,
                        h,
                        viewBox))
                .append(inner);
        Mapper m = new Mapper(minX, maxY);
        // particles, darker for heavier
        float wMax = 0;
        for (float pw : frame.particleWeight()) {
            wMax = Math.max(wMax, pw);
        }
        int step = particleStep(frame);
        sb.append("<g class=\"particles\">");
        for (int i = 0; i < frame.particleCount(); i += step) {
            double shade = wMax > 0 ? Math.max(0.15, Math.min(1, frame.particleWeight()[i] / wMax)) : 0.5;
            sb.append(String.format(
                    Locale.ROOT,
                    "<circle cx=\"%.1f\" cy=\"%.1f\" r=\"1.6\" fill=\"#6a3d9a\" " + "fill-opacity=\"%.2f\"/>",
                    m.x(frame.particleX()[i]),
                    m.y(frame.particleY()[i]),
                    shade));
        }
        sb.append("</g>");
        // scan end points from the true pose
        Pose t = frame.truth();
        if (beamAngles.length == frame.ranges().length) {
            Pose sensor = t; // mount offsets are centimetres: drawn from the robot centre at this scale
            sb.append("<g class=\"scan\">");
            for (int i = 0; i < beamAngles.length; i += beamStep(beamAngles)) {
                double a = sensor.heading() + beamAngles[i];
                double r = frame.ranges()[i];
                sb.append(String.format(
                        Locale.ROOT,
                        // squares, so scan ends differ from the round particles in shape, not only in colour
                        "<rect x=\"%.1f\" y=\"%.1f\" width=\"2.6\" height=\"2.6\" fill=\"#D55E00\"/>",
                        m.x(sensor.x() + r * Math.cos(a)) - 1.3,
                        m.y(sensor.y() + r * Math.sin(a)) - 1.3));
            }
            sb.append("</g>");
        }
        for (FrameHypothesis hy : frame.hypotheses()) {
            ellipse(sb, m, hy);
        }
        robot(sb, m, frame.estimate(), "#0072B2", "estimate", false);
        robot(sb, m, t, "#009E73", "true pose", true);
        sb.append(String.format(
                Locale.ROOT,
                "<text x=\"6\" y=\"%.1f\" style=\"font:12px system-ui,sans-serif;" + "fill:#3b4651\">%s</text>",
                h + 16,
                SitePlanSvg.esc(caption)));
        return sb.append("</svg>").toString();
    }

    /** The true robot is a filled disc, the estimate an open ring: they differ in shape, not only hue. */
    private static void robot(StringBuilder sb, Mapper m, Pose p, String colour, String title, boolean filled) {
        double c = Math.cos(p.heading());
        double s = Math.sin(p.heading());
        sb.append(String.format(
                Locale.ROOT,
                "<g><title>%s</title><circle cx=\"%.1f\" cy=\"%.1f\" r=\"%.1f\" fill=\"%s\" stroke=\"%s\" "
                        + "stroke-width=\"2.5\"/><line x1=\"%.1f\" y1=\"%.1f\" x2=\"%.1f\" y2=\"%.1f\" stroke=\"%s\" "
                        + "stroke-width=\"2.5\"/></g>",
                title,
                m.x(p.x()),
                m.y(p.y()),
                0.3 * SCALE,
                filled ? colour : "none",
                filled ? "#0b2f25" : colour,
                m.x(p.x()),
                m.y(p.y()),
                m.x(p.x() + 0.5 * c),
                m.y(p.y() + 0.5 * s),
                filled ? "#0b2f25" : colour));
    }

    private static void ellipse(StringBuilder sb, Mapper m, FrameHypothesis h) {
        // one-sigma ellipse from the eigen-decomposition of the 2x2 position covariance
        double a = h.cxx();
        double b = h.cxy();
        double d = h.cyy();
        if (!Double.isFinite(a + b + d)) {
            // no covariance reported: a cross at the place, never an ellipse of made-up size
            double x = m.x(h.x());
            double y = m.y(h.y());
            sb.append(String.format(
                    Locale.ROOT,
                    "<path d=\"M%.1f %.1fH%.1fM%.1f %.1fV%.1f\" stroke=\"#0072B2\" stroke-width=\"1.5\">"
                            + "<title>hypothesis, weight %.2f, no spread reported</title></path>",
                    x - 5,
                    y,
                    x + 5,
                    x,
                    y - 5,
                    y + 5,
                    h.weight()));
            return;
        }
        double tr = (a + d) / 2;
        double det = Math.sqrt(Math.max(0, (a - d) * (a - d) / 4 + b * b));
        double l1 = Math.max(1e-6, tr + det);
        double l2 = Math.max(1e-6, tr - det);
        double angle = Math.toDegrees(Math.atan2(l1 - a, b == 0 ? 1e-12 : b));
        if (b == 0) {
            angle = a >= d ? 0 : 90;
        }
        sb.append(String.format(
                Locale.ROOT,
                "<ellipse cx=\"%.1f\" cy=\"%.1f\" rx=\"%.1f\" ry=\"%.1f\" transform=\"rotate(%.1f %.1f %.1f)\" "
                        + "fill=\"#0072B2\" fill-opacity=\"0.08\" stroke=\"#0072B2\" stroke-dasharray=\"4 2\">"
                        + "<title>hypothesis, weight %.2f</title></ellipse>",
                m.x(h.x()),
                m.y(h.y()),
                Math.max(2, Math.sqrt(l1) * SCALE),
                Math.max(2, Math.sqrt(l2) * SCALE),
                -angle,
                m.x(h.x()),
                m.y(h.y()),
                h.weight()));
    }

    private record Mapper(double minX, double maxY) {
        double x(double v) {
            return (v - minX) * SCALE;
        }

        double y(double v) {
            return (maxY - v) * SCALE;
        }
    }
}
