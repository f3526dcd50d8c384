package dev.driftlab.localizer;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.Arrays;
import org.junit.jupiter.api.Test;

class WeightsTest {

    @Test
    void effectiveSampleSize_equalWeights_isN() {
        // Kong, Liu and Wong (1994): ESS = 1 / sum(w^2) equals N for equal weights.
        int n = 1000;
        double[] w = new double[n];
        Arrays.fill(w, 1.0 / n);
        assertThat(Weights.effectiveSampleSize(w, n)).isCloseTo(n, within(1e-9));
    }

    @Test
    void effectiveSampleSize_oneParticleHoldsAll_isOne() {
        // Kong, Liu and Wong (1994): a single non-zero weight gives ESS = 1.
        double[] w = new double[50];
        w[17] = 1.0;
        assertThat(Weights.effectiveSampleSize(w, 50)).isCloseTo(1.0, within(1e-12));
    }

    @Test
    void effectiveSampleSize_unevenWeights_isTheExactInverseSumOfSquares() {
        // Kong, Liu and Wong, "Sequential imputations and Bayesian missing data problems", JASA
        // 89(425), 1994: ESS = 1 / sum(w^2). By hand: 1/(1/4 + 1/16 + 1/64 + 1/64) = 64/22 = 32/11.
        double[] w = {0.5, 0.25, 0.125, 0.125, 0.9}; // the fifth lies past n and must be ignored
        assertThat(Weights.effectiveSampleSize(w, 4)).isCloseTo(32.0 / 11.0, within(1e-12));
    }

    @Test
    void normalizeLog_hugeAndTinyLogs_givesFiniteWeightsSummingToOne() {
        double[] logs = {-2000, -2001, -2003, Double.NEGATIVE_INFINITY};
        double[] w = new double[4];
        double total = Weights.normalizeLog(logs, 4, w);
        // log-sum-exp by hand: -2000 + log(1 + e^-1 + e^-3)
        assertThat(total).isCloseTo(-2000 + Math.log(1 + Math.exp(-1) + Math.exp(-3)), within(1e-9));
        assertThat(w[0] + w[1] + w[2] + w[3]).isCloseTo(1.0, within(1e-12));
        assertThat(w[3]).isZero();
        assertThat(w[1] / w[0]).isCloseTo(Math.exp(-1), within(1e-12));
    }

    @Test
    void normalizeLog_everyWeightZero_fallsBackToEqualWeightsWithoutNaN() {
        double[] logs = {Double.NEGATIVE_INFINITY, Double.NEGATIVE_INFINITY, Double.NaN};
        double[] w = new double[3];
        double total = Weights.normalizeLog(logs, 3, w);
        assertThat(total).isEqualTo(Double.NEGATIVE_INFINITY);
        assertThat(w).containsOnly(1.0 / 3);
        assertThat(logs).containsOnly(-Math.log(3));
    }
}
