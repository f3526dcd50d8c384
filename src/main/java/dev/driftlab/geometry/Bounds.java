package dev.driftlab.geometry;

import java.util.Collection;

/**
 * An axis-aligned box in metres: the one form in which a site's, an outline's or a segment set's
 * extent travels. Hot loops copy the four numbers into primitive fields once.
 *
 * @param minX west edge
 * @param minY south edge
 * @param maxX east edge, not below minX
 * @param maxY north edge, not below minY
 */
public record Bounds(double minX, double minY, double maxX, double maxY) {

    /** Checks that no edge is NaN and that each maximum is at least its minimum. */
    public Bounds {
        if (Double.isNaN(minX) || Double.isNaN(minY) || Double.isNaN(maxX) || Double.isNaN(maxY)) {
            throw new IllegalArgumentException("bounds must be numbers, got minX " + minX + ", minY " + minY + ", maxX "
                    + maxX + ", maxY " + maxY);
        }
        if (maxX < minX) {
            throw new IllegalArgumentException("bounds maxX " + maxX + " is below minX " + minX);
        }
        if (maxY < minY) {
            throw new IllegalArgumentException("bounds maxY " + maxY + " is below minY " + minY);
        }
    }

    /** The box of one point (zero width and height). */
    public static Bounds of(double x, double y) {
        return new Bounds(x, y, x, y);
    }

    /**
     * The smallest box holding every point.
     *
     * @throws IllegalArgumentException if there are no points
     */
    public static Bounds around(Collection<Point> points) {
        if (points.isEmpty()) {
            throw new IllegalArgumentException("no points to bound");
        }
        double minX = Double.POSITIVE_INFINITY;
        double minY = Double.POSITIVE_INFINITY;
        double maxX = Double.NEGATIVE_INFINITY;
        double maxY = Double.NEGATIVE_INFINITY;
        for (Point p : points) {
            minX = Math.min(minX, p.x());
            minY = Math.min(minY, p.y());
            maxX = Math.max(maxX, p.x());
            maxY = Math.max(maxY, p.y());
        }
        return new Bounds(minX, minY, maxX, maxY);
    }

    /** East-west extent in metres. */
    public double width() {
        return maxX - minX;
    }

    /** North-south extent in metres. */
    public double height() {
        return maxY - minY;
    }

    /**
     * The box grown by a margin on every side.
     *
     * @param margin metres, not negative
     * @throws IllegalArgumentException if the margin is negative or not a number
     */
    public Bounds padded(double margin) {
        if (!(margin >= 0)) {
            throw new IllegalArgumentException("margin must be >= 0, got " + margin);
        }
        return new Bounds(minX - margin, minY - margin, maxX + margin, maxY + margin);
    }

    /** Whether the point lies in the box, edges included. */
    public boolean contains(double x, double y) {
        return x >= minX && x <= maxX && y >= minY && y <= maxY;
    }

    /** The smallest box holding both. */
    public Bounds union(Bounds o) {
        return new Bounds(
                Math.min(minX, o.minX), Math.min(minY, o.minY), Math.max(maxX, o.maxX), Math.max(maxY, o.maxY));
    }
}
