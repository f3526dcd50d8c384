package dev.driftlab.evaluation;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import org.junit.jupiter.api.Test;

/** Absolute trajectory error (Sturm et al., IROS 2012) on trajectories computed by hand. */
class TrajectoryErrorTest {

    @Test
    void rmse_handComputed() {
        // errors 0.3, 0.4, 0 and 0.5: sqrt((0.09 + 0.16 + 0 + 0.25) / 4) = sqrt(0.125) = 0.353553...
        assertThat(TrajectoryError.rmse(new double[] {0.3, 0.4, 0, 0.5})).isCloseTo(Math.sqrt(0.125), within(1e-15));
    }

    @Test
    void alignedAte_removesAConstantOffsetAndRotation() {
        double[] tx = {0, 1, 2, 3};
        double[] ty = {0, 0, 1, 1};
        double c = Math.cos(0.3);
        double s = Math.sin(0.3);
        double[] ex = new double[4];
        double[] ey = new double[4];
        for (int i = 0; i < 4; i++) {
            ex[i] = c * tx[i] - s * ty[i] + 5;
            ey[i] = s * tx[i] + c * ty[i] - 2;
        }

        assertThat(TrajectoryError.alignedAte(tx, ty, ex, ey)).isCloseTo(0, within(1e-12));
    }

    @Test
    void alignedAte_handComputed_forSymmetricNoise() {
        // truth on a line; estimate alternates 0.1 m left and right of it. The best rigid alignment is
        // the identity (the offsets cancel in the mean and the cross-covariance), so ATE = 0.1 m.
        double[] tx = {0, 1, 2, 3};
        double[] ty = {0, 0, 0, 0};
        double[] ex = {0, 1, 2, 3};
        double[] ey = {0.1, -0.1, -0.1, 0.1};

        assertThat(TrajectoryError.alignedAte(tx, ty, ex, ey)).isCloseTo(0.1, within(1e-12));
    }
}
