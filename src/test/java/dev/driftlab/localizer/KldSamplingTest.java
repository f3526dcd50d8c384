package dev.driftlab.localizer;

import static org.assertj.core.api.Assertions.assertThat;

import dev.driftlab.scenario.LocalizerSettings.Particles;
import dev.driftlab.scenario.LocalizerSettings.Start;
import org.apache.commons.math3.distribution.ChiSquaredDistribution;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

class KldSamplingTest {

    @ParameterizedTest
    @CsvSource({"2, 66", "3, 93", "10, 217", "100, 1347", "1000, 11060"})
    void bound_matchesWorkedValues(int k, int n) {
        // D. Fox, "Adapting the sample size in particle filters through KLD-sampling", The
        // International Journal of Robotics Research 22(12), 2003, the sample-size bound (Section 3,
        // section number from memory) in its Wilson-Hilferty form (E. B. Wilson and M. M. Hilferty,
        // "The distribution of chi-square", PNAS 17, 1931):
        // n = (k-1)/(2 eps) * (1 - 2/(9(k-1)) + sqrt(2/(9(k-1))) z)^3, rounded up, evaluated by hand
        // for epsilon 0.05, delta 0.01 (z_0.99 = 2.326348).
        assertThat(KldSampling.bound(k, 0.05, 0.99)).isEqualTo(n);
        // the test helper other packages check reported counts with agrees with the same values
        assertThat(FoxBound.particles(k, 0.05)).isEqualTo(n);
        assertThat(FoxBound.binsFor(n, 0.05, 5000)).hasValue(k);
        assertThat(FoxBound.binsFor(n + 1, 0.05, 5000)).isEmpty();
    }

    @ParameterizedTest
    @CsvSource({"10", "30", "100", "1000", "5000"})
    void bound_isWithinOnePercentOfExactChiSquareQuantile_forTenOrMoreBins(int k) {
        // Fox (2003): n = chi^2_{k-1, 1-delta} / (2 epsilon); exact quantile from Commons Math.
        double exact = new ChiSquaredDistribution(k - 1).inverseCumulativeProbability(0.99) / (2 * 0.05);
        double gap = Math.abs(KldSampling.bound(k, 0.05, 0.99) - exact) / exact;
        assertThat(gap).isLessThan(0.01);
    }

    @Test
    void targetCount_countsOccupiedBins_andClampsToLimits() {
        Particles p = new Particles(100, true, 50, 400, 0.05, 0.99, 0.5, Math.toRadians(10), Start.EVERYWHERE, 0, 0);
        KldSampling kld = new KldSampling(p);
        ParticleSet set = new ParticleSet(400);
        // 12 particles in 3 distinct bins (two share every coordinate bin, one differs in heading).
        double[] xs = {0.1, 0.2, 0.3, 0.1, 0.1, 0.2, 0.4, 0.3, 0.1, 0.2, 0.3, 0.1};
        double[] ys = {0.1, 0.1, 0.2, 0.3, 0.1, 0.1, 0.4, 0.3, 0.1, 0.1, 0.2, 0.3};
        double[] hs = {0, 0, 0, 0, 0, 0, 0, 0, 1.0, 1.0, 1.0, 0};
        set.setAll(xs, ys, hs, 12);
        assertThat(kld.occupiedBins(set)).isEqualTo(2);
        set.x[0] = 3.3;
        assertThat(kld.occupiedBins(set)).isEqualTo(3);
        assertThat(kld.targetCount(set)).isEqualTo(93);
        set.setAll(xs, ys, new double[12], 12);
        assertThat(kld.targetCount(set)).as("one bin: the minimum").isEqualTo(50);
    }
}
