package dev.driftlab.geometry;

/**
 * A point in the site frame, in metres. x grows to the east (right), y to the north (up).
 *
 * @param x east coordinate in metres
 * @param y north coordinate in metres
 */
public record Point(double x, double y) {

    /** Checks that both coordinates are finite. */
    public Point {
        if (!Double.isFinite(x) || !Double.isFinite(y)) {
            throw new IllegalArgumentException("point coordinates must be finite, got (" + x + ", " + y + ")");
        }
    }

    /** Factory for readability at call sites. */
    public static Point of(double x, double y) {
        return new Point(x, y);
    }

    /** Euclidean distance to another point, in metres. */
    public double distanceTo(Point other) {
        return Math.hypot(other.x - x, other.y - y);
    }
}
