package dev.driftlab.geometry;

import jdk.incubator.vector.FloatVector;
import jdk.incubator.vector.VectorMask;
import jdk.incubator.vector.VectorOperators;
import jdk.incubator.vector.VectorSpecies;

/**
 * The grid caster's march on vector lanes: {@link #GROUPS} groups of one vector's width of rays
 * (64 rays on a machine with 512-bit vectors) each take {@link #ROUNDS} steps with their state held
 * in registers, each lane doing exactly what {@link GridCaster#castAlong} does for its ray, with
 * the same single-precision results, so the ranges are the same bit for bit. Then a scalar pass
 * writes out the rays that have finished and copies the next rays, set up beforehand by a
 * vectorised pass, into their lanes, so lanes rarely idle while long rays are still marching.
 *
 * <p>Where the step departs from the scalar code in form, it keeps its values (see DEVELOPERS.md,
 * "Ray casting"): the distance-field look-up needs no clamp, because {@link GridCaster#reach} has a
 * border of {@link GridCaster#BORDER} cells holding the values of the edge cells, and a lane is at
 * most two cells off the grid; clamps, and the max and min of non-negative times, compare the float
 * bits as integers, which orders non-negative floats as the floats themselves.
 *
 * <p>Uses the incubating vector API; only loaded when {@link GridCaster#LANES_AVAILABLE}. Holds
 * the lane state of one thread ({@link #local}); nothing is allocated per ray.
 */
final class LaneMarch {

    private static final VectorSpecies<Float> FLOATS = FloatVector.SPECIES_PREFERRED;
    private static final int WIDTH = FLOATS.length();
    private static final int GROUPS = 4;
    private static final int LANES = WIDTH * GROUPS;

    /** Steps per group between refills (2 to 8 measured alike within the noise; 1 and the refill pass dominates). */
    private static final int ROUNDS = 4;

    private static final int ROUND_BITS = Float.floatToRawIntBits(GridCaster.ROUND);

    private static final FloatVector ZERO = FloatVector.zero(FLOATS);
    private static final FloatVector ONE = FloatVector.broadcast(FLOATS, 1f);
    private static final FloatVector FAR = FloatVector.broadcast(FLOATS, GridCaster.FAR);
    private static final FloatVector LANE_BITS = laneBits();
    private static final FloatVector BACK = FloatVector.broadcast(FLOATS, GridCaster.LANDING_BACK);

    private static final ThreadLocal<LaneMarch> LOCAL = ThreadLocal.withInitial(LaneMarch::new);

    /** Rays set up per pass of {@link #prepare}: 512 rays' set-up takes 20 KB. */
    private static final int CHUNK = 512;

    /** Room for a chunk after the fewer than one vector's width of rays a restock keeps. */
    private static final int SPACE = CHUNK + 2 * WIDTH;

    // ---- lane state: one float array, a block of LANES entries per quantity ----

    /** Where the ray's march starts, grid coordinates (where it enters the grid). */
    private static final int SX = 0;

    private static final int SY = 1;
    /** The unit direction and its reciprocal ({@link GridCaster#FAR} for a zero component). */
    private static final int DX = 2;

    private static final int DY = 3;
    private static final int IVX = 4;
    private static final int IVY = 5;
    /** The traversal's cell, column and row as whole floats (at most two cells off the grid). */
    private static final int CX = 6;

    private static final int CY = 7;
    /** End of the ray in cells from where its march starts; -1 once the ray has hit (or at set-up, when it starts on an occupied cell), and on an idle lane. */
    private static final int TE = 8;
    /** Cells from the ray's origin to where its march starts. */
    private static final int SKIP = 9;
    /** Position along the ray in cells from where the march starts; the hit once the ray has hit (lanes only). */
    private static final int T = 10;

    /**
     * The lanes' state, quantity q of lane i at {@code q * LANES + i}. One array, not one per
     * quantity: the refill's copy then keeps its array and bound in registers instead of reloading
     * a dozen of each from the stack for every ray.
     */
    private final float[] lane = new float[11 * LANES];

    /** Index of the lane's ray (its index in the caller's arrays), -1 for an idle lane. */
    private final int[] ray = new int[LANES];

    private final int[] cells = new int[WIDTH];

    /** Per group, a bit per lane that has finished, as the group's last steps left it. */
    private final int[] finished = new int[GROUPS];

    /** Rays set up for the lanes, quantity q of position k at {@code q * SPACE + k} (SX to SKIP). */
    private final float[] prep = new float[10 * SPACE];

    /** The chunk's origins in single precision. */
    private final float[] fx = new float[SPACE];

    private final float[] fy = new float[SPACE];

    /** The call in progress: caster, rays, where the results go. */
    private GridCaster caster;

    private double[] xs;
    private double[] ys;
    private double[] dirX;
    private double[] dirY;
    private double maxRange;
    private double[] out;
    /** Next ray not yet set up, and the end of the rays. */
    private int next;

    private int end;
    /** Ray index of set-up position 0, how many positions are set up and how many went into lanes. */
    private int base;

    private int prepared;
    private int taken;
    /** Lanes holding a ray. */
    private int live;

    private LaneMarch() {}

    private static FloatVector laneBits() {
        float[] bits = new float[WIDTH];
        for (int k = 0; k < WIDTH; k++) {
            bits[k] = Float.intBitsToFloat(1 << k);
        }
        return FloatVector.fromArray(FLOATS, bits, 0);
    }

    /** This thread's lanes. */
    static LaneMarch local() {
        return LOCAL.get();
    }

    /** Casts rays {@code from .. from+count) from (xs[k], ys[k]) along (dirX[k], dirY[k]) into {@code out}. */
    void run(
            GridCaster c,
            double[] xs,
            double[] ys,
            double[] dirX,
            double[] dirY,
            int from,
            int count,
            double maxRange,
            double[] out) {
        this.caster = c;
        this.xs = xs;
        this.ys = ys;
        this.dirX = dirX;
        this.dirY = dirY;
        this.maxRange = maxRange;
        this.out = out;
        this.next = from;
        this.end = from + count;
        this.base = from;
        this.prepared = 0;
        this.taken = 0;
        this.live = 0;
        try {
            for (int i = 0; i < LANES; i++) {
                idle(i);
            }
            java.util.Arrays.fill(finished, (int) ((1L << WIDTH) - 1));
            float[] reach = c.reach;
            int width = c.width;
            int height = c.height;
            for (int g = 0; g < LANES; g += WIDTH) {
                refill(g);
            }
            // the hot loops sit in their own methods, so the JIT compiles them whole and early
            while (live > 0) {
                for (int g = 0; g < LANES; g += WIDTH) {
                    steps(g, reach, c.reachStride, c.reachOrigin, width, height);
                }
                for (int g = 0; g < LANES; g += WIDTH) {
                    refill(g);
                }
            }
        } finally {
            // the lanes outlive the call in a thread-local: hold on to no caller's arrays
            this.caster = null;
            this.xs = null;
            this.ys = null;
            this.dirX = null;
            this.dirY = null;
            this.out = null;
        }
    }

    /** Makes lane i idle and finished: finite state on the grid, so its (ignored) steps stay put. */
    private void idle(int i) {
        float[] l = lane;
        l[SX * LANES + i] = 0f;
        l[SY * LANES + i] = 0f;
        l[DX * LANES + i] = 1f;
        l[DY * LANES + i] = 0f;
        l[IVX * LANES + i] = 1f;
        l[IVY * LANES + i] = GridCaster.FAR;
        l[CX * LANES + i] = 0f;
        l[CY * LANES + i] = 0f;
        l[TE * LANES + i] = -1f;
        l[SKIP * LANES + i] = 0f;
        l[T * LANES + i] = 0f;
        ray[i] = -1;
    }

    /**
     * Writes out the finished rays of lanes g .. g+WIDTH and copies the next set-up rays into their
     * lanes (a straight copy, no branch on the ray's direction); lanes left without a ray go idle.
     */
    private void refill(int g) {
        float[] l = lane;
        long finished = this.finished[g / WIDTH] & 0xffffffffL;
        if (finished == 0L) {
            return;
        }
        if (prepared - taken < Long.bitCount(finished) && next < end) {
            restock();
        }
        float[] p = prep;
        int q = taken;
        for (long b = finished; b != 0L; b &= b - 1) {
            int i = g + Long.numberOfTrailingZeros(b);
            int r = ray[i];
            if (r >= 0) {
                out[r] = l[TE * LANES + i] < 0f ? caster.hitRange(l[SKIP * LANES + i], l[T * LANES + i]) : maxRange;
                live--;
            }
            if (q < prepared) {
                l[SX * LANES + i] = p[SX * SPACE + q];
                l[SY * LANES + i] = p[SY * SPACE + q];
                l[DX * LANES + i] = p[DX * SPACE + q];
                l[DY * LANES + i] = p[DY * SPACE + q];
                l[IVX * LANES + i] = p[IVX * SPACE + q];
                l[IVY * LANES + i] = p[IVY * SPACE + q];
                l[CX * LANES + i] = p[CX * SPACE + q];
                l[CY * LANES + i] = p[CY * SPACE + q];
                l[TE * LANES + i] = p[TE * SPACE + q];
                l[SKIP * LANES + i] = p[SKIP * SPACE + q];
                l[T * LANES + i] = 0f;
                ray[i] = base + q;
                q++;
            } else {
                idle(i);
            }
        }
        live += q - taken;
        taken = q;
    }

    /** Moves the set-up rays not yet taken to the front and sets up the next chunk after them. */
    private void restock() {
        int left = prepared - taken;
        for (int f = SX; f <= SKIP; f++) {
            System.arraycopy(prep, f * SPACE + taken, prep, f * SPACE, left);
        }
        base += taken;
        taken = 0;
        int count = Math.min(end - next, CHUNK);
        prepare(left, next, count);
        next += count;
        prepared = left + count;
    }

    /**
     * Sets up rays {@code from .. from+count) at positions {@code at ..}, a vector of rays at a
     * time, in the same operations as {@link GridCaster#castAlong}. A ray with nothing inside the
     * grid (or NaN input) gets length 0 and a harmless start, so its lane finishes at once with max
     * range.
     */
    private void prepare(int at, int from, int count) {
        GridCaster c = caster;
        int padded = (count + WIDTH - 1) / WIDTH * WIDTH;
        for (int j = 0; j < count; j++) {
            fx[at + j] = (float) xs[from + j];
            fy[at + j] = (float) ys[from + j];
            prep[DX * SPACE + at + j] = (float) dirX[from + j];
            prep[DY * SPACE + at + j] = (float) dirY[from + j];
        }
        for (int j = count; j < padded; j++) {
            fx[at + j] = c.originXf;
            fy[at + j] = c.originYf;
            prep[DX * SPACE + at + j] = 1f;
            prep[DY * SPACE + at + j] = 0f;
        }
        FloatVector width = FloatVector.broadcast(FLOATS, (float) c.width);
        FloatVector height = FloatVector.broadcast(FLOATS, (float) c.height);
        float cells = c.cells(maxRange);
        for (int j = at; j < at + padded; j += WIDTH) {
            FloatVector ldx = FloatVector.fromArray(FLOATS, prep, DX * SPACE + j);
            FloatVector ldy = FloatVector.fromArray(FLOATS, prep, DY * SPACE + j);
            FloatVector lix = ONE.div(ldx).blend(GridCaster.FAR, ldx.compare(VectorOperators.EQ, 0f));
            FloatVector liy = ONE.div(ldy).blend(GridCaster.FAR, ldy.compare(VectorOperators.EQ, 0f));
            FloatVector gx0 =
                    FloatVector.fromArray(FLOATS, fx, j).sub(c.originXf).mul(c.inverseCellf);
            FloatVector gy0 =
                    FloatVector.fromArray(FLOATS, fy, j).sub(c.originYf).mul(c.inverseCellf);
            FloatVector ax = gx0.neg().mul(lix);
            FloatVector bx = width.sub(gx0).mul(lix);
            FloatVector ay = gy0.neg().mul(liy);
            FloatVector by = height.sub(gy0).mul(liy);
            FloatVector enter = ax.min(bx).max(ay.min(by)).max(0f);
            FloatVector length = ax.max(bx).min(ay.max(by)).min(cells).sub(enter);
            VectorMask<Float> inside = length.compare(VectorOperators.GT, 0f);
            FloatVector gx = ZERO.blend(gx0.add(enter.mul(ldx)), inside);
            FloatVector gy = ZERO.blend(gy0.add(enter.mul(ldy)), inside);
            gx.intoArray(prep, SX * SPACE + j);
            gy.intoArray(prep, SY * SPACE + j);
            // GridCaster.cell: the floor by the 2^23 rounding trick, then the clamp
            FloatVector rx = gx.add(GridCaster.ROUND).sub(GridCaster.ROUND);
            rx.sub(1f, rx.compare(VectorOperators.GT, gx))
                    .max(0f)
                    .min((float) (c.width - 1))
                    .intoArray(prep, CX * SPACE + j);
            FloatVector ry = gy.add(GridCaster.ROUND).sub(GridCaster.ROUND);
            ry.sub(1f, ry.compare(VectorOperators.GT, gy))
                    .max(0f)
                    .min((float) (c.height - 1))
                    .intoArray(prep, CY * SPACE + j);
            ONE.blend(ldx, inside).intoArray(prep, DX * SPACE + j);
            ZERO.blend(ldy, inside).intoArray(prep, DY * SPACE + j);
            ONE.blend(lix, inside).intoArray(prep, IVX * SPACE + j);
            FAR.blend(liy, inside).intoArray(prep, IVY * SPACE + j);
            ZERO.blend(length, inside).intoArray(prep, TE * SPACE + j);
            enter.intoArray(prep, SKIP * SPACE + j);
        }
        markStartsOnOccupied(c, at, padded);
    }

    /**
     * Gives length -1 to the set-up rays that start within the slack of an occupied cell
     * ({@link GridCaster#startsOnOccupied}). That needs a closer look only where the start cell has
     * an occupied neighbour (reach 0 or below): one gather looks up the start cells of a vector of
     * rays, all in flight at once, and the closer look is scalar.
     */
    private void markStartsOnOccupied(GridCaster c, int at, int padded) {
        float[] reach = c.reach;
        for (int j = at; j < at + padded; j += WIDTH) {
            FloatVector.fromArray(FLOATS, prep, CY * SPACE + j)
                    .mul((float) c.reachStride)
                    .add(FloatVector.fromArray(FLOATS, prep, CX * SPACE + j))
                    .add(GridCaster.ROUND + c.reachOrigin)
                    .reinterpretAsInts()
                    .sub(ROUND_BITS)
                    .intoArray(cells, 0);
            if (FloatVector.fromArray(FLOATS, reach, 0, cells, 0)
                    .compare(VectorOperators.GT, 0f)
                    .allTrue()) {
                continue;
            }
            for (int k = j; k < j + WIDTH; k++) {
                if (prep[TE * SPACE + k] > 0f && c.startsOnOccupied(prep[SX * SPACE + k], prep[SY * SPACE + k])) {
                    prep[TE * SPACE + k] = -1f;
                }
            }
        }
    }

    /**
     * {@link #ROUNDS} steps of lanes g .. g+WIDTH, each exactly as {@link GridCaster#castAlong}
     * steps one ray, with the lane state in registers. Every vector operation is written out here,
     * not in a helper method of our own: C2 stops inlining our helpers once this method has grown
     * past its node budget, and a vector passed to or returned from a method that is not inlined is
     * boxed (see DEVELOPERS.md, "Ray casting").
     */
    private void steps(int g, float[] reach, int reachStride, int reachOrigin, int width, int height) {
        float[] l = lane;
        FloatVector tv = FloatVector.fromArray(FLOATS, l, T * LANES + g);
        FloatVector ev = FloatVector.fromArray(FLOATS, l, TE * LANES + g);
        FloatVector fx = FloatVector.fromArray(FLOATS, l, CX * LANES + g);
        FloatVector fy = FloatVector.fromArray(FLOATS, l, CY * LANES + g);
        FloatVector vsx = FloatVector.fromArray(FLOATS, l, SX * LANES + g);
        FloatVector vsy = FloatVector.fromArray(FLOATS, l, SY * LANES + g);
        FloatVector vdx = FloatVector.fromArray(FLOATS, l, DX * LANES + g);
        FloatVector vdy = FloatVector.fromArray(FLOATS, l, DY * LANES + g);
        FloatVector vivx = FloatVector.fromArray(FLOATS, l, IVX * LANES + g);
        FloatVector vivy = FloatVector.fromArray(FLOATS, l, IVY * LANES + g);
        // what castAlong works out once per ray: -0 counts as positive there (d >= 0), as here
        VectorMask<Float> negX = vdx.compare(VectorOperators.LT, 0f);
        VectorMask<Float> negY = vdy.compare(VectorOperators.LT, 0f);
        FloatVector landX = vsx.sub(BACK.blend(-GridCaster.LANDING_BACK, negX));
        FloatVector landY = vsy.sub(BACK.blend(-GridCaster.LANDING_BACK, negY));
        FloatVector ex = ONE.blend(0f, negX).sub(vsx);
        FloatVector ey = ONE.blend(0f, negY).sub(vsy);
        FloatVector stepX = ONE.blend(-1f, negX);
        FloatVector stepY = ONE.blend(-1f, negY);
        // the table's layout (GridCaster.reachStride, reachOrigin), and 2^23 to round by
        float stride = reachStride;
        float origin = GridCaster.ROUND + reachOrigin;
        int lastColumn = Float.floatToRawIntBits((float) (width - 1));
        int lastRow = Float.floatToRawIntBits((float) (height - 1));
        for (int r = 0; r < ROUNDS; r++) {
            VectorMask<Float> active = tv.compare(VectorOperators.LT, ev);
            // the bordered table's index, a whole float below 2^23 made an int by adding 2^23
            fy.mul(stride)
                    .add(fx)
                    .add(origin)
                    .reinterpretAsInts()
                    .sub(ROUND_BITS)
                    .intoArray(cells, 0);
            FloatVector d = FloatVector.fromArray(FLOATS, reach, 0, cells, 0);
            FloatVector tx = fx.add(ex).mul(vivx);
            FloatVector ty = fy.add(ey).mul(vivy);
            VectorMask<Float> acrossX = tx.compare(VectorOperators.LT, ty);
            // max(t, crossing): t is never negative or -0, so the int order of the bits is the float order
            FloatVector walkT = ty.blend(tx, acrossX)
                    .reinterpretAsInts()
                    .max(tv.reinterpretAsInts())
                    .reinterpretAsFloats();
            // min(t + reach, te): exact where both are non-negative; where either is negative the
            // int order picks a negative value, and a negative leap is never taken (walkT >= 0)
            FloatVector leapT =
                    tv.add(d).reinterpretAsInts().min(ev.reinterpretAsInts()).reinterpretAsFloats();
            VectorMask<Float> leap = leapT.compare(VectorOperators.GT, walkT);
            // the landing cell: GridCaster.cell lane by lane, kept as floats, the floor by the 2^23
            // rounding trick (the vector API cannot convert floats to ints on every JVM), then the
            // clamp on the bits (max 0 turns every negative float, -0 included, into +0)
            FloatVector px = vdx.mul(leapT).add(landX);
            FloatVector rx = px.add(GridCaster.ROUND).sub(GridCaster.ROUND);
            FloatVector lx = rx.sub(1f, rx.compare(VectorOperators.GT, px))
                    .reinterpretAsInts()
                    .max(0)
                    .min(lastColumn)
                    .reinterpretAsFloats();
            FloatVector py = vdy.mul(leapT).add(landY);
            FloatVector ry = py.add(GridCaster.ROUND).sub(GridCaster.ROUND);
            FloatVector ly = ry.sub(1f, ry.compare(VectorOperators.GT, py))
                    .reinterpretAsInts()
                    .max(0)
                    .min(lastRow)
                    .reinterpretAsFloats();
            FloatVector nx = fx.add(ZERO.blend(stepX, acrossX)).blend(lx, leap);
            FloatVector ny = fy.add(stepY.blend(0f, acrossX)).blend(ly, leap);
            FloatVector nt = walkT.blend(leapT, leap);
            // a marching lane on an occupied cell stops: te becomes -1 and t stays the hit
            FloatVector ne = ev.blend(ev.blend(-1f, d.compare(VectorOperators.EQ, GridCaster.OCCUPIED)), active);
            VectorMask<Float> move = tv.compare(VectorOperators.LT, ne);
            ev = ne;
            tv = tv.blend(nt, move);
            fx = fx.blend(nx, move);
            fy = fy.blend(ny, move);
        }
        ev.intoArray(l, TE * LANES + g);
        tv.intoArray(l, T * LANES + g);
        // which lanes have finished, one bit per lane: lane k's bit is the float whose raw bits are 1 << k
        finished[g / WIDTH] = ZERO.blend(LANE_BITS, tv.compare(VectorOperators.GE, ev))
                .reinterpretAsInts()
                .reduceLanes(VectorOperators.OR);
        fx.intoArray(l, CX * LANES + g);
        fy.intoArray(l, CY * LANES + g);
    }
}
