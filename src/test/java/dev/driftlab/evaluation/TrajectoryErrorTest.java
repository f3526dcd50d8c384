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

    // Relative pose error: Sturm, Engelhard, Endres, Burgard, Cremers, "A Benchmark for the Evaluation of
    // RGB-D SLAM Systems", IROS 2012, section on the relative pose error: E_i = (Q_i^-1 Q_{i+d})^-1 (P_i^-1
    // P_{i+d}), RMSE of trans(E_i) over all i.

    @Test
    void relativePoseError_ofAFivePercentScaleDrift_isTheDriftPerInterval() {
        // truth drives 1 m/s east for 10 s at 10 Hz; the estimate believes it drove 1.1 m/s. Over 1 s the
        // estimated motion is 1.1 m against 1.0 m true: 0.1 m of error in every pair; over 5 s, 0.5 m.
        int n = 101;
        double[] t = new double[n];
        double[] tx = new double[n];
        double[] zero = new double[n];
        double[] ex = new double[n];
        for (int i = 0; i < n; i++) {
            t[i] = i * 0.1;
            tx[i] = t[i];
            ex[i] = 1.1 * t[i];
        }

        assertThat(TrajectoryError.relativePoseError(t, tx, zero, zero, ex, zero, zero, n, 1.0, new double[0]))
                .isCloseTo(0.1, within(1e-9));
        assertThat(TrajectoryError.relativePoseError(t, tx, zero, zero, ex, zero, zero, n, 5.0, new double[0]))
                .isCloseTo(0.5, within(1e-9));
        // no pair fits an interval longer than the trace
        assertThat(TrajectoryError.relativePoseError(t, tx, zero, zero, ex, zero, zero, n, 11.0, new double[0]))
                .isNaN();
    }

    @Test
    void relativePoseError_ignoresAGlobalRigidOffset() {
        // the RPE measures local drift: an estimate that is the truth moved and turned as a whole has none
        int n = 60;
        double[] t = new double[n];
        double[] tx = new double[n];
        double[] ty = new double[n];
        double[] th = new double[n];
        double[] ex = new double[n];
        double[] ey = new double[n];
        double[] eh = new double[n];
        double c = Math.cos(0.7);
        double s = Math.sin(0.7);
        for (int i = 0; i < n; i++) {
            t[i] = i * 0.1;
            th[i] = 0.2 * t[i];
            tx[i] = 3 * Math.sin(0.2 * t[i]);
            ty[i] = 3 - 3 * Math.cos(0.2 * t[i]);
            ex[i] = c * tx[i] - s * ty[i] + 4;
            ey[i] = s * tx[i] + c * ty[i] - 1;
            eh[i] = th[i] + 0.7;
        }

        assertThat(TrajectoryError.relativePoseError(t, tx, ty, th, ex, ey, eh, n, 1.0, new double[0]))
                .isCloseTo(0, within(1e-12));
    }

    @Test
    void relativePoseError_equalsTheMatrixDefinition_onACurvedDriftingTrajectory() {
        int n = 80;
        double[] t = new double[n];
        double[] tx = new double[n];
        double[] ty = new double[n];
        double[] th = new double[n];
        double[] ex = new double[n];
        double[] ey = new double[n];
        double[] eh = new double[n];
        java.util.SplittableRandom rng = new java.util.SplittableRandom(42);
        for (int i = 0; i < n; i++) {
            t[i] = i * 0.1;
            th[i] = 0.3 * Math.sin(0.5 * t[i]);
            tx[i] = 0.8 * t[i];
            ty[i] = 0.5 * Math.sin(0.4 * t[i]);
            ex[i] = tx[i] + 0.02 * t[i] + 0.01 * rng.nextDouble();
            ey[i] = ty[i] - 0.03 * t[i];
            eh[i] = th[i] + 0.01 * t[i];
        }
        // independent computation: homogeneous 3x3 matrices inverted by Commons Math
        double sum = 0;
        int pairs = 0;
        for (int i = 0; i + 10 < n; i++) {
            int j = i + 10;
            org.apache.commons.math3.linear.RealMatrix q =
                    inv(se2(tx[i], ty[i], th[i])).multiply(se2(tx[j], ty[j], th[j]));
            org.apache.commons.math3.linear.RealMatrix p =
                    inv(se2(ex[i], ey[i], eh[i])).multiply(se2(ex[j], ey[j], eh[j]));
            org.apache.commons.math3.linear.RealMatrix e = inv(q).multiply(p);
            sum += e.getEntry(0, 2) * e.getEntry(0, 2) + e.getEntry(1, 2) * e.getEntry(1, 2);
            pairs++;
        }
        double expected = Math.sqrt(sum / pairs);

        assertThat(expected).isGreaterThan(0.01);
        assertThat(TrajectoryError.relativePoseError(t, tx, ty, th, ex, ey, eh, n, 1.0, new double[0]))
                .isCloseTo(expected, within(1e-12));
    }

    @Test
    void relativePoseError_leavesOutPairsThatSpanAJump() {
        // the truth is carried 10 m at 2.05 s; the estimate does not follow. Every 1 s pair that spans the
        // jump is left out, the rest have no error.
        int n = 51;
        double[] t = new double[n];
        double[] tx = new double[n];
        double[] zero = new double[n];
        double[] ex = new double[n];
        for (int i = 0; i < n; i++) {
            t[i] = i * 0.1;
            ex[i] = t[i];
            tx[i] = t[i] + (t[i] > 2.05 ? 10 : 0);
        }

        assertThat(TrajectoryError.relativePoseError(t, tx, zero, zero, ex, zero, zero, n, 1.0, new double[] {2.05}))
                .isCloseTo(0, within(1e-12));
        assertThat(TrajectoryError.relativePoseError(t, tx, zero, zero, ex, zero, zero, n, 1.0, new double[0]))
                .isGreaterThan(1);
    }

    private static org.apache.commons.math3.linear.RealMatrix se2(double x, double y, double h) {
        return org.apache.commons.math3.linear.MatrixUtils.createRealMatrix(
                new double[][] {{Math.cos(h), -Math.sin(h), x}, {Math.sin(h), Math.cos(h), y}, {0, 0, 1}});
    }

    private static org.apache.commons.math3.linear.RealMatrix inv(org.apache.commons.math3.linear.RealMatrix m) {
        return org.apache.commons.math3.linear.MatrixUtils.inverse(m);
    }
}
