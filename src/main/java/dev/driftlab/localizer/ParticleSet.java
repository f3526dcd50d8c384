package dev.driftlab.localizer;

import dev.driftlab.geometry.Pose;

/**
 * The particles of the filter as a structure of arrays: position x and y in metres (site frame),
 * heading in radians wrapped to (-pi, pi], and the natural log of the weight. Log weights are
 * normalised so that their exponentials sum to 1 after each measurement update.
 *
 * <p>Mutable state owned by one filter; readers (recorders, views) use the indexed getters or the
 * copy methods. Capacity is fixed at construction so that updates never allocate.
 */
public final class ParticleSet {

    double[] x;
    double[] y;
    double[] heading;
    double[] logWeight;
    int size;

    /**
     * An empty set able to hold up to {@code capacity} particles.
     *
     * @param capacity largest number of particles, at least 1
     */
    public ParticleSet(int capacity) {
        if (capacity < 1) {
            throw new IllegalArgumentException("particle capacity must be >= 1, got " + capacity);
        }
        x = new double[capacity];
        y = new double[capacity];
        heading = new double[capacity];
        logWeight = new double[capacity];
    }

    /** Number of particles in use. */
    public int size() {
        return size;
    }

    /** Largest number of particles this set can hold. */
    public int capacity() {
        return x.length;
    }

    /** x of particle {@code i} in metres, site frame. */
    public double x(int i) {
        return x[check(i)];
    }

    /** y of particle {@code i} in metres, site frame. */
    public double y(int i) {
        return y[check(i)];
    }

    /** Heading of particle {@code i} in radians, wrapped to (-pi, pi]. */
    public double heading(int i) {
        return heading[check(i)];
    }

    /** Natural log of the normalised weight of particle {@code i}. */
    public double logWeight(int i) {
        return logWeight[check(i)];
    }

    /** Normalised weight of particle {@code i}, in [0, 1]. */
    public double weight(int i) {
        return Math.exp(logWeight[check(i)]);
    }

    /** Pose of particle {@code i}; allocates, so not for hot loops. */
    public Pose pose(int i) {
        check(i);
        return Pose.of(x[i], y[i], heading[i]);
    }

    /**
     * Copies the particles into caller-owned arrays of length at least {@code size()}.
     *
     * @param xOut receives x in metres
     * @param yOut receives y in metres
     * @param headingOut receives headings in radians
     * @param weightOut receives normalised weights
     */
    public void copyTo(double[] xOut, double[] yOut, double[] headingOut, double[] weightOut) {
        System.arraycopy(x, 0, xOut, 0, size);
        System.arraycopy(y, 0, yOut, 0, size);
        System.arraycopy(heading, 0, headingOut, 0, size);
        for (int i = 0; i < size; i++) {
            weightOut[i] = Math.exp(logWeight[i]);
        }
    }

    /**
     * Replaces the contents: {@code n} particles with the given poses and equal weights.
     *
     * @param xs x in metres
     * @param ys y in metres
     * @param headings headings in radians (wrapped here)
     * @param n number of particles, 1 to capacity
     */
    void setAll(double[] xs, double[] ys, double[] headings, int n) {
        resize(n);
        for (int i = 0; i < n; i++) {
            x[i] = xs[i];
            y[i] = ys[i];
            heading[i] = wrap(headings[i]);
        }
        setEqualWeights();
    }

    /**
     * Replaces the contents with a sample to show (an outside localizer's particles): {@code n}
     * poses and weights, the weights normalised here. {@code n} may be 0 (nothing to show).
     *
     * @param xs x in metres
     * @param ys y in metres
     * @param headings headings in radians (wrapped here)
     * @param weights weights, finite and not negative; all zero means equal
     * @param n number of particles, 0 to capacity
     */
    public void setSample(double[] xs, double[] ys, double[] headings, double[] weights, int n) {
        if (n < 0 || n > x.length) {
            throw new IllegalArgumentException("particle count must be in [0, " + x.length + "], got " + n);
        }
        double sum = 0;
        for (int i = 0; i < n; i++) {
            sum += weights[i];
        }
        for (int i = 0; i < n; i++) {
            x[i] = xs[i];
            y[i] = ys[i];
            heading[i] = wrap(headings[i]);
            logWeight[i] = sum > 0 ? Math.log(weights[i] / sum) : -Math.log(n);
        }
        size = n;
    }

    void resize(int n) {
        if (n < 1 || n > x.length) {
            throw new IllegalArgumentException("particle count must be in [1, " + x.length + "], got " + n);
        }
        size = n;
    }

    void setEqualWeights() {
        double lw = -Math.log(size);
        for (int i = 0; i < size; i++) {
            logWeight[i] = lw;
        }
    }

    private int check(int i) {
        if (i < 0 || i >= size) {
            throw new IndexOutOfBoundsException("particle " + i + " of " + size);
        }
        return i;
    }

    /** Wrap to (-pi, pi] without a division for the common case of a small excursion. */
    static double wrap(double a) {
        if (a > Math.PI) {
            a -= 2 * Math.PI;
            return a > Math.PI ? dev.driftlab.geometry.Angles.wrap(a) : a;
        }
        if (a <= -Math.PI) {
            a += 2 * Math.PI;
            return a <= -Math.PI ? dev.driftlab.geometry.Angles.wrap(a) : a;
        }
        return a;
    }
}
