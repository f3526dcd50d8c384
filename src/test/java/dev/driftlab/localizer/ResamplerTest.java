package dev.driftlab.localizer;

import static org.assertj.core.api.Assertions.assertThat;

import dev.driftlab.scenario.LocalizerSettings.Scheme;
import java.util.SplittableRandom;
import org.apache.commons.math3.stat.inference.ChiSquareTest;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.EnumSource;

class ResamplerTest {

    private static final double[] WEIGHTS = {0.31, 0.005, 0.12, 0.0, 0.2, 0.045, 0.15, 0.17};

    @ParameterizedTest
    @EnumSource(Scheme.class)
    void everyScheme_isUnbiased_chiSquare(Scheme scheme) {
        // Douc, Cappe and Moulines (ISPA 2005): every scheme has E[N_i] = N w_i. Pooled counts over
        // many draws are tested against N w_i with the chi-square goodness-of-fit test of Commons
        // Math. For multinomial the pooled counts are exactly multinomial; the other schemes have
        // smaller variance, which only makes the statistic smaller. Significance 0.001: a false
        // alarm once in a thousand seeds.
        int n = WEIGHTS.length;
        int m = 10;
        int draws = 20_000;
        long[] counts = new long[n];
        int[] out = new int[m];
        SplittableRandom rng = new SplittableRandom(42);
        for (int t = 0; t < draws; t++) {
            Resampler.resample(scheme, WEIGHTS, n, m, rng, out);
            for (int k = 0; k < m; k++) {
                counts[out[k]]++;
            }
        }
        assertThat(counts[3]).as("zero-weight particle never drawn").isZero();
        int positive = 0;
        for (double w : WEIGHTS) {
            if (w > 0) {
                positive++;
            }
        }
        double[] expected = new double[positive];
        long[] observed = new long[positive];
        int j = 0;
        for (int i = 0; i < n; i++) {
            if (WEIGHTS[i] > 0) {
                expected[j] = (double) draws * m * WEIGHTS[i];
                observed[j] = counts[i];
                j++;
            }
        }
        double p = new ChiSquareTest().chiSquareTest(expected, observed);
        assertThat(p).as("chi-square p-value for %s", scheme).isGreaterThan(0.001);
    }

    @Test
    void systematic_givesFloorOrCeilOfNw() {
        // Douc, Cappe and Moulines (2005): systematic resampling gives floor(N w_i) or ceil(N w_i).
        assertCopies(Scheme.SYSTEMATIC, true);
    }

    @Test
    void residual_givesAtLeastFloorOfNw() {
        // Douc, Cappe and Moulines (2005): residual resampling keeps floor(N w_i) copies.
        assertCopies(Scheme.RESIDUAL, false);
    }

    private static void assertCopies(Scheme scheme, boolean atMostCeil) {
        SplittableRandom rng = new SplittableRandom(7);
        int n = 40;
        double[] w = new double[n];
        int[] out = new int[1000];
        for (int trial = 0; trial < 500; trial++) {
            double sum = 0;
            for (int i = 0; i < n; i++) {
                w[i] = rng.nextDouble() * rng.nextDouble();
                sum += w[i];
            }
            for (int i = 0; i < n; i++) {
                w[i] /= sum;
            }
            int m = 1 + rng.nextInt(999);
            Resampler.resample(scheme, w, n, m, rng, out);
            int[] copies = new int[n];
            for (int k = 0; k < m; k++) {
                copies[out[k]]++;
                if (k > 0) {
                    assertThat(out[k]).isGreaterThanOrEqualTo(out[k - 1]);
                }
            }
            for (int i = 0; i < n; i++) {
                double mw = m * w[i];
                // 1e-9 slack for the rounding of the cumulative sums.
                assertThat(copies[i]).isGreaterThanOrEqualTo((int) Math.floor(mw + 1e-9) - (isNearInteger(mw) ? 1 : 0));
                if (atMostCeil) {
                    assertThat(copies[i]).isLessThanOrEqualTo((int) Math.ceil(mw - 1e-9) + (isNearInteger(mw) ? 1 : 0));
                }
            }
        }
    }

    private static boolean isNearInteger(double v) {
        return Math.abs(v - Math.rint(v)) < 1e-9;
    }
}
