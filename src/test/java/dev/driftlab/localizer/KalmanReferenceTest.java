package dev.driftlab.localizer;

import static org.assertj.core.api.Assertions.assertThat;

import dev.driftlab.scenario.LocalizerSettings.Scheme;
import java.util.SplittableRandom;
import org.apache.commons.math3.filter.DefaultMeasurementModel;
import org.apache.commons.math3.filter.DefaultProcessModel;
import org.apache.commons.math3.filter.KalmanFilter;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

/**
 * The particle filter's weighting and resampling code against an exact posterior: on a 1-D
 * linear-Gaussian model the Kalman filter of Apache Commons Math 3.6.1 gives the true posterior
 * mean and variance P. sqrt(P/N) would be the standard error of the mean of N independent draws
 * from that posterior; a resampling filter's particles are not independent, and its mean scatters
 * more (measured below).
 */
class KalmanReferenceTest {

    private static final double Q = 0.01;
    private static final double R = 0.25;
    private static final int STEPS = 20;

    @ParameterizedTest
    @ValueSource(ints = {1_000, 10_000, 100_000})
    void particleMean_matchesKalmanMean_within5RootPOverN(int n) {
        // Q = 0.01, R = 0.25, prior N(0, 1); the particle posterior mean lies within 5 sqrt(P / N)
        // of the Kalman mean (Commons Math KalmanFilter as the oracle; P = 0.0453 after 20 steps).
        // The real margin is smaller than five standard errors: over 400 particle seeds (100 at
        // N = 100,000) with this world seed, the root mean square of (pf - kf) / sqrt(P / N) was
        // 1.30, 1.26 and 1.36 for N = 1,000, 10,000 and 100,000, because 20 rounds of systematic
        // resampling leave fewer than N independent particles. So the bound is about 3.8 of the
        // filter's own standard errors (3.7 to 4.0), a false alarm about once in 7,000 runs for a
        // normal error. The three fixed seeds here sit at 1.04, 2.06 and -0.005 sqrt(P / N).
        KalmanFilter kf = new KalmanFilter(
                new DefaultProcessModel(
                        new double[][] {{1}},
                        new double[][] {{0}},
                        new double[][] {{Q}},
                        new double[] {0},
                        new double[][] {{1}}),
                new DefaultMeasurementModel(new double[][] {{1}}, new double[][] {{R}}));
        SplittableRandom world = new SplittableRandom(2024);
        SplittableRandom rng = new SplittableRandom(n);
        double[] x = new double[n];
        double[] next = new double[n];
        double[] logW = new double[n];
        double[] w = new double[n];
        int[] idx = new int[n];
        for (int i = 0; i < n; i++) {
            x[i] = rng.nextGaussian();
        }
        double truth = world.nextGaussian();
        double pfMean = 0;
        for (int t = 0; t < STEPS; t++) {
            truth += Math.sqrt(Q) * world.nextGaussian();
            double z = truth + Math.sqrt(R) * world.nextGaussian();
            kf.predict();
            kf.correct(new double[] {z});
            for (int i = 0; i < n; i++) {
                x[i] += Math.sqrt(Q) * rng.nextGaussian();
                double d = z - x[i];
                logW[i] = -0.5 * d * d / R;
            }
            Weights.normalizeLog(logW, n, w);
            pfMean = 0;
            for (int i = 0; i < n; i++) {
                pfMean += w[i] * x[i];
            }
            Resampler.resample(Scheme.SYSTEMATIC, w, n, n, rng, idx);
            for (int i = 0; i < n; i++) {
                next[i] = x[idx[i]];
            }
            double[] tmp = x;
            x = next;
            next = tmp;
        }
        double kfMean = kf.getStateEstimation()[0];
        double p = kf.getErrorCovariance()[0][0];
        assertThat(Math.abs(pfMean - kfMean)).isLessThan(5 * Math.sqrt(p / n));
    }
}
