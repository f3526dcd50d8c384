package dev.driftlab.geometry;

/**
 * Test oracle: the grid caster's single-precision march exactly as it stood before the free-space
 * leaps were widened (commit e6af51b, "exact cell traversal"), copied here so that the faster
 * caster can be compared with it bit for bit. It leaps by the distance field (centre to nearest
 * occupied centre, less 1.5 cells) when at least 3 cells from an occupied centre and otherwise
 * walks cell by cell (Amanatides and Woo, "A Fast Voxel Traversal Algorithm for Ray Tracing",
 * Eurographics 1987). Compact grids only (those {@link GridCaster} marches in single precision);
 * not a single operation is changed, only a step count added that gives up (NaN) where it would
 * never finish.
 */
final class ReferenceGridCaster {

    private static final float LEAP_FROM = 3f;
    private static final float LEAP_MARGIN = 1.5f;
    private static final float START_SLACK = 1f / 256;
    private static final float NEAR_START = 2f;
    private static final float FAR = 1e30f;

    /**
     * Steps after which {@link #castAlong} gives up and returns NaN. The march copied here can go
     * round for ever: a ray all but parallel to a cell edge, starting on it and heading across it,
     * crosses it at t = 0 by the traversal, but a leap's landing, rounded, puts it back on the near
     * side, and the next walk step goes back to t = 0. No finishing ray takes a million steps.
     */
    private static final long STEPS = 1_000_000;

    private final float[] dist;
    private final int width;
    private final int height;
    private final double cellSize;
    private final double inverseCell;
    private final float originXf;
    private final float originYf;
    private final float inverseCellf;

    ReferenceGridCaster(DistanceField field) {
        OccupancyGrid g = field.grid();
        if (!GridCaster.compact(g.width(), g.height())) {
            throw new IllegalArgumentException("the reference covers compact grids only");
        }
        this.dist = field.cellUnits();
        this.width = g.width();
        this.height = g.height();
        this.cellSize = g.cellSize();
        this.inverseCell = 1.0 / cellSize;
        this.originXf = (float) g.originX();
        this.originYf = (float) g.originY();
        this.inverseCellf = (float) inverseCell;
    }

    double castAlong(double x, double y, double dirX, double dirY, double maxRange) {
        float dx = (float) dirX;
        float dy = (float) dirY;
        float ivx = reciprocal(dx);
        float ivy = reciprocal(dy);
        float gx0 = ((float) x - originXf) * inverseCellf;
        float gy0 = ((float) y - originYf) * inverseCellf;
        float ax = -gx0 * ivx;
        float bx = (width - gx0) * ivx;
        float ay = -gy0 * ivy;
        float by = (height - gy0) * ivy;
        float skip = Math.max(Math.max(Math.min(ax, bx), Math.min(ay, by)), 0f);
        float te = Math.min(Math.min(Math.max(ax, bx), Math.max(ay, by)), (float) (maxRange * inverseCell)) - skip;
        if (!(0f < te)) {
            return maxRange;
        }
        float gx = gx0 + skip * dx;
        float gy = gy0 + skip * dy;
        if (startsOnOccupied(gx, gy)) {
            return hitRange(skip, 0f);
        }
        float ex = (dx >= 0f ? 1f : 0f) - gx;
        float ey = (dy >= 0f ? 1f : 0f) - gy;
        int stepX = dx >= 0f ? 1 : -1;
        int stepY = dy >= 0f ? 1 : -1;
        int ix = cell(gx, width);
        int iy = cell(gy, height);
        float t = 0f;
        long steps = 0;
        while (t < te) {
            if (++steps > STEPS) {
                return Double.NaN;
            }
            float d = dist[cell(iy, height) * width + cell(ix, width)];
            if (d == 0f) {
                return hitRange(skip, t);
            }
            if (d >= LEAP_FROM) {
                t = Math.min(t + (d - LEAP_MARGIN), te);
                ix = cell(dx * t + gx, width);
                iy = cell(dy * t + gy, height);
            } else {
                float tx = (ix + ex) * ivx;
                float ty = (iy + ey) * ivy;
                if (tx < ty) {
                    t = tx;
                    ix += stepX;
                } else {
                    t = ty;
                    iy += stepY;
                }
            }
        }
        return maxRange;
    }

    /**
     * The plain cell-by-cell traversal from the same start, without any leap: each step enters the
     * neighbour across whichever cell edge the ray meets first, until an occupied cell or the end.
     */
    double walkAlong(double x, double y, double dirX, double dirY, double maxRange) {
        float dx = (float) dirX;
        float dy = (float) dirY;
        float ivx = reciprocal(dx);
        float ivy = reciprocal(dy);
        float gx0 = ((float) x - originXf) * inverseCellf;
        float gy0 = ((float) y - originYf) * inverseCellf;
        float ax = -gx0 * ivx;
        float bx = (width - gx0) * ivx;
        float ay = -gy0 * ivy;
        float by = (height - gy0) * ivy;
        float skip = Math.max(Math.max(Math.min(ax, bx), Math.min(ay, by)), 0f);
        float te = Math.min(Math.min(Math.max(ax, bx), Math.max(ay, by)), (float) (maxRange * inverseCell)) - skip;
        if (!(0f < te)) {
            return maxRange;
        }
        float gx = gx0 + skip * dx;
        float gy = gy0 + skip * dy;
        if (startsOnOccupied(gx, gy)) {
            return hitRange(skip, 0f);
        }
        float ex = (dx >= 0f ? 1f : 0f) - gx;
        float ey = (dy >= 0f ? 1f : 0f) - gy;
        int stepX = dx >= 0f ? 1 : -1;
        int stepY = dy >= 0f ? 1 : -1;
        int ix = cell(gx, width);
        int iy = cell(gy, height);
        float t = 0f;
        while (t < te) {
            if (dist[cell(iy, height) * width + cell(ix, width)] == 0f) {
                return hitRange(skip, t);
            }
            float tx = (ix + ex) * ivx;
            float ty = (iy + ey) * ivy;
            if (tx < ty) {
                t = tx;
                ix += stepX;
            } else {
                t = ty;
                iy += stepY;
            }
        }
        return maxRange;
    }

    private static float reciprocal(float d) {
        return d == 0f ? FAR : 1f / d;
    }

    private static int cell(float p, int side) {
        int i = (int) p;
        return i < 0 ? 0 : Math.min(i, side - 1);
    }

    private static int cell(int i, int side) {
        return i < 0 ? 0 : Math.min(i, side - 1);
    }

    private double hitRange(float skip, float t) {
        return (skip + Math.max(0f, t)) * cellSize;
    }

    private boolean startsOnOccupied(float gx, float gy) {
        if (dist[cell(gy, height) * width + cell(gx, width)] >= NEAR_START) {
            return false;
        }
        int i0 = cell(gx - START_SLACK, width);
        int i1 = cell(gx + START_SLACK, width);
        int j0 = cell(gy - START_SLACK, height) * width;
        int j1 = cell(gy + START_SLACK, height) * width;
        return dist[j0 + i0] == 0f || dist[j0 + i1] == 0f || dist[j1 + i0] == 0f || dist[j1 + i1] == 0f;
    }
}
