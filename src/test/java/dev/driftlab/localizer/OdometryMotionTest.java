package dev.driftlab.localizer;

import static org.assertj.core.api.Assertions.assertThat;

import dev.driftlab.geometry.Pose;
import dev.driftlab.scenario.LocalizerSettings.MotionNoise;
import java.util.SplittableRandom;
import org.apache.commons.math3.distribution.ChiSquaredDistribution;
import org.junit.jupiter.api.Test;

class OdometryMotionTest {

    @Test
    void sampledMotionComponents_haveTheFormulaMeansAndVariances() {
        // Thrun, Burgard and Fox, Probabilistic Robotics (2005), table 5.6, variance form:
        // rot1 ~ N(d_rot1, a1 d_rot1^2 + a2 d_trans^2), trans ~ N(d_trans, a3 d_trans^2 +
        // a4 (d_rot1^2 + d_rot2^2)), rot2 ~ N(d_rot2, a1 d_rot2^2 + a2 d_trans^2).
        double a1 = 0.05;
        double a2 = 0.02;
        double a3 = 0.03;
        double a4 = 0.01;
        OdometryMotion motion = new OdometryMotion(new MotionNoise(a1, a2, a3, a4, 0, 0));
        Pose before = Pose.of(2.0, -1.0, 0.4);
        Pose after = Pose.of(2.6, -0.5, 0.9);
        OdometryMotion.Delta d = OdometryMotion.Delta.between(before, after);
        assertThat(d.drive()).isCloseTo(Math.hypot(0.6, 0.5), org.assertj.core.api.Assertions.within(1e-12));

        int n = 200_000;
        ParticleSet set = new ParticleSet(n);
        double[] zeros = new double[n];
        set.setAll(zeros, zeros, zeros, n);
        motion.apply(set, d, new SplittableRandom(11));

        double[] mean = new double[3];
        double[] sq = new double[3];
        double[] c = new double[3];
        for (int i = 0; i < n; i++) {
            // The start pose is the origin, so the three components are recoverable exactly.
            double trans = Math.hypot(set.x(i), set.y(i));
            double rot1 = Math.atan2(set.y(i), set.x(i));
            double rot2 = ParticleSet.wrap(set.heading(i) - rot1);
            c[0] = rot1;
            c[1] = trans;
            c[2] = rot2;
            for (int k = 0; k < 3; k++) {
                mean[k] += c[k];
                sq[k] += c[k] * c[k];
            }
        }
        double r1 = d.firstTurn();
        double t = d.drive();
        double r2 = d.secondTurn();
        double[] expectMean = {r1, t, r2};
        double[] expectVar = {
            a1 * r1 * r1 + a2 * t * t, a3 * t * t + a4 * (r1 * r1 + r2 * r2), a1 * r2 * r2 + a2 * t * t
        };
        // (n - 1) s^2 / sigma^2 ~ chi-square(n - 1) for normal samples; accept the central 99.9 %
        // (Commons Math quantiles). Means: within 4.4 standard errors (two-sided 1e-5).
        ChiSquaredDistribution chi = new ChiSquaredDistribution(n - 1);
        double lo = chi.inverseCumulativeProbability(0.0005) / (n - 1);
        double hi = chi.inverseCumulativeProbability(0.9995) / (n - 1);
        for (int k = 0; k < 3; k++) {
            double m = mean[k] / n;
            double var = (sq[k] - n * m * m) / (n - 1);
            assertThat(Math.abs(m - expectMean[k]))
                    .as("mean of component %d", k)
                    .isLessThan(4.4 * Math.sqrt(expectVar[k] / n));
            assertThat(var / expectVar[k])
                    .as("variance ratio of component %d", k)
                    .isBetween(lo, hi);
        }
    }

    @Test
    void zeroNoise_movesEveryParticleExactly() {
        OdometryMotion motion = new OdometryMotion(new MotionNoise(0, 0, 0, 0, 0, 0));
        ParticleSet set = new ParticleSet(1);
        set.setAll(new double[] {1}, new double[] {1}, new double[] {Math.PI / 2}, 1);
        // Odometry frame rotated against the site frame: only the relative motion matters.
        motion.apply(set, OdometryMotion.Delta.between(Pose.of(0, 0, 0), Pose.of(1, 0, 0)), new SplittableRandom(1));
        assertThat(set.x(0)).isCloseTo(1, org.assertj.core.api.Assertions.within(1e-12));
        assertThat(set.y(0)).isCloseTo(2, org.assertj.core.api.Assertions.within(1e-12));
        assertThat(set.heading(0)).isCloseTo(Math.PI / 2, org.assertj.core.api.Assertions.within(1e-12));
    }
}
