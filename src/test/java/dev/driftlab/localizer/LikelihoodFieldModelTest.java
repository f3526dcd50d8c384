package dev.driftlab.localizer;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import dev.driftlab.geometry.Pose;
import dev.driftlab.scenario.LocalizerSettings.RangeModel;
import dev.driftlab.scenario.LocalizerSettings.RangeModelKind;
import java.util.SplittableRandom;
import org.apache.commons.math3.distribution.NormalDistribution;
import org.junit.jupiter.api.Test;

class LikelihoodFieldModelTest {

    private static final double HIT = 0.8;
    private static final double MAX = 0.05;
    private static final double RAND = 0.15;
    private static final double SIGMA = 0.2;
    private static final double Z_MAX = 8.0;

    private final TestRooms.Room room = TestRooms.rectangle(4.0, 3.0, 0.05);
    private final RangeModel settings =
            new RangeModel(RangeModelKind.LIKELIHOOD_FIELD, 1, HIT, 0.0, MAX, RAND, SIGMA, 1.0, 0.05);

    @Test
    void perBeamValue_equalsTextbookFormula_withBruteForceDistance() {
        // Thrun, Burgard and Fox (2005), table 6.3: z_hit * N(d; 0, sigma) + z_rand / z_max, with d
        // the distance to the nearest obstacle computed here by brute force and the Gaussian from
        // Commons Math. The table is stored in float, hence the 1e-6 relative tolerance.
        LikelihoodFieldModel model = new LikelihoodFieldModel(room.grid(), settings);
        NormalDistribution n = new NormalDistribution(0, SIGMA);
        SplittableRandom rng = new SplittableRandom(3);
        for (int t = 0; t < 300; t++) {
            double x = -0.03 + rng.nextDouble() * 4.06;
            double y = -0.03 + rng.nextDouble() * 3.06;
            double d = room.bruteForceDistanceAt(x, y);
            double expected = HIT * n.density(d) + RAND / Z_MAX;
            assertThat(model.beamLikelihood(x, y, Z_MAX)).isCloseTo(expected, within(1e-6 * expected));
        }
    }

    @Test
    void scanLogLikelihood_isSumOfPerBeamLogs_andSkipsMaxRangeReadings() {
        LikelihoodFieldModel model = new LikelihoodFieldModel(room.grid(), settings);
        double[] ranges = {1.0, 2.5, Z_MAX, 0.7, Double.NaN};
        double[] angles = {-1.0, -0.2, 0.0, 0.9, 1.5};
        Pose mount = Pose.of(0.1, 0.02, 0.1);
        Scan scan = Scan.of(ranges, angles, mount, Z_MAX);
        model.prepare(scan);
        assertThat(model.beamsUsed()).isEqualTo(3);
        Pose robot = Pose.of(1.7, 1.2, 0.6);
        Pose sensor = robot.compose(mount);
        double expected = 0;
        for (int k : new int[] {0, 1, 3}) {
            double a = sensor.heading() + angles[k];
            expected += Math.log(model.beamLikelihood(
                    sensor.x() + ranges[k] * Math.cos(a), sensor.y() + ranges[k] * Math.sin(a), Z_MAX));
        }
        double[] out = new double[1];
        model.logLikelihoods(
                new double[] {robot.x()}, new double[] {robot.y()}, new double[] {robot.heading()}, 0, 1, out);
        assertThat(out[0]).isCloseTo(expected, within(1e-5));
    }

    @Test
    void truePose_scoresHigherThanShiftedPose() {
        LikelihoodFieldModel model = new LikelihoodFieldModel(room.grid(), settings);
        Scan layout = Scan.evenlySpread(new double[60], Math.toRadians(270), Pose.of(0, 0, 0), Z_MAX);
        Scan scan = Scan.evenlySpread(room.scan(1.5, 1.0, 0.3, layout), Math.toRadians(270), Pose.of(0, 0, 0), Z_MAX);
        model.prepare(scan);
        double[] out = new double[2];
        model.logLikelihoods(new double[] {1.5, 1.8}, new double[] {1.0, 1.0}, new double[] {0.3, 0.3}, 0, 2, out);
        assertThat(out[0]).isGreaterThan(out[1]);
    }
}
