package dev.driftlab.geometry;

import java.util.List;
import java.util.Optional;

/**
 * A closed polygon given by its corners in order (either winding), in metres. Edge {@code i} runs
 * from corner {@code i} to corner {@code i + 1} (the last edge closes back to corner 0). The
 * constructor only checks that corners are present; whether the outline is usable (3 or more
 * corners, not crossing itself) is a validation question answered by {@link #selfCrossing()}.
 *
 * @param corners corners in order, without repeating the first at the end
 */
public record Polygon(List<Point> corners) {

    /** Copies the corner list. */
    public Polygon {
        corners = List.copyOf(corners);
    }

    /** Factory from corners. */
    public static Polygon of(List<Point> corners) {
        return new Polygon(corners);
    }

    /** Axis-aligned rectangle from its lower-left corner and size, counter-clockwise. */
    public static Polygon rectangle(double x, double y, double width, double height) {
        return new Polygon(List.of(
                new Point(x, y), new Point(x + width, y), new Point(x + width, y + height), new Point(x, y + height)));
    }

    /** Number of edges (equals the number of corners). */
    public int edgeCount() {
        return corners.size();
    }

    /** Edge {@code i}, from corner i to corner i+1. */
    public Segment edge(int i) {
        return new Segment(corners.get(i), corners.get((i + 1) % corners.size()));
    }

    /** Signed area in square metres: positive when the corners run counter-clockwise. */
    public double signedArea() {
        double s = 0;
        int n = corners.size();
        for (int i = 0; i < n; i++) {
            Point p = corners.get(i);
            Point q = corners.get((i + 1) % n);
            s += p.x() * q.y() - q.x() * p.y();
        }
        return s / 2;
    }

    /** Area in square metres. */
    public double area() {
        return Math.abs(signedArea());
    }

    /** Whether the point lies strictly inside or on the boundary (even-odd rule). */
    public boolean contains(Point p) {
        return contains(p.x(), p.y());
    }

    /** Primitive form of {@link #contains(Point)}. */
    public boolean contains(double px, double py) {
        int n = corners.size();
        if (n < 3) {
            return false;
        }
        boolean inside = false;
        for (int i = 0, j = n - 1; i < n; j = i++) {
            Point a = corners.get(i);
            Point b = corners.get(j);
            if (Segment.distanceSquared(a.x(), a.y(), b.x(), b.y(), px, py) == 0) {
                return true;
            }
            if ((a.y() > py) != (b.y() > py)) {
                double xCross = (b.x() - a.x()) * (py - a.y()) / (b.y() - a.y()) + a.x();
                if (px < xCross) {
                    inside = !inside;
                }
            }
        }
        return inside;
    }

    /** Shortest distance from a point to the outline (not the interior), in metres. */
    public double distanceToOutline(Point p) {
        double best = Double.POSITIVE_INFINITY;
        for (int i = 0; i < corners.size(); i++) {
            Point a = corners.get(i);
            Point b = corners.get((i + 1) % corners.size());
            best = Math.min(best, Segment.distanceSquared(a.x(), a.y(), b.x(), b.y(), p.x(), p.y()));
        }
        return Math.sqrt(best);
    }

    /**
     * The first pair of edges that cross or touch other than at their shared corner, if any, as
     * {@code {i, j}} with i &lt; j. Repeated corners count as a crossing. Quadratic in the corner
     * count, which the validator bounds.
     */
    public Optional<int[]> selfCrossing() {
        int n = corners.size();
        if (n < 3) {
            return Optional.empty();
        }
        for (int i = 0; i < n; i++) {
            Segment ei = edge(i);
            if (ei.length() == 0) {
                return Optional.of(new int[] {i, (i + 1) % n});
            }
            for (int j = i + 1; j < n; j++) {
                boolean adjacent = j == i + 1 || (i == 0 && j == n - 1);
                Segment ej = edge(j);
                if (adjacent) {
                    // adjacent edges share one corner; they are bad only if they fold back on each other
                    if (foldsBack(i, j)) {
                        return Optional.of(new int[] {i, j});
                    }
                    continue;
                }
                if (ei.intersects(ej)) {
                    return Optional.of(new int[] {i, j});
                }
            }
        }
        return Optional.empty();
    }

    private boolean foldsBack(int i, int j) {
        int n = corners.size();
        // shared corner and the two far ends
        int shared = (j == i + 1) ? j : i;
        Point c = corners.get(shared);
        Point p = corners.get((shared - 1 + n) % n);
        Point q = corners.get((shared + 1) % n);
        double cross = (p.x() - c.x()) * (q.y() - c.y()) - (p.y() - c.y()) * (q.x() - c.x());
        double dot = (p.x() - c.x()) * (q.x() - c.x()) + (p.y() - c.y()) * (q.y() - c.y());
        return cross == 0 && dot > 0;
    }

    /**
     * Bounding box of the corners.
     *
     * @throws IllegalArgumentException if the polygon has no corners
     */
    public Bounds bounds() {
        return Bounds.around(corners);
    }
}
