package dev.driftlab.localizer;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import dev.driftlab.scenario.LocalizerSettings.RangeModel;
import dev.driftlab.scenario.LocalizerSettings.RangeModelKind;
import org.apache.commons.math3.analysis.integration.IterativeLegendreGaussIntegrator;
import org.apache.commons.math3.distribution.NormalDistribution;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

class BeamModelTest {

    private static final double Z_MAX = 10.0;
    private static final double SIGMA = 0.15;
    private final RangeModel settings = new RangeModel(RangeModelKind.BEAM, 1, 0.7, 0.1, 0.05, 0.15, SIGMA, 0.8, 0.05);
    private final BeamModel model = new BeamModel((x, y, a, m) -> m, settings);

    @ParameterizedTest
    @ValueSource(doubles = {0.05, 0.4, 3.0, 9.9, 10.0})
    void mixture_integratesToOne_overZeroToMaxRange(double expected) {
        // Thrun, Burgard and Fox (2005), section 6.3: each part is a density on [0, z_max] (the
        // max-range part a point mass of weight z_max), so the mixture integrates to 1. Quadrature:
        // Commons Math Legendre-Gauss, split at z* where the short part jumps.
        IterativeLegendreGaussIntegrator quad = new IterativeLegendreGaussIntegrator(32, 1e-12, 1e-12);
        double integral = 0;
        double[] cuts = {0, Math.max(0, expected - 8 * SIGMA), expected, Math.min(Z_MAX, expected + 8 * SIGMA), Z_MAX};
        for (int i = 0; i + 1 < cuts.length; i++) {
            if (cuts[i + 1] > cuts[i]) {
                integral += quad.integrate(100_000, z -> model.density(z, expected, Z_MAX), cuts[i], cuts[i + 1]);
            }
        }
        double pointMass = 0.05 / 1.0; // z_max weight; the four weights sum to 1
        // Tolerance: the truncation factor comes from an erfc fit with relative error 1.2e-7.
        assertThat(integral + pointMass).isCloseTo(1.0, within(1e-6));
    }

    @ParameterizedTest
    @ValueSource(doubles = {0.3, 2.0, 5.0, 9.0})
    void hitPart_equalsCommonsMathNormalDensity_timesTruncation(double expected) {
        // Section 6.3: p_hit = eta * N(z; z*, sigma^2) on [0, z_max], eta = 1 / (Phi((z_max - z*) /
        // sigma) - Phi(-z* / sigma)); Gaussian and Phi from Commons Math NormalDistribution.
        NormalDistribution n = new NormalDistribution(expected, SIGMA);
        double eta = 1.0 / (n.cumulativeProbability(Z_MAX) - n.cumulativeProbability(0));
        for (double z = Math.max(0, expected - 0.5); z <= Math.min(Z_MAX, expected + 0.5); z += 0.01) {
            double ref = eta * n.density(z);
            assertThat(model.hitPart(z, expected, Z_MAX)).isCloseTo(ref, within(1e-6 * Math.max(ref, 1e-3)));
        }
    }
}
