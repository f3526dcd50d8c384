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
        double tEnd = maxRange * inverseCell;
        double t = 0;
        // clip to the grid rectangle [0, width] x [0, height] in cell units
        if (dx != 0) {
            double ta = -gx / dx;
            double tb = (width - gx) / dx;
            t = Math.max(t, Math.min(ta, tb));
            tEnd = Math.min(tEnd, Math.max(ta, tb));
        } else if (gx < 0 || gx >= width) {
            return maxRange;
        }
        if (dy != 0) {
            double ta = -gy / dy;
            double tb = (height - gy) / dy;
            t = Math.max(t, Math.min(ta, tb));
            tEnd = Math.min(tEnd, Math.max(ta, tb));
        } else if (gy < 0 || gy >= height) {
            return maxRange;
        }
        if (t >= tEnd) {
            return maxRange;
        }
        double invDx = dx != 0 ? 1.0 / dx : Double.POSITIVE_INFINITY;
        double invDy = dy != 0 ? 1.0 / dy : Double.POSITIVE_INFINITY;
        int offX = dx > 0 ? 1 : 0;
        int offY = dy > 0 ? 1 : 0;
        int wMax = width - 1;
        int hMax = height - 1;
        while (t < tEnd) {
            double px = gx + t * dx;
            double py = gy + t * dy;
            int ix = (int) px;
            int iy = (int) py;
            if (ix > wMax) {
                ix = wMax;
            }
            if (iy > hMax) {
                iy = hMax;
            }
            if (ix < 0) {
                ix = 0;
            }
            if (iy < 0) {
                iy = 0;
            }
            int d = dist[iy * width + ix] & 0xFF;
            if (d == 0) {
                return t * cellSize;
            }
            if (d >= LEAP_FROM) {
                t += d - LEAP_MARGIN;
            } else {
                double tx = dx != 0 ? (ix + offX - px) * invDx : Double.POSITIVE_INFINITY;
                double ty = dy != 0 ? (iy + offY - py) * invDy : Double.POSITIVE_INFINITY;
                t += Math.max(0, Math.min(tx, ty)) + NUDGE;
            }
        }
        return maxRange;
    }
}
