package dev.driftlab.localizer;

import java.util.OptionalInt;

/**
 * The KLD-sampling bound written out independently of {@link KldSampling}, for tests that check a
 * reported particle count against it: D. Fox, "Adapting the sample size in particle filters through
 * KLD-sampling", The International Journal of Robotics Research 22(12), 2003, in the
 * Wilson-Hilferty form n = (k-1)/(2 eps) * (1 - 2/(9(k-1)) + sqrt(2/(9(k-1))) z_{1-delta})^3.
 * {@code KldSamplingTest} checks it against the worked values for epsilon 0.05, delta 0.01.
 */
public final class FoxBound {

    /** Standard normal 0.99 quantile (delta 0.01), to the precision of published tables. */
    public static final double Z_099 = 2.3263479;

    private FoxBound() {}

    /** Particles for k occupied bins, error bound epsilon, delta 0.01. */
    public static int particles(int k, double epsilon) {
        double km1 = k - 1;
        double a = 2.0 / (9.0 * km1);
        double t = 1.0 - a + Math.sqrt(a) * Z_099;
        return (int) Math.ceil(km1 / (2.0 * epsilon) * t * t * t);
    }

    /** The bin count k in [2, maxBins] whose bound is exactly {@code n}, if there is one. */
    public static OptionalInt binsFor(int n, double epsilon, int maxBins) {
        int lo = 2;
        int hi = maxBins;
        while (lo <= hi) {
            int mid = (lo + hi) >>> 1;
            int v = particles(mid, epsilon);
            if (v == n) {
                return OptionalInt.of(mid);
            }
            if (v < n) {
                lo = mid + 1;
            } else {
                hi = mid - 1;
            }
        }
        return OptionalInt.empty();
    }
}
