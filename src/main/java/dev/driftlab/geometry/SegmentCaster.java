package dev.driftlab.geometry;

/**
 * Exact ray caster on line segments, indexed by a uniform grid of buckets and walked with a 2-D
 * digital differential analyser (Amanatides and Woo, "A Fast Voxel Traversal Algorithm", 1987).
 * Each bucket lists the segments that pass through its square; their coordinates are copied into
 * bucket order so that one bucket is read from contiguous memory.
 *
 * <p>Immutable and thread-safe once built; nothing is allocated per ray. A ray that runs exactly
 * along a segment (parallel and on it) does not count as hitting that segment.
 */
public final class SegmentCaster implements RayCaster {

    /** Margin in metres by which bucket squares are grown when filing segments, against rounding. */
    private static final double FILE_MARGIN = 1e-7;

    private static final int MAX_BUCKETS = 4_000_000;

    private final SegmentSet segments;
    private final double minX;
    private final double minY;
    private final double maxX;
    private final double maxY;
    private final double bucket;
    private final int nx;
    private final int ny;
    private final int[] start;
    private final double[] itemAx;
    private final double[] itemAy;
    private final double[] itemEx;
    private final double[] itemEy;

    private SegmentCaster(SegmentSet segments, double bucketSize) {
        this.segments = segments;
        Bounds b = segments.bounds().padded(Math.max(bucketSize * 0.5, 1e-3));
        this.minX = b.minX();
        this.minY = b.minY();
        this.bucket = bucketSize;
        this.nx = Math.max(1, (int) Math.ceil((b.maxX() - minX) / bucketSize));
        this.ny = Math.max(1, (int) Math.ceil((b.maxY() - minY) / bucketSize));
        this.maxX = minX + nx * bucketSize;
        this.maxY = minY + ny * bucketSize;
        int cells = nx * ny;
        int[] counts = new int[cells + 1];
        // two passes over the same filing rule: count, then fill
        fileAll(counts, null);
        this.start = new int[cells + 1];
        for (int c = 0; c < cells; c++) {
            start[c + 1] = start[c] + counts[c];
        }
        int total = start[cells];
        int[] items = new int[total];
        int[] cursor = java.util.Arrays.copyOf(start, cells);
        fileAll(cursor, items);
        this.itemAx = new double[total];
        this.itemAy = new double[total];
        this.itemEx = new double[total];
        this.itemEy = new double[total];
        for (int k = 0; k < total; k++) {
            int s = items[k];
            itemAx[k] = segments.ax(s);
            itemAy[k] = segments.ay(s);
            itemEx[k] = segments.bx(s) - segments.ax(s);
            itemEy[k] = segments.by(s) - segments.ay(s);
        }
    }

    /**
     * Builds the caster with a bucket size chosen from the site's extent and segment count (about
     * one segment per bucket, between 0.25 m and 2 m).
     */
    public static SegmentCaster of(SegmentSet segments) {
        Bounds b = segments.bounds();
        double area = Math.max(1.0, (b.width() + 1) * (b.height() + 1));
        double size = Math.sqrt(area / Math.max(1, segments.size()));
        size = Math.max(0.25, Math.min(2.0, size));
        while ((area / (size * size)) > MAX_BUCKETS) {
            size *= 2;
        }
        return new SegmentCaster(segments, size);
    }

    /**
     * Builds the caster with a given bucket size.
     *
     * @param bucketSize side of a bucket square in metres, positive
     * @throws IllegalArgumentException if the size is not positive or gives too many buckets
     */
    public static SegmentCaster of(SegmentSet segments, double bucketSize) {
        if (!(bucketSize > 0) || !Double.isFinite(bucketSize)) {
            throw new IllegalArgumentException("bucketSize must be positive, got " + bucketSize);
        }
        Bounds b = segments.bounds();
        double buckets = (b.width() / bucketSize + 2) * (b.height() / bucketSize + 2);
        if (buckets > MAX_BUCKETS) {
            throw new IllegalArgumentException("bucketSize " + bucketSize + " gives too many buckets");
        }
        return new SegmentCaster(segments, bucketSize);
    }

    /** The segments this caster sees. */
    public SegmentSet segments() {
        return segments;
    }

    private void fileAll(int[] cursor, int[] items) {
        for (int s = 0; s < segments.size(); s++) {
            double ax = segments.ax(s);
            double ay = segments.ay(s);
            double bx = segments.bx(s);
            double by = segments.by(s);
            int i0 = clampX((int) Math.floor((Math.min(ax, bx) - FILE_MARGIN - minX) / bucket));
            int i1 = clampX((int) Math.floor((Math.max(ax, bx) + FILE_MARGIN - minX) / bucket));
            int j0 = clampY((int) Math.floor((Math.min(ay, by) - FILE_MARGIN - minY) / bucket));
            int j1 = clampY((int) Math.floor((Math.max(ay, by) + FILE_MARGIN - minY) / bucket));
            for (int j = j0; j <= j1; j++) {
                for (int i = i0; i <= i1; i++) {
                    if (touchesBox(ax, ay, bx, by, i, j)) {
                        int c = j * nx + i;
                        if (items == null) {
                            cursor[c]++;
                        } else {
                            items[cursor[c]++] = s;
                        }
                    }
                }
            }
        }
    }

    /** Whether the segment's line passes through the grown bucket square (corners not all on one side). */
    private boolean touchesBox(double ax, double ay, double bx, double by, int i, int j) {
        double x0 = minX + i * bucket - FILE_MARGIN;
        double y0 = minY + j * bucket - FILE_MARGIN;
        double x1 = x0 + bucket + 2 * FILE_MARGIN;
        double y1 = y0 + bucket + 2 * FILE_MARGIN;
        double ex = bx - ax;
        double ey = by - ay;
        double s1 = ex * (y0 - ay) - ey * (x0 - ax);
        double s2 = ex * (y0 - ay) - ey * (x1 - ax);
        double s3 = ex * (y1 - ay) - ey * (x0 - ax);
        double s4 = ex * (y1 - ay) - ey * (x1 - ax);
        boolean allPos = s1 > 0 && s2 > 0 && s3 > 0 && s4 > 0;
        boolean allNeg = s1 < 0 && s2 < 0 && s3 < 0 && s4 < 0;
        return !(allPos || allNeg);
    }

    private int clampX(int i) {
        return Math.max(0, Math.min(nx - 1, i));
    }

    private int clampY(int j) {
        return Math.max(0, Math.min(ny - 1, j));
    }

    /** {@inheritDoc} */
    @Override
    public double cast(double ox, double oy, double angle, double maxRange) {
        double dx = Math.cos(angle);
        double dy = Math.sin(angle);
        // clip the ray to the index box: outside it there is nothing to hit
        double t0 = 0;
        double t1 = maxRange;
        if (dx != 0) {
            double ta = (minX - ox) / dx;
            double tb = (maxX - ox) / dx;
            t0 = Math.max(t0, Math.min(ta, tb));
            t1 = Math.min(t1, Math.max(ta, tb));
        } else if (ox < minX || ox > maxX) {
            return maxRange;
        }
        if (dy != 0) {
            double ta = (minY - oy) / dy;
            double tb = (maxY - oy) / dy;
            t0 = Math.max(t0, Math.min(ta, tb));
            t1 = Math.min(t1, Math.max(ta, tb));
        } else if (oy < minY || oy > maxY) {
            return maxRange;
        }
        if (t0 > t1) {
            return maxRange;
        }
        double px = ox + t0 * dx;
        double py = oy + t0 * dy;
        int ix = clampX((int) Math.floor((px - minX) / bucket));
        int iy = clampY((int) Math.floor((py - minY) / bucket));
        int stepX = dx > 0 ? 1 : -1;
        int stepY = dy > 0 ? 1 : -1;
        double tMaxX = dx != 0 ? ((minX + (ix + (dx > 0 ? 1 : 0)) * bucket) - ox) / dx : Double.POSITIVE_INFINITY;
        double tMaxY = dy != 0 ? ((minY + (iy + (dy > 0 ? 1 : 0)) * bucket) - oy) / dy : Double.POSITIVE_INFINITY;
        double tDeltaX = dx != 0 ? bucket / Math.abs(dx) : Double.POSITIVE_INFINITY;
        double tDeltaY = dy != 0 ? bucket / Math.abs(dy) : Double.POSITIVE_INFINITY;
        double best = maxRange;
        int guard = nx + ny + 2;
        while (guard-- > 0) {
            int c = iy * nx + ix;
            for (int k = start[c], end = start[c + 1]; k < end; k++) {
                double ex = itemEx[k];
                double ey = itemEy[k];
                double denom = dx * ey - dy * ex;
                if (denom == 0) {
                    continue;
                }
                double wx = itemAx[k] - ox;
                double wy = itemAy[k] - oy;
                double t = (wx * ey - wy * ex) / denom;
                if (t < 0 || t >= best) {
                    continue;
                }
                double s = (wx * dy - wy * dx) / denom;
                if (s >= 0 && s <= 1) {
                    best = t;
                }
            }
            double exit = Math.min(tMaxX, tMaxY);
            if (best <= exit || exit >= t1) {
                break;
            }
            if (tMaxX < tMaxY) {
                ix += stepX;
                if (ix < 0 || ix >= nx) {
                    break;
                }
                tMaxX += tDeltaX;
            } else {
                iy += stepY;
                if (iy < 0 || iy >= ny) {
                    break;
                }
                tMaxY += tDeltaY;
            }
        }
        return best;
    }

    /**
     * Shortest distance in metres from a point to any segment, looked up only within a radius:
     * returns {@code limit} when nothing is closer than that.
     *
     * @param x east, metres
     * @param y north, metres
     * @param limit search radius in metres, not negative
     */
    public double clearance(double x, double y, double limit) {
        int i0 = clampX((int) Math.floor((x - limit - minX) / bucket));
        int i1 = clampX((int) Math.floor((x + limit - minX) / bucket));
        int j0 = clampY((int) Math.floor((y - limit - minY) / bucket));
        int j1 = clampY((int) Math.floor((y + limit - minY) / bucket));
        if (x + limit < minX || x - limit > maxX || y + limit < minY || y - limit > maxY) {
            return limit;
        }
        double best = limit * limit;
        for (int j = j0; j <= j1; j++) {
            for (int i = i0; i <= i1; i++) {
                int c = j * nx + i;
                for (int k = start[c], end = start[c + 1]; k < end; k++) {
                    double ax = itemAx[k];
                    double ay = itemAy[k];
                    double d2 = Segment.distanceSquared(ax, ay, ax + itemEx[k], ay + itemEy[k], x, y);
                    if (d2 < best) {
                        best = d2;
                    }
                }
            }
        }
        return Math.sqrt(best);
    }
}
