package dev.driftlab.evaluation;

import dev.driftlab.recording.Frame;
import java.util.Arrays;

/**
 * The per-frame figures of one run that evaluation needs, as growable primitive columns: time,
 * true pose, estimate, odometry pose and the filter's own figures. Appending is amortised O(1) and
 * allocates only when a column grows.
 */
public final class RunTrace {

    private int size;
    private double[] t = new double[256];
    private double[] tx = new double[256];
    private double[] ty = new double[256];
    private double[] th = new double[256];
    private double[] ex = new double[256];
    private double[] ey = new double[256];
    private double[] eh = new double[256];
    private double[] meanLikelihood = new double[256];
    private double[] ess = new double[256];
    private int[] particles = new int[256];
    private int[] injected = new int[256];
    private double[] wSlow = new double[256];
    private double[] wFast = new double[256];
    private double[] kidnaps = new double[0];
    private double[] jumps = new double[0];

    /** A trace of recorded frames, read back from storage (kidnap times are not in frames). */
    public static RunTrace of(java.util.List<Frame> frames) {
        RunTrace trace = new RunTrace();
        for (Frame f : frames) {
            trace.add(
                    f.time(),
                    f.truth().x(),
                    f.truth().y(),
                    f.truth().heading(),
                    f.estimate().x(),
                    f.estimate().y(),
                    f.estimate().heading(),
                    f.meanLikelihood(),
                    f.effectiveSize(),
                    f.particleCount(),
                    f.injected(),
                    f.slowAverage(),
                    f.fastAverage());
        }
        return trace;
    }

    /**
     * Appends one frame.
     *
     * @param time seconds from the run start, not decreasing
     * @param trueX true position, metres
     * @param trueY true position, metres
     * @param trueHeading true heading, radians
     * @param estX estimated position, metres
     * @param estY estimated position, metres
     * @param estHeading estimated heading, radians
     * @param likelihood mean beam likelihood of the update (filter's own figure)
     * @param effectiveSize effective sample size after weighting
     * @param count particle count
     * @param injectedCount particles injected by recovery in this update
     * @param slow slow likelihood average (w_slow)
     * @param fast fast likelihood average (w_fast)
     */
    public void add(
            double time,
            double trueX,
            double trueY,
            double trueHeading,
            double estX,
            double estY,
            double estHeading,
            double likelihood,
            double effectiveSize,
            int count,
            int injectedCount,
            double slow,
            double fast) {
        if (size > 0 && time < t[size - 1]) {
            throw new IllegalArgumentException("frame times must not decrease: " + time + " after " + t[size - 1]);
        }
        if (size == t.length) {
            grow();
        }
        t[size] = time;
        tx[size] = trueX;
        ty[size] = trueY;
        th[size] = trueHeading;
        ex[size] = estX;
        ey[size] = estY;
        eh[size] = estHeading;
        meanLikelihood[size] = likelihood;
        ess[size] = effectiveSize;
        particles[size] = count;
        injected[size] = injectedCount;
        wSlow[size] = slow;
        wFast[size] = fast;
        size++;
    }

    /** Records the time of a kidnap fault (seconds), in the order they happen. */
    public void addKidnap(double time) {
        kidnaps = Arrays.copyOf(kidnaps, kidnaps.length + 1);
        kidnaps[kidnaps.length - 1] = time;
    }

    /** Records a time the true pose jumped (a kidnap or a shove), for the relative pose error. */
    public void addJump(double time) {
        jumps = Arrays.copyOf(jumps, jumps.length + 1);
        jumps[jumps.length - 1] = time;
    }

    /**
     * Relative pose error over intervals of {@code delta} seconds, metres; NaN when the trace is
     * shorter than one interval. Pairs that span a recorded jump of the true pose are left out.
     *
     * @see TrajectoryError#relativePoseError
     */
    public double relativePoseError(double delta) {
        double[] breaks = new double[kidnaps.length + jumps.length];
        System.arraycopy(kidnaps, 0, breaks, 0, kidnaps.length);
        System.arraycopy(jumps, 0, breaks, kidnaps.length, jumps.length);
        return TrajectoryError.relativePoseError(t, tx, ty, th, ex, ey, eh, size, delta, breaks);
    }

    private void grow() {
        int n = t.length * 2;
        t = Arrays.copyOf(t, n);
        tx = Arrays.copyOf(tx, n);
        ty = Arrays.copyOf(ty, n);
        th = Arrays.copyOf(th, n);
        ex = Arrays.copyOf(ex, n);
        ey = Arrays.copyOf(ey, n);
        eh = Arrays.copyOf(eh, n);
        meanLikelihood = Arrays.copyOf(meanLikelihood, n);
        ess = Arrays.copyOf(ess, n);
        particles = Arrays.copyOf(particles, n);
        injected = Arrays.copyOf(injected, n);
        wSlow = Arrays.copyOf(wSlow, n);
        wFast = Arrays.copyOf(wFast, n);
    }

    /** Number of frames. */
    public int size() {
        return size;
    }

    /** Time of frame i, seconds. */
    public double time(int i) {
        return t[i];
    }

    /** Position error of frame i, metres. */
    public double positionError(int i) {
        return Math.hypot(ex[i] - tx[i], ey[i] - ty[i]);
    }

    /** Absolute heading error of frame i, radians in [0, pi]. */
    public double headingError(int i) {
        return Math.abs(dev.driftlab.geometry.Angles.difference(eh[i], th[i]));
    }

    /** Mean beam likelihood of frame i. */
    public double meanLikelihood(int i) {
        return meanLikelihood[i];
    }

    /** Effective sample size of frame i. */
    public double effectiveSize(int i) {
        return ess[i];
    }

    /** Particle count of frame i. */
    public int particles(int i) {
        return particles[i];
    }

    /** Particles injected in frame i. */
    public int injected(int i) {
        return injected[i];
    }

    /** Slow likelihood average in frame i. */
    public double slowAverage(int i) {
        return wSlow[i];
    }

    /** Fast likelihood average in frame i. */
    public double fastAverage(int i) {
        return wFast[i];
    }

    /** True x of frame i. */
    public double trueX(int i) {
        return tx[i];
    }

    /** True y of frame i. */
    public double trueY(int i) {
        return ty[i];
    }

    /** Estimated x of frame i. */
    public double estX(int i) {
        return ex[i];
    }

    /** Estimated y of frame i. */
    public double estY(int i) {
        return ey[i];
    }

    /** True heading of frame i, radians. */
    public double trueHeading(int i) {
        return th[i];
    }

    /** Estimated heading of frame i, radians. */
    public double estHeading(int i) {
        return eh[i];
    }

    /** Times the true pose jumped (see {@link #addJump}), seconds, in order. */
    public double[] jumpTimes() {
        return jumps.clone();
    }

    /** Kidnap times, seconds, in order. */
    public double[] kidnapTimes() {
        return kidnaps.clone();
    }

    /** All position errors, metres. */
    public double[] positionErrors() {
        double[] out = new double[size];
        for (int i = 0; i < size; i++) {
            out[i] = positionError(i);
        }
        return out;
    }

    /** All frame times, seconds. */
    public double[] times() {
        return Arrays.copyOf(t, size);
    }
}
