package dev.driftlab.geometry;

/**
 * Fast ray caster on an occupancy grid. Away from obstacles it leaps along the ray (sphere
 * tracing) by a per-cell free distance, the gap from the cell to the nearest occupied cell less
 * {@link #LEAP_CLEARANCE}; in the cells next to an occupied one, and wherever the next cell edge
 * is farther than that gap, it walks cell by cell as an exact cell traversal (Amanatides and Woo,
 * "A Fast Voxel Traversal Algorithm for Ray Tracing", Eurographics 1987): each step enters the
 * neighbour across whichever cell edge the ray meets first, so it never steps over an occupied
 * cell the ray crosses, however briefly, beyond the rounding of single precision (about 10^-4
 * cells). A leap passes at least {@link #LEAP_CLEARANCE} from every occupied cell, far above that
 * rounding, and finds its landing cell from a point set back by {@link #LANDING_BACK}, so after
 * every leap the march is in the very cell the traversal is in at that t (or one edge short,
 * which the next steps catch up at the same t): the range is that of the cell-by-cell traversal
 * alone, bit for bit, whatever the leaps (see DEVELOPERS.md, "Ray casting"). A ray starting
 * within {@link #START_SLACK}
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
     * Most cells of a grid marched in single precision, its {@link #BORDER} included (8.4 million,
     * e.g. 145 x 145 m at 5 cm): the lanes compute cell indices as floats and turn them into ints
     * by adding 2^23.
     */
    public static final int COMPACT_CELLS = 1 << 23;

    /** Batches at least this large go to the lanes; smaller ones march ray by ray. */
    static final int LANES_FROM = 8;

    /**
     * Least distance in cells between a leap and every occupied cell (1/16 cell, 3 mm at 5 cm
     * cells): 32 times the rounding of a position on the largest compact grid (2^-9 cells), so the
     * cells around a leap's landing point, which rounding may put the march in, are all free.
     */
    static final float LEAP_CLEARANCE = 1f / 16;

    /**
     * A leap's landing cell is found from the landing point set back this far (cells) along each
     * axis against the ray's direction (1/64 cell, 4 times the rounding of the landing point and of
     * a crossing's position on the largest compact grid, 2^-8 cells, and a quarter of {@link
     * #LEAP_CLEARANCE}). The landing cell is then never past a cell edge that the traversal has not
     * yet crossed by its own reckoning, however nearly the ray runs along that edge; at most it
     * falls one edge short, and the next steps catch up at the same t. So after every leap the
     * march is in the very cell the cell-by-cell traversal is in at that t.
     */
    static final float LANDING_BACK = 1f / 64;

    /**
     * Cells of border around {@link #reach}, holding the values of the nearest edge cells, so a
     * look-up a cell or two off the grid reads what a clamp onto the grid would. The lanes look up
     * without a clamp: a lane's traversal cell is at most one cell off the grid while it marches
     * (only a walk step across the grid's edge that rounding puts just before the ray's end gets
     * there; the next crossing of that axis is a whole cell, at least 1 in t, later) and at most two
     * once it has finished (one more step, which ends the march; it never moves again).
     */
    static final int BORDER = 2;

    /** {@link #reach} of an occupied cell. */
    static final float OCCUPIED = Float.NEGATIVE_INFINITY;

    /**
     * {@link #reach} of a free cell next to an occupied one (8-neighbourhood): no leap. Finite and
     * far below any position, so a leap from there never looks better than a walk step.
     */
    static final float NO_LEAP = -1e30f;

    /**
     * A ray starting this close to an occupied cell, in cells (0.2 mm at 5 cm cells), counts as
     * starting on it: twice the rounding of any position on a compact grid, so a start on a wall
     * that lies on a cell edge is caught whichever side of the edge the rasteriser (in double
     * precision) and the march (in single) put it.
     */
    static final float START_SLACK = 1f / 256;

    /**
     * Below this distance field value at the start cell, an occupied cell may touch the start
     * cell (an 8-neighbour's centre is at most sqrt 2 away), so the double-precision march checks
     * the start against its neighbours; at or above it none can be within its slack.
     */
    private static final float NEAR_START = 2f;

    /** Stands in for 1/0 for an axis-parallel ray: finite, so no step ever computes 0 * infinity. */
    static final float FAR = 1e30f;

    /** 2^23: adding and subtracting it rounds a float below 2^22 to a whole number. */
    static final float ROUND = 8388608f;

    /**
     * The double-precision march (grids that are not compact) leaps only when at least this many
     * cells from the nearest occupied centre; below, it walks.
     */
    private static final float LEAP_FROM = 3f;

    /**
     * Margin in cells subtracted from a leap of the double-precision march: the ray point may be
     * half a diagonal from its cell centre and an occupied cell extends half a diagonal around its
     * own, sqrt(2) together.
     */
    private static final float LEAP_MARGIN = 1.5f;

    /** {@link #START_SLACK} of the double-precision march: far above its rounding (10^-11 cells). */
    private static final double WIDE_SLACK = 1e-9;

    /**
     * Distance from each cell centre to the nearest occupied cell centre, in cells (the distance
     * field's own array, shared): 0 exactly on occupied cells, infinite when none is occupied. The
     * double-precision march on grids that are not compact leaps by it.
     */
    private final float[] dist;

    /**
     * Per cell, row-major with a border of {@link #BORDER} cells (cell (i, j) at {@code reachOrigin
     * + j * reachStride + i}), for the single-precision march (null on grids that are not compact):
     * {@link #OCCUPIED} on an occupied cell, {@link #NO_LEAP} on a free cell next to one, and
     * elsewhere how far in cells a ray may leap from any point of the cell: the gap between the
     * cell and the nearest occupied cell (squares; positive infinity when none is occupied) less
     * {@link #LEAP_CLEARANCE}. The gap to an occupied cell k cells across and m cells up is
     * sqrt((k-1)^2 + (m-1)^2), which is the centre distance to the nearest cell of the occupied
     * cells grown by their 8 neighbours, so one distance transform of that grown grid gives it.
     */
    final float[] reach;

    /** Row length of {@link #reach}, and the index of cell (0, 0) in it. */
    final int reachStride;

    final int reachOrigin;

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
        this.compact = compact(width, height);
        this.lanes = useLanes && compact && LANES_AVAILABLE;
        this.reachStride = width + 2 * BORDER;
        this.reachOrigin = BORDER * reachStride + BORDER;
        this.reach = compact ? reach(g) : null;
    }

    /** Whether a grid of this many columns and rows is marched in single precision. */
    static boolean compact(int width, int height) {
        return width <= COMPACT_SIDE
                && height <= COMPACT_SIDE
                && (long) (width + 2 * BORDER) * (height + 2 * BORDER) <= COMPACT_CELLS;
    }

    /** The {@link #reach} of every cell of a grid, border included. */
    private static float[] reach(OccupancyGrid g) {
        int w = g.width();
        int h = g.height();
        boolean[] occupied = g.cells();
        boolean[] grown = new boolean[occupied.length];
        for (int j = 0; j < h; j++) {
            for (int i = 0; i < w; i++) {
                if (!occupied[j * w + i]) {
                    continue;
                }
                for (int v = Math.max(0, j - 1); v <= Math.min(h - 1, j + 1); v++) {
                    for (int u = Math.max(0, i - 1); u <= Math.min(w - 1, i + 1); u++) {
                        grown[v * w + u] = true;
                    }
                }
            }
        }
        double[] sq = DistanceTransform.squared2d(grown, w, h);
        int stride = w + 2 * BORDER;
        float[] reach = new float[stride * (h + 2 * BORDER)];
        for (int j = -BORDER; j < h + BORDER; j++) {
            for (int i = -BORDER; i < w + BORDER; i++) {
                int k = clamp(j, h) * w + clamp(i, w);
                float r;
                if (occupied[k]) {
                    r = OCCUPIED;
                } else if (grown[k]) {
                    r = NO_LEAP;
                } else {
                    r = sq[k] >= DistanceTransform.FAR
                            ? Float.POSITIVE_INFINITY
                            : (float) Math.sqrt(sq[k]) - LEAP_CLEARANCE;
                }
                reach[(j + BORDER) * stride + i + BORDER] = r;
            }
        }
        return reach;
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
        // where leaps land from: the start set back along each axis
        float landX = gx - back(dx);
        float landY = gy - back(dy);
        float t = 0f;
        while (t < te) {
            // a traversal step may leave the grid by rounding just before te: look up the edge cell
            float r = reach[reachOrigin + clamp(iy, height) * reachStride + clamp(ix, width)];
            if (r == OCCUPIED) {
                return hitRange(skip, t);
            }
            float tx = (ix + ex) * ivx;
            float ty = (iy + ey) * ivy;
            // a crossing before t is one a leap's landing (set back) has not yet counted: catch up
            // without going back in t (see LANDING_BACK)
            float walk = Math.max(t, tx < ty ? tx : ty);
            // clamped to the end so an infinite reach (no occupied cell) keeps t finite
            float leap = Math.min(t + r, te);
            if (leap > walk) {
                t = leap;
                ix = cell(dx * t + landX, width);
                iy = cell(dy * t + landY, height);
            } else if (tx < ty) {
                t = walk;
                ix += stepX;
            } else {
                t = walk;
                iy += stepY;
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

    // ---- pieces of the single-precision march; LaneMarch calls some and does the rest on vectors ----

    /** Max range in cells, in the lanes' single precision. */
    float cells(double maxRange) {
        return (float) (maxRange * inverseCell);
    }

    /** 1/d, or a large finite stand-in along an axis (d = 0). */
    static float reciprocal(float d) {
        return d == 0f ? FAR : 1f / d;
    }

    /** {@link #LANDING_BACK} in the direction of a ray's step along an axis. */
    static float back(float d) {
        return d >= 0f ? LANDING_BACK : -LANDING_BACK;
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
        if (reach[reachOrigin + cell(gy, height) * reachStride + cell(gx, width)] > 0f) {
            // no occupied cell among the start cell's 8 neighbours, so none within the slack
            return false;
        }
        int i0 = reachOrigin + cell(gx - START_SLACK, width);
        int i1 = reachOrigin + cell(gx + START_SLACK, width);
        int j0 = cell(gy - START_SLACK, height) * reachStride;
        int j1 = cell(gy + START_SLACK, height) * reachStride;
        return reach[j0 + i0] == OCCUPIED
                || reach[j0 + i1] == OCCUPIED
                || reach[j1 + i0] == OCCUPIED
                || reach[j1 + i1] == OCCUPIED;
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
