package dev.driftlab.geometry;

/**
 * Fast ray caster on an occupancy grid. Far from obstacles it leaps along the ray by the distance
 * field (sphere tracing, kept conservative by the cell diagonal); near them it walks cell by cell
 * as an exact cell traversal (Amanatides and Woo, "A Fast Voxel Traversal Algorithm for Ray
 * Tracing", Eurographics 1987): each step enters the neighbour across whichever cell edge the ray
 * meets first, so it never steps over an occupied cell the ray crosses, however briefly, beyond
 * the rounding of single precision (about 10^-4 cells). A ray starting within {@link #START_SLACK}
 * of an occupied cell (on a wall that lies on a cell edge, say) reports 0. The reported range is
 * where the ray enters the first occupied cell, so it is never longer than the exact range to a
 * wall that was rasterised into the grid, beyond that rounding, and shorter by at most the ray's
 * length inside one cell near the wall.
 *
 * <p>On grids up to {@link #COMPACT_SIDE} cells a side and {@link #COMPACT_CELLS} cells, the
 * march runs in single precision on grid coordinates from where the ray enters the grid. Batches
 * of rays ({@link #castRays}) go through {@link LaneMarch}, which advances 64 rays at once with the
 * incubating vector API when the JVM was started with {@code --add-modules jdk.incubator.vector},
 * and otherwise ray by ray through {@link #castAlong}. Both give the same ranges bit for bit, so
 * results never depend on how the JVM was started. Larger grids march in double precision, ray by
 * ray.
 *
 * <p>Outside the grid counts as free. Immutable and thread-safe; nothing is allocated per ray.
 */
public final class GridCaster implements RayCaster {

    /**
     * Whether this JVM has the vector API module (and the lanes are not switched off with
     * {@code -Ddriftlab.caster.scalar=true}). {@link LaneMarch} is only loaded when it does.
     */
    public static final boolean LANES_AVAILABLE = !Boolean.getBoolean("driftlab.caster.scalar")
            && ModuleLayer.boot().findModule("jdk.incubator.vector").isPresent();

    /**
     * Largest side in cells of a grid marched in single precision: positions along a ray up to the
     * grid's diagonal (2^14.5 cells) then round to at most 2^-9 cells, half of {@link #START_SLACK}.
     */
    public static final int COMPACT_SIDE = 1 << 14;

    /**
     * Most cells of a grid marched in single precision (8.4 million, e.g. 145 x 145 m at 5 cm): the
     * lanes compute cell indices as floats and turn them into ints by adding 2^23.
     */
    public static final int COMPACT_CELLS = 1 << 23;

    /** Batches at least this large go to the lanes; smaller ones march ray by ray. */
    static final int LANES_FROM = 8;

    /** Leap only when at least this many cells from the nearest occupied centre; below, walk. */
    static final float LEAP_FROM = 3f;

    /**
     * Safety margin in cells subtracted from a leap: the ray point may be half a diagonal from its
     * cell centre and an occupied cell extends half a diagonal around its own, sqrt(2) together.
     */
    static final float LEAP_MARGIN = 1.5f;

    /**
     * A ray starting this close to an occupied cell, in cells (0.2 mm at 5 cm cells), counts as
     * starting on it: twice the rounding of any position on a compact grid, so a start on a wall
     * that lies on a cell edge is caught whichever side of the edge the rasteriser (in double
     * precision) and the march (in single) put it.
     */
    static final float START_SLACK = 1f / 256;

    /**
     * Below this distance field value at the start cell, an occupied cell may touch the start
     * cell (an 8-neighbour's centre is at most sqrt 2 away), so the start is checked against its
     * neighbours; at or above it none can be within {@link #START_SLACK}.
     */
    static final float NEAR_START = 2f;

    /** Stands in for 1/0 for an axis-parallel ray: finite, so no step ever computes 0 * infinity. */
    static final float FAR = 1e30f;

    /** 2^23: adding and subtracting it rounds a float below 2^22 to a whole number. */
    static final float ROUND = 8388608f;

    /** {@link #START_SLACK} of the double-precision march: far above its rounding (10^-11 cells). */
    private static final double WIDE_SLACK = 1e-9;

    /**
     * Distance from each cell centre to the nearest occupied cell centre, in cells (the distance
     * field's own array, shared): 0 exactly on occupied cells, infinite when none is occupied.
     */
    final float[] dist;

    final int width;
    final int height;
    private final double originX;
    private final double originY;
    private final double cellSize;
    private final double inverseCell;
    /** Grid origin and 1 / cell size in single precision, as the march uses them. */
    final float originXf;

    final float originYf;
    final float inverseCellf;
    private final boolean compact;
    private final boolean lanes;

    /** A caster on the grid behind the given distance field; batches use vector lanes if the JVM has them. */
    public GridCaster(DistanceField field) {
        this(field, true);
    }

    /**
     * A caster that uses vector lanes for batches only when asked and available (tests use this to
     * compare the two ways).
     */
    GridCaster(DistanceField field, boolean useLanes) {
        OccupancyGrid g = field.grid();
        this.dist = field.cellUnits();
        this.width = g.width();
        this.height = g.height();
        this.originX = g.originX();
        this.originY = g.originY();
        this.cellSize = g.cellSize();
        this.inverseCell = 1.0 / cellSize;
        this.originXf = (float) originX;
        this.originYf = (float) originY;
        this.inverseCellf = (float) inverseCell;
        this.compact = width <= COMPACT_SIDE && height <= COMPACT_SIDE && (long) width * height <= COMPACT_CELLS;
        this.lanes = useLanes && compact && LANES_AVAILABLE;
    }

    /** Whether batches of rays run on vector lanes (vector API present and the grid compact). */
    public boolean usesVectorLanes() {
        return lanes;
    }

    /** {@inheritDoc} */
    @Override
    public double cast(double x, double y, double angle, double maxRange) {
        return castAlong(x, y, Math.cos(angle), Math.sin(angle), maxRange);
    }

    /** {@inheritDoc} */
    @Override
    public double castAlong(double x, double y, double dirX, double dirY, double maxRange) {
        if (!compact) {
            return castWide(x, y, dirX, dirY, maxRange);
        }
        float dx = (float) dirX;
        float dy = (float) dirY;
        float ivx = reciprocal(dx);
        float ivy = reciprocal(dy);
        float gx0 = ((float) x - originXf) * inverseCellf;
        float gy0 = ((float) y - originYf) * inverseCellf;
        // the ray's part inside the grid rectangle and max range, [skip, skip + te) in cells; the
        // march starts where the ray enters, so far-away origins cost no precision. Nothing inside
        // (or NaN input) gives te <= 0. LaneMarch.prepare does the same, lane by lane.
        float ax = -gx0 * ivx;
        float bx = (width - gx0) * ivx;
        float ay = -gy0 * ivy;
        float by = (height - gy0) * ivy;
        float skip = Math.max(Math.max(Math.min(ax, bx), Math.min(ay, by)), 0f);
        float te = Math.min(Math.min(Math.max(ax, bx), Math.max(ay, by)), cells(maxRange)) - skip;
        if (!(0f < te)) {
            return maxRange;
        }
        float gx = gx0 + skip * dx;
        float gy = gy0 + skip * dy;
        if (startsOnOccupied(gx, gy)) {
            return hitRange(skip, 0f);
        }
        // the ray leaves column ix at t = (ix + ex) * ivx and row iy at t = (iy + ey) * ivy
        float ex = side(dx) - gx;
        float ey = side(dy) - gy;
        int stepX = dx >= 0f ? 1 : -1;
        int stepY = dy >= 0f ? 1 : -1;
        int ix = cell(gx, width);
        int iy = cell(gy, height);
        float t = 0f;
        while (t < te) {
            // a traversal step may leave the grid by rounding just before te: look up the edge cell
            float d = dist[clamp(iy, height) * width + clamp(ix, width)];
            if (d == 0f) {
                return hitRange(skip, t);
            }
            if (d >= LEAP_FROM) {
                // clamped to the end so an infinite distance (no occupied cell) keeps t finite
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
     * Casts a batch of rays, each from its own origin: ray k starts at (x[k], y[k]) along the unit
     * direction (dirX[k], dirY[k]). On vector lanes, 64 rays advance together and a finished ray's
     * lane takes the next ray, so the lanes stay busy; results equal {@link #castAlong} bit for bit
     * either way.
     *
     * @param x origins east, metres
     * @param y origins north, metres
     * @param dirX east components of the unit directions
     * @param dirY north components of the unit directions
     * @param from first ray index
     * @param count number of rays
     * @param maxRange longest range reported, metres
     * @param out ranges out, metres, at the same indices (max range on a miss)
     */
    public void castRays(
            double[] x, double[] y, double[] dirX, double[] dirY, int from, int count, double maxRange, double[] out) {
        if (lanes && count >= LANES_FROM) {
            LaneMarch.local().run(this, x, y, dirX, dirY, from, count, maxRange, out);
            return;
        }
        for (int k = from; k < from + count; k++) {
            out[k] = castAlong(x[k], y[k], dirX[k], dirY[k], maxRange);
        }
    }

    // ---- pieces of the single-precision march that LaneMarch shares ----

    /** Max range in cells, in the lanes' single precision. */
    float cells(double maxRange) {
        return (float) (maxRange * inverseCell);
    }

    /** 1/d, or a large finite stand-in along an axis (d = 0). */
    static float reciprocal(float d) {
        return d == 0f ? FAR : 1f / d;
    }

    /** 1 when the ray goes the positive way along an axis (or along the other axis), else 0. */
    static float side(float d) {
        return d >= 0f ? 1f : 0f;
    }

    /**
     * The cell column or row of a grid coordinate, clamped to the grid. Equals the lanes' floor by
     * the 2^23 rounding trick followed by the same clamp, for every finite coordinate.
     */
    static int cell(float p, int side) {
        int i = (int) p;
        return i < 0 ? 0 : Math.min(i, side - 1);
    }

    /** The range in metres of a hit {@code t} cells past the march start (where the ray enters the cell). */
    double hitRange(float skip, float t) {
        return (skip + Math.max(0f, t)) * cellSize;
    }

    /** A cell index of the traversal, which may have stepped just off the grid, clamped onto it. */
    static int clamp(int i, int side) {
        return i < 0 ? 0 : Math.min(i, side - 1);
    }

    /**
     * Whether an occupied cell lies within {@link #START_SLACK} of the march start (grid
     * coordinates). The lanes call this too, at set-up, so both ways agree.
     */
    boolean startsOnOccupied(float gx, float gy) {
        if (dist[cell(gy, height) * width + cell(gx, width)] >= NEAR_START) {
            return false;
        }
        int i0 = cell(gx - START_SLACK, width);
        int i1 = cell(gx + START_SLACK, width);
        int j0 = cell(gy - START_SLACK, height) * width;
        int j1 = cell(gy + START_SLACK, height) * width;
        return dist[j0 + i0] == 0f || dist[j0 + i1] == 0f || dist[j1 + i0] == 0f || dist[j1 + i1] == 0f;
    }

    // ---- grids too large for single precision: the same march in double precision ----

    private double castWide(double x, double y, double dx, double dy, double maxRange) {
        double gx = (x - originX) * inverseCell;
        double gy = (y - originY) * inverseCell;
        double ivx = dx != 0 ? 1.0 / dx : Double.POSITIVE_INFINITY;
        double ivy = dy != 0 ? 1.0 / dy : Double.POSITIVE_INFINITY;
        double t = 0;
        double tEnd = maxRange * inverseCell;
        if (dx != 0) {
            t = Math.max(t, Math.min(-gx * ivx, (width - gx) * ivx));
            tEnd = Math.min(tEnd, Math.max(-gx * ivx, (width - gx) * ivx));
        } else if (gx < 0 || gx >= width) {
            return maxRange;
        }
        if (dy != 0) {
            t = Math.max(t, Math.min(-gy * ivy, (height - gy) * ivy));
            tEnd = Math.min(tEnd, Math.max(-gy * ivy, (height - gy) * ivy));
        } else if (gy < 0 || gy >= height) {
            return maxRange;
        }
        double gxs = gx + t * dx;
        double gys = gy + t * dy;
        if (t < tEnd && startsOnOccupiedWide(gxs, gys)) {
            return t * cellSize;
        }
        int ix = cellWide(gxs, width);
        int iy = cellWide(gys, height);
        int stepX = dx >= 0 ? 1 : -1;
        int stepY = dy >= 0 ? 1 : -1;
        while (t < tEnd) {
            double d = dist[clamp(iy, height) * width + clamp(ix, width)];
            if (d == 0) {
                return t * cellSize;
            }
            if (d >= LEAP_FROM) {
                t = Math.min(t + (d - LEAP_MARGIN), tEnd);
                ix = cellWide(gx + t * dx, width);
                iy = cellWide(gy + t * dy, height);
            } else {
                double tx = dx != 0 ? (ix + (dx > 0 ? 1 : 0) - gx) * ivx : Double.POSITIVE_INFINITY;
                double ty = dy != 0 ? (iy + (dy > 0 ? 1 : 0) - gy) * ivy : Double.POSITIVE_INFINITY;
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

    private static int cellWide(double p, int side) {
        return p < 0 ? 0 : (int) Math.min(p, side - 1);
    }

    private boolean startsOnOccupiedWide(double gx, double gy) {
        if (dist[cellWide(gy, height) * width + cellWide(gx, width)] >= NEAR_START) {
            return false;
        }
        int i0 = cellWide(gx - WIDE_SLACK, width);
        int i1 = cellWide(gx + WIDE_SLACK, width);
        long j0 = (long) cellWide(gy - WIDE_SLACK, height) * width;
        long j1 = (long) cellWide(gy + WIDE_SLACK, height) * width;
        return dist[(int) (j0 + i0)] == 0f
                || dist[(int) (j0 + i1)] == 0f
                || dist[(int) (j1 + i0)] == 0f
                || dist[(int) (j1 + i1)] == 0f;
    }
}
