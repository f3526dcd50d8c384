package dev.driftlab.geometry;

/**
 * A straight line segment between two points, in metres.
 *
 * @param a first end
 * @param b second end
 */
public record Segment(Point a, Point b) {

    /** Checks the ends are present. */
    public Segment {
        if (a == null || b == null) {
            throw new IllegalArgumentException("segment ends must be given");
        }
    }

    /** Length in metres. */
    public double length() {
        return a.distanceTo(b);
    }

    /** Shortest distance from a point to this segment, in metres. */
    public double distanceTo(Point p) {
        return Math.sqrt(distanceSquared(a.x(), a.y(), b.x(), b.y(), p.x(), p.y()));
    }

    /** Squared distance from (px, py) to the segment (ax, ay)-(bx, by); no allocation. */
    public static double distanceSquared(double ax, double ay, double bx, double by, double px, double py) {
        double dx = bx - ax;
        double dy = by - ay;
        double len2 = dx * dx + dy * dy;
        double t = len2 == 0 ? 0 : ((px - ax) * dx + (py - ay) * dy) / len2;
        t = Math.max(0, Math.min(1, t));
        double ex = ax + t * dx - px;
        double ey = ay + t * dy - py;
        return ex * ex + ey * ey;
    }

    /**
     * Whether this segment and another touch or cross, including collinear overlap. Uses exact
     * orientation signs on the given doubles.
     */
    public boolean intersects(Segment o) {
        return intersects(a.x(), a.y(), b.x(), b.y(), o.a.x(), o.a.y(), o.b.x(), o.b.y());
    }

    /** Primitive form of {@link #intersects(Segment)}. */
    public static boolean intersects(
            double p1x, double p1y, double p2x, double p2y, double q1x, double q1y, double q2x, double q2y) {
        int d1 = orientation(q1x, q1y, q2x, q2y, p1x, p1y);
        int d2 = orientation(q1x, q1y, q2x, q2y, p2x, p2y);
        int d3 = orientation(p1x, p1y, p2x, p2y, q1x, q1y);
        int d4 = orientation(p1x, p1y, p2x, p2y, q2x, q2y);
        if (d1 * d2 < 0 && d3 * d4 < 0) {
            return true;
        }
        return (d1 == 0 && onBox(q1x, q1y, q2x, q2y, p1x, p1y))
                || (d2 == 0 && onBox(q1x, q1y, q2x, q2y, p2x, p2y))
                || (d3 == 0 && onBox(p1x, p1y, p2x, p2y, q1x, q1y))
                || (d4 == 0 && onBox(p1x, p1y, p2x, p2y, q2x, q2y));
    }

    private static int orientation(double ax, double ay, double bx, double by, double cx, double cy) {
        double v = (bx - ax) * (cy - ay) - (by - ay) * (cx - ax);
        return v > 0 ? 1 : (v < 0 ? -1 : 0);
    }

    private static boolean onBox(double ax, double ay, double bx, double by, double px, double py) {
        return px >= Math.min(ax, bx) && px <= Math.max(ax, bx) && py >= Math.min(ay, by) && py <= Math.max(ay, by);
    }
}
