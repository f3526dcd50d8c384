package dev.driftlab.sim;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import dev.driftlab.geometry.Polygon;
import dev.driftlab.geometry.Pose;
import dev.driftlab.geometry.RayCaster;
import dev.driftlab.geometry.SegmentCaster;
import dev.driftlab.geometry.SegmentSet;
import dev.driftlab.scenario.Rangefinder;
import java.util.SplittableRandom;
import org.apache.commons.math3.distribution.BinomialDistribution;
import org.apache.commons.math3.distribution.ChiSquaredDistribution;
import org.junit.jupiter.api.Test;

class RangeSensorTest {

    private static final double W = 8;
    private static final double H = 5;
    private static final RayCaster ROOM = SegmentCaster.of(
            SegmentSet.builder().addOutline(Polygon.rectangle(0, 0, W, H)).build());

    /** Plane geometry: distance from (x, y) inside [0, W] x [0, H] to the walls along angle a. */
    private static double analytic(double x, double y, double a) {
        double c = Math.cos(a);
        double s = Math.sin(a);
        double tx = c > 1e-15 ? (W - x) / c : c < -1e-15 ? -x / c : Double.POSITIVE_INFINITY;
        double ty = s > 1e-15 ? (H - y) / s : s < -1e-15 ? -y / s : Double.POSITIVE_INFINITY;
        return Math.min(tx, ty);
    }

    @Test
    void measure_whenNoiseFreeInRectangularRoom_thenMatchesAnalyticDistancesFromTheMount() {
        Rangefinder rf = new Rangefinder(181, Math.toRadians(270), 20, 0, 10, Pose.of(0.2, 0.05, 0.1), 0);
        RangeSensor sensor = new RangeSensor(rf);
        Pose robot = Pose.of(3.1, 2.2, 0.7);
        float[] out = new float[181];

        sensor.measure(ROOM, robot, new SplittableRandom(1), out);

        Pose mount = robot.compose(rf.mount());
        for (int i = 0; i < 181; i++) {
            double a = mount.heading() + sensor.geometry().angle(i);
            // ranges are stored as float: relative precision 6e-8
            assertThat((double) out[i]).isCloseTo(analytic(mount.x(), mount.y(), a), within(1e-5));
        }
        assertThat(sensor.geometry().angle(0)).isCloseTo(-Math.toRadians(135), within(1e-12));
        assertThat(sensor.geometry().angle(180)).isCloseTo(Math.toRadians(135), within(1e-12));
    }

    @Test
    void measure_whenNoisy_thenSampleSigmaInsideChiSquareInterval() {
        // Source: for n normal errors, (n - 1) s^2 / sigma^2 follows chi-square with n - 1 degrees of
        // freedom (Commons Math ChiSquaredDistribution); two-sided 99.9 % interval. sigma = 3 cm is a
        // datasheet-like figure for a good indoor unit (from memory).
        double sigma = 0.03;
        Rangefinder rf = new Rangefinder(360, 2 * Math.PI, 20, sigma, 10, Pose.of(0, 0, 0), 0);
        RangeSensor sensor = new RangeSensor(rf);
        Pose robot = Pose.of(4, 2.5, 0.3);
        float[] out = new float[360];
        SplittableRandom rng = new SplittableRandom(11L);
        int n = 0;
        double sum = 0;
        double sumSq = 0;
        for (int scan = 0; scan < 50; scan++) {
            sensor.measure(ROOM, robot, rng, out);
            for (int i = 0; i < 360; i++) {
                double e = out[i] - analytic(4, 2.5, 0.3 + sensor.geometry().angle(i));
                sum += e;
                sumSq += e * e;
                n++;
            }
        }
        double mean = sum / n;
        double s2 = (sumSq - n * mean * mean) / (n - 1);
        ChiSquaredDistribution chi = new ChiSquaredDistribution(n - 1);
        double lo = sigma * sigma * chi.inverseCumulativeProbability(0.0005) / (n - 1);
        double hi = sigma * sigma * chi.inverseCumulativeProbability(0.9995) / (n - 1);
        assertThat(s2).isBetween(lo, hi);
        // mean error within 4 standard errors of zero (normal tail below 1e-4)
        assertThat(Math.abs(mean)).isLessThan(4 * sigma / Math.sqrt(n));
    }

    @Test
    void measure_whenDropoutSet_thenShareOfMaxRangeBeamsIsBinomial() {
        // Source: count of dropped beams ~ Binomial(n, p) (Commons Math BinomialDistribution), 99.9 %.
        double p = 0.2;
        Rangefinder rf = new Rangefinder(360, 2 * Math.PI, 20, 0, 10, Pose.of(0, 0, 0), p);
        RangeSensor sensor = new RangeSensor(rf);
        float[] out = new float[360];
        SplittableRandom rng = new SplittableRandom(5L);
        int dropped = 0;
        int n = 0;
        for (int scan = 0; scan < 20; scan++) {
            sensor.measure(ROOM, Pose.of(4, 2.5, 0), rng, out);
            for (float r : out) {
                n++;
                if (r == 20f) {
                    dropped++;
                }
            }
        }
        BinomialDistribution b = new BinomialDistribution(n, p);
        assertThat(dropped).isBetween(b.inverseCumulativeProbability(0.0005), b.inverseCumulativeProbability(0.9995));
    }

    @Test
    void measure_whenBlackout_thenEveryBeamAtMaxRange() {
        Rangefinder rf = Rangefinder.typical();
        RangeSensor sensor = new RangeSensor(rf);
        float[] out = new float[rf.beams()];
        SplittableRandom rng = new SplittableRandom(1L);

        sensor.measure(ROOM, Pose.of(4, 2.5, 0), rng, out, 1, true, 0, rng);

        for (float r : out) {
            assertThat(r).isEqualTo((float) rf.maxRange());
        }
    }

    @Test
    void measure_whenNothingWithinMaxRange_thenReportsMaxRangeWithoutNoise() {
        Rangefinder rf = new Rangefinder(4, 2 * Math.PI, 1.0, 0.05, 10, Pose.of(0, 0, 0), 0);
        RangeSensor sensor = new RangeSensor(rf);
        float[] out = new float[4];

        sensor.measure(ROOM, Pose.of(4, 2.5, 0), new SplittableRandom(2L), out);

        assertThat(out).containsOnly(1.0f);
    }
}
