package dev.driftlab.geometry;

/**
 * Fast ray caster on an occupancy grid. Far from obstacles it leaps along the ray by the distance
 * field (sphere tracing, kept conservative by the cell diagonal); near them it walks cell by cell,
 * so that it never steps over an occupied cell. The reported range is where the ray enters the
 * first occupied cell, so it is never longer than the exact range to a wall that was rasterised
 * into the grid, and shorter by at most the ray's length inside one cell near the wall.
 *
 * <p>Outside the grid counts as free. Immutable and thread-safe; nothing is allocated per ray.
 */
public final class GridCaster implements RayCaster {

    /** Leap only when at least this many whole cells from the nearest occupied centre; below, walk. */
    private static final int LEAP_FROM = 3;

    /**
     * Safety margin in cells subtracted from a leap: the ray point may be half a diagonal from its
     * cell centre and an occupied cell extends half a diagonal around its own, sqrt(2) together.
     */
    private static final double LEAP_MARGIN = 1.5;

    private static final double NUDGE = 1e-9;

    /**
     * Distance field in whole cells, rounded down and capped at 255, one byte per cell: 0 exactly
     * on occupied cells. A quarter of the float field's memory keeps the random lookups of a ray
     * in cache; rounding down keeps every leap conservative.
     */
    private final byte[] dist;

    private final int width;
    private final int height;
    private final double originX;
    private final double originY;
    private final double cellSize;
    private final double inverseCell;

    /** A caster on the grid behind the given distance field. */
    public GridCaster(DistanceField field) {
        OccupancyGrid g = field.grid();
        float[] cells = field.cellUnits();
        this.dist = new byte[cells.length];
        for (int k = 0; k < cells.length; k++) {
            dist[k] = (byte) (int) Math.min(255f, (float) Math.floor(cells[k]));
        }
        this.width = g.width();
        this.height = g.height();
        this.originX = g.originX();
        this.originY = g.originY();
        this.cellSize = g.cellSize();
        this.inverseCell = 1.0 / cellSize;
    }

    /** {@inheritDoc} */
    @Override
    public double cast(double x, double y, double angle, double maxRange) {
        return castAlong(x, y, Math.cos(angle), Math.sin(angle), maxRange);
    }

    /** {@inheritDoc} */
    @Override
    public double castAlong(double x, double y, double dx, double dy, double maxRange) {
        double gx = (x - originX) * inverseCell;
        double gy = (y - originY) * inverseCell;
        double t = clipStart(gx, gy, dx, dy);
        double tEnd = clipEnd(gx, gy, dx, dy, maxRange);
        while (t < tEnd) {
            double next = step(gx, gy, dx, dy, t);
            if (next < 0) {
                return t * cellSize;
            }
            t = next;
        }
        return maxRange;
    }

    /**
     * Casts many rays from one origin (a particle's sensor) along unit directions, four at a time in
     * lockstep. The rays are independent, so the processor overlaps their distance-field lookups
     * instead of waiting on each in turn; results equal {@link #castAlong} bit for bit.
     *
     * @param x origin east, metres
     * @param y origin north, metres
     * @param dirX east components of the unit directions
     * @param dirY north components of the unit directions
     * @param from first ray index
     * @param count number of rays
     * @param maxRange longest range reported, metres
     * @param out ranges out, metres, at the same indices (max range on a miss)
     */
    public void castAlongMany(
            double x, double y, double[] dirX, double[] dirY, int from, int count, double maxRange, double[] out) {
        int k = from;
        int end = from + count;
        for (; k + 4 <= end; k += 4) {
            castFour(x, y, dirX, dirY, k, maxRange, out);
        }
        for (; k < end; k++) {
            out[k] = castAlong(x, y, dirX[k], dirY[k], maxRange);
        }
    }

    private void castFour(double x, double y, double[] dirX, double[] dirY, int k, double maxRange, double[] out) {
        double gx = (x - originX) * inverseCell;
        double gy = (y - originY) * inverseCell;
        double dx0 = dirX[k];
        double dy0 = dirY[k];
        double dx1 = dirX[k + 1];
        double dy1 = dirY[k + 1];
        double dx2 = dirX[k + 2];
        double dy2 = dirY[k + 2];
        double dx3 = dirX[k + 3];
        double dy3 = dirY[k + 3];
        double s0 = clipStart(gx, gy, dx0, dy0);
        double s1 = clipStart(gx, gy, dx1, dy1);
        double s2 = clipStart(gx, gy, dx2, dy2);
        double s3 = clipStart(gx, gy, dx3, dy3);
        double e0 = clipEnd(gx, gy, dx0, dy0, maxRange);
        double e1 = clipEnd(gx, gy, dx1, dy1, maxRange);
        double e2 = clipEnd(gx, gy, dx2, dy2, maxRange);
        double e3 = clipEnd(gx, gy, dx3, dy3, maxRange);
        boolean a0 = s0 < e0;
        boolean a1 = s1 < e1;
        boolean a2 = s2 < e2;
        boolean a3 = s3 < e3;
        out[k] = maxRange;
        out[k + 1] = maxRange;
        out[k + 2] = maxRange;
        out[k + 3] = maxRange;
        while (a0 || a1 || a2 || a3) {
            if (a0) {
                double n = step(gx, gy, dx0, dy0, s0);
                if (n < 0) {
                    out[k] = s0 * cellSize;
                    a0 = false;
                } else {
                    s0 = n;
                    a0 = s0 < e0;
                }
            }
            if (a1) {
                double n = step(gx, gy, dx1, dy1, s1);
                if (n < 0) {
                    out[k + 1] = s1 * cellSize;
                    a1 = false;
                } else {
                    s1 = n;
                    a1 = s1 < e1;
                }
            }
            if (a2) {
                double n = step(gx, gy, dx2, dy2, s2);
                if (n < 0) {
                    out[k + 2] = s2 * cellSize;
                    a2 = false;
                } else {
                    s2 = n;
                    a2 = s2 < e2;
                }
            }
            if (a3) {
                double n = step(gx, gy, dx3, dy3, s3);
                if (n < 0) {
                    out[k + 3] = s3 * cellSize;
                    a3 = false;
                } else {
                    s3 = n;
                    a3 = s3 < e3;
                }
            }
        }
    }

    /** Where the ray enters the grid rectangle, in cells along the ray (0 when it starts inside). */
    private double clipStart(double gx, double gy, double dx, double dy) {
        double t = 0;
        if (dx != 0) {
            t = Math.max(t, Math.min(-gx / dx, (width - gx) / dx));
        } else if (gx < 0 || gx >= width) {
            return Double.POSITIVE_INFINITY;
        }
        if (dy != 0) {
            t = Math.max(t, Math.min(-gy / dy, (height - gy) / dy));
        } else if (gy < 0 || gy >= height) {
            return Double.POSITIVE_INFINITY;
        }
        return t;
    }

    /** Where the ray leaves the grid rectangle or reaches max range, in cells along the ray. */
    private double clipEnd(double gx, double gy, double dx, double dy, double maxRange) {
        double tEnd = maxRange * inverseCell;
        if (dx != 0) {
            tEnd = Math.min(tEnd, Math.max(-gx / dx, (width - gx) / dx));
        }
        if (dy != 0) {
            tEnd = Math.min(tEnd, Math.max(-gy / dy, (height - gy) / dy));
        }
        return tEnd;
    }

    /**
     * One step of the march from {@code t}: the next position along the ray, or negative infinity
     * when the cell at {@code t} is occupied (the hit is at {@code t}).
     */
    private double step(double gx, double gy, double dx, double dy, double t) {
        double px = gx + t * dx;
        double py = gy + t * dy;
        int ix = (int) px;
        int iy = (int) py;
        if (ix > width - 1) {
            ix = width - 1;
        }
        if (iy > height - 1) {
            iy = height - 1;
        }
        if (ix < 0) {
            ix = 0;
        }
        if (iy < 0) {
            iy = 0;
        }
        int d = dist[iy * width + ix] & 0xFF;
        if (d == 0) {
            return Double.NEGATIVE_INFINITY;
        }
        if (d >= LEAP_FROM) {
            return t + (d - LEAP_MARGIN);
        }
        double tx = dx != 0 ? (ix + (dx > 0 ? 1 : 0) - px) * (1.0 / dx) : Double.POSITIVE_INFINITY;
        double ty = dy != 0 ? (iy + (dy > 0 ? 1 : 0) - py) * (1.0 / dy) : Double.POSITIVE_INFINITY;
        return t + (Math.max(0, Math.min(tx, ty)) + NUDGE);
    }
}
