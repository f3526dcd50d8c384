package dev.driftlab.geometry;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import org.apache.commons.math3.distribution.NormalDistribution;
import org.junit.jupiter.api.Test;

class NormalMathTest {

    private final NormalDistribution standard = new NormalDistribution(0, 1);

    @Test
    void cdf_matchesCommonsMath() {
        // Numerical Recipes erfc fit: fractional error below 1.2e-7 (from memory); oracle Commons Math.
        for (double z = -6; z <= 6; z += 0.01) {
            double ref = standard.cumulativeProbability(z);
            assertThat(NormalMath.cdf(z)).isCloseTo(ref, within(2e-7 * ref + 1e-15));
        }
    }

    @Test
    void quantile_matchesCommonsMath() {
        // Acklam's approximation: relative error about 1.15e-9 (from memory); oracle Commons Math.
        for (double p : new double[] {
            1e-9,
            1e-6,
            1e-4,
            0.001,
            0.01,
            0.02,
            0.02425,
            0.025,
            0.1,
            0.3,
            0.5,
            0.8,
            0.9,
            0.95,
            0.975,
            0.99,
            0.999,
            1 - 0.02425,
            1 - 1e-6,
            1 - 1e-7
        }) {
            double ref = standard.inverseCumulativeProbability(p);
            assertThat(NormalMath.quantile(p)).isCloseTo(ref, within(1e-8 * Math.max(1, Math.abs(ref))));
        }
    }

    @Test
    void quantile_refusesProbabilitiesOutsideTheOpenUnitInterval() {
        for (double p : new double[] {0, 1, -0.1, 1.1, Double.NaN}) {
            assertThatThrownBy(() -> NormalMath.quantile(p))
                    .isInstanceOf(IllegalArgumentException.class)
                    .hasMessageContaining("probability");
        }
    }
}
