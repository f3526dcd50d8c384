package dev.driftlab.localizer;

import dev.driftlab.scenario.LocalizerSettings.Scheme;
import java.util.SplittableRandom;

/**
 * The four resampling schemes compared by Douc, Cappe and Moulines (2005). Each draws {@code m}
 * ancestor indices from normalised weights {@code w[0 .. n)} into {@code out[0 .. m)}, in
 * ascending order, with {@code E[copies of i] = m * w[i]}. Nothing here allocates per particle.
 */
public final class Resampler {

    private Resampler() {}

    /**
     * Draws ancestor indices with the given scheme.
     *
     * @param scheme which scheme
     * @param w normalised weights, summing to 1
     * @param n number of weights, at least 1
     * @param m number of indices to draw, at least 1
     * @param rng source of randomness
     * @param out receives {@code m} indices in [0, n), ascending
     */
    public static void resample(Scheme scheme, double[] w, int n, int m, SplittableRandom rng, int[] out) {
        resample(scheme, w, n, m, rng, out, null);
    }

    /**
     * As {@link #resample(Scheme, double[], int, int, SplittableRandom, int[])} with a scratch
     * array the caller keeps between calls, so the multinomial and residual schemes store their
     * random spacings instead of drawing them twice.
     *
     * @param scratch at least {@code m + 1} long, or null (then allocated when a scheme needs it)
     */
    public static void resample(
            Scheme scheme, double[] w, int n, int m, SplittableRandom rng, int[] out, double[] scratch) {
        switch (scheme) {
            case MULTINOMIAL -> multinomial(w, n, m, rng, out, spacings(scratch, m + 1));
            case STRATIFIED -> stratified(w, n, m, rng, out);
            case SYSTEMATIC -> systematic(w, n, m, rng, out);
            case RESIDUAL -> residual(w, n, m, rng, out, spacings(scratch, m + 1));
        }
    }

    private static double[] spacings(double[] scratch, int size) {
        return scratch != null && scratch.length >= size ? scratch : new double[size];
    }

    /**
     * Multinomial resampling: {@code m} independent draws. The sorted uniforms come from normalised
     * cumulative exponential spacings, so no sort is needed.
     */
    public static void multinomial(double[] w, int n, int m, SplittableRandom rng, int[] out) {
        multinomial(w, n, m, rng, out, new double[m + 1]);
    }

    private static void multinomial(double[] w, int n, int m, SplittableRandom rng, int[] out, double[] spacings) {
        // The first m of m + 1 cumulative Exp(1) sums, divided by the last, are m sorted uniforms.
        // The spacings come from a generator seeded from rng, kept in the scratch array so they are
        // drawn once (the total is needed before the walk).
        SplittableRandom draw = new SplittableRandom(rng.nextLong());
        double total = 0;
        for (int k = 0; k <= m; k++) {
            double e = exponential(draw);
            spacings[k] = e;
            total += e;
        }
        double scale = 1.0 / total;
        double pointer = spacings[0] * scale;
        int i = 0;
        double cum = w[0];
        for (int k = 0; k < m; k++) {
            while (pointer >= cum && i < n - 1) {
                cum += w[++i];
            }
            out[k] = i;
            pointer += spacings[k + 1] * scale;
        }
    }

    /**
     * Stratified resampling: one independent uniform in each of {@code m} equal strata of [0, 1).
     * Pointer k sits at {@code (k + u_k) / m}, so the pointers below a cumulative weight c number
     * {@code floor(c m)} plus one if the uniform of the stratum holding c falls below the fraction
     * of c m. Counting per particle this way needs the uniform only of strata that hold a boundary
     * (taken when first reached), and no data-dependent walk.
     */
    public static void stratified(double[] w, int n, int m, SplittableRandom rng, int[] out) {
        double cum = 0;
        int k = 0;
        int stratum = -1;
        long bits = 0;
        for (int i = 0; i < n && k < m; i++) {
            cum += w[i];
            double x = cum * m;
            int s = (int) x;
            // a fresh uniform (53 random bits) is drawn for every particle but kept only when the
            // boundary has moved into a new stratum: a select instead of an unpredictable branch
            long fresh = rng.nextLong() >>> 11;
            bits = s != stratum ? fresh : bits;
            stratum = s;
            int end = s >= m ? m : s + (bits * 0x1.0p-53 < x - s ? 1 : 0);
            k = fill(out, k, end < k ? k : Math.min(end, m), i, m);
        }
        // Rounding can leave the last pointers a hair past the final cumulative sum.
        int last = lastPositive(w, n);
        while (k < m) {
            out[k++] = last;
        }
    }

    /**
     * Systematic (low-variance) resampling: one uniform offset, then {@code m} equally spaced
     * pointers. Each particle gets {@code floor(m w_i)} or {@code ceil(m w_i)} copies.
     */
    public static void systematic(double[] w, int n, int m, SplittableRandom rng, int[] out) {
        double offset = rng.nextDouble();
        // Pointer k sits at (offset + k) / m, so the pointers below a cumulative weight c number
        // ceil(c * m - offset). Counting per particle instead of walking per pointer avoids a
        // data-dependent branch per step, which dominated the time on large sets.
        double cum = 0;
        int k = 0;
        for (int i = 0; i < n && k < m; i++) {
            cum += w[i];
            // ceil(x) in integers (x > -1, and (int) truncates towards zero): no double min or max
            double x = cum * m - offset;
            int c = (int) x;
            c += c < x ? 1 : 0;
            k = fill(out, k, c < k ? k : Math.min(c, m), i, m);
        }
        // Rounding can leave the last pointers a hair past the final cumulative sum.
        int last = lastPositive(w, n);
        while (k < m) {
            out[k++] = last;
        }
    }

    /**
     * Residual resampling: {@code floor(m w_i)} copies of each particle, the remaining draws
     * multinomial on the residual weights {@code m w_i - floor(m w_i)}.
     */
    public static void residual(double[] w, int n, int m, SplittableRandom rng, int[] out) {
        residual(w, n, m, rng, out, new double[m + 1]);
    }

    private static void residual(double[] w, int n, int m, SplittableRandom rng, int[] out, double[] spacings) {
        int floorTotal = 0;
        double residualSum = 0;
        for (int i = 0; i < n; i++) {
            double mw = m * w[i];
            double f = Math.floor(mw);
            floorTotal += (int) f;
            residualSum += mw - f;
        }
        int rest = Math.max(0, m - floorTotal);
        // Sorted uniforms over [0, residualSum) from exponential spacings (drawn once into the
        // scratch array), consumed in one pass together with the deterministic copies so the
        // output stays ascending.
        double scale = 0;
        double pointer = Double.POSITIVE_INFINITY;
        SplittableRandom draw = new SplittableRandom(rng.nextLong());
        if (rest > 0) {
            double total = 0;
            for (int k = 0; k <= rest; k++) {
                double e = exponential(draw);
                spacings[k] = e;
                total += e;
            }
            scale = residualSum / total;
            pointer = spacings[0] * scale;
        }
        int filled = 0;
        int drawn = 0;
        double cum = 0;
        for (int i = 0; i < n && filled < m; i++) {
            double mw = m * w[i];
            double f = Math.floor(mw);
            int copies = (int) f;
            cum += mw - f;
            while (drawn < rest && pointer < cum) {
                copies++;
                drawn++;
                pointer += spacings[drawn] * scale;
            }
            for (int c = 0; c < copies && filled < m; c++) {
                out[filled++] = i;
            }
        }
        // Rounding can leave the last pointer a hair past the final cumulative sum.
        int last = lastPositive(w, n);
        while (filled < m) {
            out[filled++] = last;
        }
    }

    /**
     * Writes ancestor {@code i} into {@code out[k .. end)} and returns {@code end}. Most particles
     * get 0 to 4 copies: those four stores are made unconditionally (the slots past {@code end}
     * are overwritten by the next particles; never at or past {@code m}), which avoids a data-dependent branch per particle.
     */
    private static int fill(int[] out, int k, int end, int i, int m) {
        if (end - k <= 4 && k + 4 <= m) {
            out[k] = i;
            out[k + 1] = i;
            out[k + 2] = i;
            out[k + 3] = i;
            return end;
        }
        while (k < end) {
            out[k++] = i;
        }
        return end;
    }

    private static double exponential(SplittableRandom rng) {
        return rng.nextExponential();
    }

    private static int lastPositive(double[] w, int n) {
        for (int i = n - 1; i > 0; i--) {
            if (w[i] > 0) {
                return i;
            }
        }
        return 0;
    }
}
