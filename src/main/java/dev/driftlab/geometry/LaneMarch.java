package dev.driftlab.geometry;

import jdk.incubator.vector.FloatVector;
import jdk.incubator.vector.VectorMask;
import jdk.incubator.vector.VectorOperators;
import jdk.incubator.vector.VectorSpecies;

/**
 * The grid caster's march on vector lanes: {@link #GROUPS} groups of one vector's width of rays
 * (64 rays on a machine with 512-bit vectors) advance one step per round, each lane doing exactly
 * what {@link GridCaster#castAlong} does for its ray, in the same single-precision operations and
 * order, so the ranges are the same bit for bit. Every few rounds a scalar pass writes out the
 * rays that have finished and loads the next rays into their lanes, so lanes rarely idle while
 * long rays are still marching.
 *
 * <p>Uses the incubating vector API; only loaded when {@link GridCaster#LANES_AVAILABLE}. Holds
 * the lane state of one thread ({@link #local}); nothing is allocated per ray.
 */
final class LaneMarch {

    private static final VectorSpecies<Float> FLOATS = FloatVector.SPECIES_PREFERRED;
    private static final int WIDTH = FLOATS.length();
    private static final int GROUPS = 4;
    private static final int LANES = WIDTH * GROUPS;

    /** Rounds between refills (measured best among 1 to 8: fewer and the refill pass dominates). */
    private static final int ROUNDS = 4;

    private static final int ROUND_BITS = Float.floatToRawIntBits(GridCaster.ROUND);

    private static final FloatVector ZERO = FloatVector.zero(FLOATS);
    private static final FloatVector ONE = FloatVector.broadcast(FLOATS, 1f);
    private static final FloatVector FAR = FloatVector.broadcast(FLOATS, GridCaster.FAR);

    private static final ThreadLocal<LaneMarch> LOCAL = ThreadLocal.withInitial(LaneMarch::new);

    /** Where leaps land from: the march start set back along each axis ({@link GridCaster#LANDING_BACK}). */
    private final float[] gx = new float[LANES];

    private final float[] gy = new float[LANES];
    private final float[] dx = new float[LANES];
    private final float[] dy = new float[LANES];
    private final float[] ivx = new float[LANES];
    private final float[] ivy = new float[LANES];
    /** The ray leaves column cx at t = (cx + ex) * ivx, row cy at t = (cy + ey) * ivy. */
    private final float[] ex = new float[LANES];

    private final float[] ey = new float[LANES];
    /** +1 or -1: the traversal's step across a column or row edge. */
    private final float[] stepX = new float[LANES];

    private final float[] stepY = new float[LANES];
    /** The traversal's cell, column and row as whole floats (may be just off the grid by rounding). */
    private final float[] cx = new float[LANES];

    private final float[] cy = new float[LANES];
    /** Position along the ray in cells from where the march starts; the hit once the ray has hit. */
    private final float[] t = new float[LANES];
    /** End of the ray in cells from where its march starts; -1 once the ray has hit (or at set-up, when it starts on an occupied cell). */
    private final float[] te = new float[LANES];
    /** Cells from the ray's origin to where its march starts (where it enters the grid). */
    private final float[] skip = new float[LANES];
    /** Index of the lane's ray (its index in the caller's arrays), -1 for an idle lane. */
    private final int[] ray = new int[LANES];

    private final int[] cells = new int[WIDTH];
    /** Lanes found finished in one pass. */
    private final int[] done = new int[LANES + 1];

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
    /** First ray of the current chunk, how many it set up and how many went into lanes. */
    private int base;

    private int prepared;
    private int taken;

    /** Rays set up per pass of {@link #prepare}: 512 rays' set-up takes 20 KB. */
    private static final int CHUNK = 512;

    /** The current chunk's rays set up for the lanes. */
    private float[] pgx = new float[0];

    private float[] pgy = new float[0];
    private float[] pdx = new float[0];
    private float[] pdy = new float[0];
    private float[] pivx = new float[0];
    private float[] pivy = new float[0];
    private float[] pte = new float[0];
    private float[] pskip = new float[0];
    /** The batch's origins in single precision. */
    private float[] fx = new float[0];

    private float[] fy = new float[0];

    private LaneMarch() {}

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
        this.prepared = 0;
        this.taken = 0;
        try {
            int live = 0;
            for (int i = 0; i < LANES; i++) {
                if (fill(i)) {
                    live++;
                }
            }
            float[] reach = c.reach;
            int width = c.width;
            int height = c.height;
            // the hot loops sit in small methods, so the JIT compiles them whole and early
            while (live > 0) {
                rounds(reach, width, height);
                live -= harvest();
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

    /** {@link #ROUNDS} steps of every lane. */
    private void rounds(float[] reach, int width, int height) {
        for (int r = 0; r < ROUNDS; r++) {
            for (int g = 0; g < LANES; g += WIDTH) {
                step(g, reach, width, height);
            }
        }
    }

    /** Writes out the rays that finished and refills their lanes; returns how many lanes went idle. */
    private int harvest() {
        // which lanes finished, listed without a branch per lane (their pattern is random)
        int finished = 0;
        for (int i = 0; i < LANES; i++) {
            done[finished] = i;
            finished += (ray[i] >= 0) & !(t[i] < te[i]) ? 1 : 0;
        }
        int idled = 0;
        for (int j = 0; j < finished; j++) {
            int i = done[j];
            out[ray[i]] = te[i] < 0f ? caster.hitRange(skip[i], t[i]) : maxRange;
            if (!fill(i)) {
                idled++;
            }
        }
        return idled;
    }

    /**
     * Puts the next ray into lane i, setting up the next chunk of rays when the current one is used
     * up (so the set-up arrays stay in the first-level cache), or makes the lane idle when no ray
     * is left; true when a ray went in.
     */
    private boolean fill(int i) {
        if (taken == prepared && next < end) {
            base = next;
            prepared = Math.min(end - next, CHUNK);
            prepare(next, prepared);
            next += prepared;
            taken = 0;
        }
        if (taken < prepared) {
            take(i, base, taken++);
            return true;
        }
        idle(i);
        return false;
    }

    /**
     * Sets up rays {@code from .. from+count) for the lanes, a vector of rays at a time, in the same
     * operations as {@link GridCaster#castAlong}. A ray with nothing inside the grid (or NaN
     * input) gets length 0 and a harmless start, so its lane finishes at once with max range.
     */
    private void prepare(int from, int count) {
        GridCaster c = caster;
        int padded = (count + WIDTH - 1) / WIDTH * WIDTH;
        if (pgx.length < padded) {
            int size = Math.max(padded, pgx.length * 2);
            fx = new float[size];
            fy = new float[size];
            pgx = new float[size];
            pgy = new float[size];
            pdx = new float[size];
            pdy = new float[size];
            pivx = new float[size];
            pivy = new float[size];
            pte = new float[size];
            pskip = new float[size];
        }
        for (int j = 0; j < count; j++) {
            fx[j] = (float) xs[from + j];
            fy[j] = (float) ys[from + j];
            pdx[j] = (float) dirX[from + j];
            pdy[j] = (float) dirY[from + j];
        }
        for (int j = count; j < padded; j++) {
            fx[j] = c.originXf;
            fy[j] = c.originYf;
            pdx[j] = 1f;
            pdy[j] = 0f;
        }
        FloatVector width = FloatVector.broadcast(FLOATS, (float) c.width);
        FloatVector height = FloatVector.broadcast(FLOATS, (float) c.height);
        float cells = c.cells(maxRange);
        for (int j = 0; j < padded; j += WIDTH) {
            FloatVector ldx = FloatVector.fromArray(FLOATS, pdx, j);
            FloatVector ldy = FloatVector.fromArray(FLOATS, pdy, j);
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
            ZERO.blend(gx0.add(enter.mul(ldx)), inside).intoArray(pgx, j);
            ZERO.blend(gy0.add(enter.mul(ldy)), inside).intoArray(pgy, j);
            ONE.blend(ldx, inside).intoArray(pdx, j);
            ZERO.blend(ldy, inside).intoArray(pdy, j);
            ONE.blend(lix, inside).intoArray(pivx, j);
            FAR.blend(liy, inside).intoArray(pivy, j);
            ZERO.blend(length, inside).intoArray(pte, j);
            enter.intoArray(pskip, j);
        }
        // rare and so well predicted: a start next to an occupied cell
        for (int j = 0; j < count; j++) {
            if (pte[j] > 0f && c.startsOnOccupied(pgx[j], pgy[j])) {
                pte[j] = -1f;
            }
        }
    }

    /** Puts prepared ray q of the chunk starting at ray {@code base} into lane i. */
    private void take(int i, int base, int q) {
        float ldx = pdx[q];
        float ldy = pdy[q];
        float lgx = pgx[q];
        float lgy = pgy[q];
        gx[i] = lgx - GridCaster.back(ldx);
        gy[i] = lgy - GridCaster.back(ldy);
        dx[i] = ldx;
        dy[i] = ldy;
        ivx[i] = pivx[q];
        ivy[i] = pivy[q];
        ex[i] = GridCaster.side(ldx) - lgx;
        ey[i] = GridCaster.side(ldy) - lgy;
        stepX[i] = ldx >= 0f ? 1f : -1f;
        stepY[i] = ldy >= 0f ? 1f : -1f;
        cx[i] = GridCaster.cell(lgx, caster.width);
        cy[i] = GridCaster.cell(lgy, caster.height);
        t[i] = 0f;
        te[i] = pte[q];
        skip[i] = pskip[q];
        ray[i] = base + q;
    }

    /** Makes lane i idle: finite state, so its (ignored) steps look up a cell inside the grid. */
    private void idle(int i) {
        gx[i] = 0f;
        gy[i] = 0f;
        dx[i] = 1f;
        dy[i] = 0f;
        ivx[i] = 1f;
        ivy[i] = GridCaster.FAR;
        ex[i] = 1f;
        ey[i] = 1f;
        stepX[i] = 1f;
        stepY[i] = 1f;
        cx[i] = 0f;
        cy[i] = 0f;
        t[i] = 0f;
        te[i] = -1f;
        ray[i] = -1;
    }

    /** One step of the lanes g .. g+WIDTH, exactly as {@link GridCaster#castAlong} steps one ray. */
    private void step(int g, float[] reach, int width, int height) {
        FloatVector tv = FloatVector.fromArray(FLOATS, t, g);
        FloatVector ev = FloatVector.fromArray(FLOATS, te, g);
        VectorMask<Float> active = tv.compare(VectorOperators.LT, ev);
        FloatVector fx = FloatVector.fromArray(FLOATS, cx, g);
        FloatVector fy = FloatVector.fromArray(FLOATS, cy, g);
        fy.max(0f)
                .min((float) (height - 1))
                .mul((float) width)
                .add(fx.max(0f).min((float) (width - 1)))
                .add(GridCaster.ROUND)
                .reinterpretAsInts()
                .sub(ROUND_BITS)
                .intoArray(cells, 0);
        FloatVector d = FloatVector.fromArray(FLOATS, reach, 0, cells, 0);
        FloatVector tx = fx.add(FloatVector.fromArray(FLOATS, ex, g)).mul(FloatVector.fromArray(FLOATS, ivx, g));
        FloatVector ty = fy.add(FloatVector.fromArray(FLOATS, ey, g)).mul(FloatVector.fromArray(FLOATS, ivy, g));
        VectorMask<Float> acrossX = tx.compare(VectorOperators.LT, ty);
        FloatVector walkT = ty.blend(tx, acrossX).max(tv);
        FloatVector leapT = tv.add(d).min(ev);
        VectorMask<Float> leap = leapT.compare(VectorOperators.GT, walkT);
        // the landing cell: GridCaster.cell lane by lane, kept as floats, the floor by the 2^23
        // rounding trick (the vector API cannot convert floats to ints on every JVM), then the same
        // clamp. Written out here, not in a helper method: C2 stops inlining our own methods once
        // this step has grown past its node budget (NodeCountInliningCutoff), and a vector passed
        // to or returned from a method that is not inlined is boxed, about 140 bytes per ray.
        FloatVector px = FloatVector.fromArray(FLOATS, dx, g).mul(leapT).add(FloatVector.fromArray(FLOATS, gx, g));
        FloatVector rx = px.add(GridCaster.ROUND).sub(GridCaster.ROUND);
        FloatVector lx = rx.sub(1f, rx.compare(VectorOperators.GT, px)).max(0f).min((float) (width - 1));
        FloatVector py = FloatVector.fromArray(FLOATS, dy, g).mul(leapT).add(FloatVector.fromArray(FLOATS, gy, g));
        FloatVector ry = py.add(GridCaster.ROUND).sub(GridCaster.ROUND);
        FloatVector ly = ry.sub(1f, ry.compare(VectorOperators.GT, py)).max(0f).min((float) (height - 1));
        FloatVector nx = fx.add(ZERO.blend(FloatVector.fromArray(FLOATS, stepX, g), acrossX))
                .blend(lx, leap);
        FloatVector ny = fy.add(FloatVector.fromArray(FLOATS, stepY, g).blend(0f, acrossX))
                .blend(ly, leap);
        FloatVector nt = walkT.blend(leapT, leap);
        // a marching lane on an occupied cell stops: te becomes -1 and t stays the hit
        FloatVector ne = ev.blend(ev.blend(-1f, d.compare(VectorOperators.EQ, GridCaster.OCCUPIED)), active);
        ne.intoArray(te, g);
        VectorMask<Float> move = tv.compare(VectorOperators.LT, ne);
        tv.blend(nt, move).intoArray(t, g);
        fx.blend(nx, move).intoArray(cx, g);
        fy.blend(ny, move).intoArray(cy, g);
    }
}
