package dev.driftlab.evaluation;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.SplittableRandom;
import org.apache.commons.math3.stat.descriptive.rank.Percentile;
import org.apache.commons.math3.stat.interval.IntervalUtils;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

class StatsTest {

    /**
     * Worked values of the Wilson score interval at 95 %, rounded to 4 places: E. B. Wilson,
     * "Probable inference, the law of succession, and statistical inference", JASA 22(158), 1927
     * (the formula); 0/20 -> [0, 0.1611] is in R. G. Newcombe, "Two-sided confidence intervals for
     * the single proportion: comparison of seven methods", Statistics in Medicine 17(8), 1998,
     * Table II (from memory); the other rows are the formula evaluated by hand and agree with the
     * Commons Math oracle below.
     */
    @ParameterizedTest
    @CsvSource({"95,100,0.8882,0.9785", "100,100,0.9630,1.0", "0,20,0.0,0.1611", "18,20,0.6990,0.9721"})
    void wilson_matchesWorkedValues(int k, int n, double lo, double hi) {
        Interval ci = Stats.wilson(k, n, 0.95);

        assertThat(ci.lower()).isCloseTo(lo, within(5e-5));
        assertThat(ci.upper()).isCloseTo(hi, within(5e-5));
    }

    @Test
    void wilson_matchesCommonsMath_overManyProportions() {
        // oracle: Apache Commons Math 3.6.1 IntervalUtils.getWilsonScoreInterval
        for (int n = 1; n <= 120; n += 7) {
            for (int k = 0; k <= n; k++) {
                var ref = IntervalUtils.getWilsonScoreInterval(n, k, 0.95);
                Interval ours = Stats.wilson(k, n, 0.95);
                assertThat(ours.lower()).as("%d/%d", k, n).isCloseTo(Math.max(0, ref.getLowerBound()), within(1e-8));
                assertThat(ours.upper()).as("%d/%d", k, n).isCloseTo(Math.min(1, ref.getUpperBound()), within(1e-8));
            }
        }
    }

    @Test
    void percentile_matchesCommonsMathR7() {
        // oracle: Commons Math Percentile with estimation type R_7 (linear interpolation of closest ranks)
        SplittableRandom rng = new SplittableRandom(3);
        for (int trial = 0; trial < 50; trial++) {
            double[] v = new double[1 + rng.nextInt(40)];
            for (int i = 0; i < v.length; i++) {
                v[i] = rng.nextDouble() * 100;
            }
            for (double p : new double[] {1, 10, 50, 90, 99, 100}) {
                double ref = new Percentile()
                        .withEstimationType(Percentile.EstimationType.R_7)
                        .evaluate(v, p);
                assertThat(Stats.percentile(v, p)).isCloseTo(ref, within(1e-9));
            }
        }
    }

    @Test
    void percentile_ofEmpty_isNaN() {
        assertThat(Stats.percentile(new double[0], 50)).isNaN();
    }
}
