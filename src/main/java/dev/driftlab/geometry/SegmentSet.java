package dev.driftlab.geometry;

import java.util.Arrays;
import java.util.List;

/**
 * An immutable set of line segments in the site frame, in metres, held as parallel primitive
 * arrays so that ray casters can walk them without allocation.
 */
public final class SegmentSet {

    private static final SegmentSet EMPTY = new SegmentSet(new double[0], new double[0], new double[0], new double[0]);

    private final double[] ax;
    private final double[] ay;
    private final double[] bx;
    private final double[] by;

    private SegmentSet(double[] ax, double[] ay, double[] bx, double[] by) {
        this.ax = ax;
        this.ay = ay;
        this.bx = bx;
        this.by = by;
    }

    /** The set with no segments. */
    public static SegmentSet empty() {
        return EMPTY;
    }

    /** A set holding the given segments, in order. */
    public static SegmentSet of(List<Segment> segments) {
        Builder b = builder();
        for (Segment s : segments) {
            b.add(s);
        }
        return b.build();
    }

    /** A new builder. */
    public static Builder builder() {
        return new Builder();
    }

    /** Number of segments. */
    public int size() {
        return ax.length;
    }

    /** First end, east coordinate of segment i, metres. */
    public double ax(int i) {
        return ax[i];
    }

    /** First end, north coordinate of segment i, metres. */
    public double ay(int i) {
        return ay[i];
    }

    /** Second end, east coordinate of segment i, metres. */
    public double bx(int i) {
        return bx[i];
    }

    /** Second end, north coordinate of segment i, metres. */
    public double by(int i) {
        return by[i];
    }

    /** Segment i as a value. */
    public Segment segment(int i) {
        return new Segment(new Point(ax[i], ay[i]), new Point(bx[i], by[i]));
    }

    /** This set followed by another. */
    public SegmentSet concat(SegmentSet other) {
        return builder().addAll(this).addAll(other).build();
    }

    /**
     * Bounding box in metres; for the empty set the box of the origin.
     */
    public Bounds bounds() {
        if (size() == 0) {
            return new Bounds(0, 0, 0, 0);
        }
        double minX = Double.POSITIVE_INFINITY;
        double minY = Double.POSITIVE_INFINITY;
        double maxX = Double.NEGATIVE_INFINITY;
        double maxY = Double.NEGATIVE_INFINITY;
        for (int i = 0; i < size(); i++) {
            minX = Math.min(minX, Math.min(ax[i], bx[i]));
            maxX = Math.max(maxX, Math.max(ax[i], bx[i]));
            minY = Math.min(minY, Math.min(ay[i], by[i]));
            maxY = Math.max(maxY, Math.max(ay[i], by[i]));
        }
        return new Bounds(minX, minY, maxX, maxY);
    }

    /**
     * Shortest distance from a point to any segment, in metres, by brute force; positive infinity
     * for the empty set. Meant for small sets and tests; use {@link SegmentCaster#clearance} for
     * large ones.
     */
    public double distanceTo(double x, double y) {
        double best = Double.POSITIVE_INFINITY;
        for (int i = 0; i < size(); i++) {
            best = Math.min(best, Segment.distanceSquared(ax[i], ay[i], bx[i], by[i], x, y));
        }
        return Math.sqrt(best);
    }

    /** Collects segments; not thread-safe. */
    public static final class Builder {
        private double[] ax = new double[16];
        private double[] ay = new double[16];
        private double[] bx = new double[16];
        private double[] by = new double[16];
        private int n;

        private Builder() {}

        /**
         * Adds a segment from (ax, ay) to (bx, by), metres.
         *
         * @throws IllegalArgumentException if a coordinate is not finite
         */
        public Builder add(double ax, double ay, double bx, double by) {
            if (!Double.isFinite(ax) || !Double.isFinite(ay) || !Double.isFinite(bx) || !Double.isFinite(by)) {
                throw new IllegalArgumentException("segment coordinates must be finite");
            }
            if (n == this.ax.length) {
                int cap = n * 2;
                this.ax = Arrays.copyOf(this.ax, cap);
                this.ay = Arrays.copyOf(this.ay, cap);
                this.bx = Arrays.copyOf(this.bx, cap);
                this.by = Arrays.copyOf(this.by, cap);
            }
            this.ax[n] = ax;
            this.ay[n] = ay;
            this.bx[n] = bx;
            this.by[n] = by;
            n++;
            return this;
        }

        /** Adds a segment. */
        public Builder add(Segment s) {
            return add(s.a().x(), s.a().y(), s.b().x(), s.b().y());
        }

        /** Adds every edge of a closed polygon. */
        public Builder addOutline(Polygon polygon) {
            for (int i = 0; i < polygon.edgeCount(); i++) {
                add(polygon.edge(i));
            }
            return this;
        }

        /** Adds every segment of a set. */
        public Builder addAll(SegmentSet set) {
            for (int i = 0; i < set.size(); i++) {
                add(set.ax[i], set.ay[i], set.bx[i], set.by[i]);
            }
            return this;
        }

        /** The immutable set. */
        public SegmentSet build() {
            return new SegmentSet(
                    Arrays.copyOf(ax, n), Arrays.copyOf(ay, n), Arrays.copyOf(bx, n), Arrays.copyOf(by, n));
        }
    }
}
