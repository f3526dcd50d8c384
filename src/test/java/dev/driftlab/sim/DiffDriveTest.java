package dev.driftlab.sim;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import dev.driftlab.geometry.Pose;
import dev.driftlab.scenario.Robot;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

class DiffDriveTest {

    private static final double DT = 0.01;
    private final SplittableRandom rng = new SplittableRandom(1L);

    private void run(DiffDrive d, double leftRate, double rightRate, int steps, boolean stallLeft, boolean seen) {
        for (int k = 0; k < steps; k++) {
            d.propose(leftRate, rightRate, DT, 0, 0, stallLeft, false, seen, false, 0, 0, rng);
            d.commit();
        }
    }

    @Test
    void straightDrive_whenNoiseFree_thenOdometryEqualsTruthToOneTick() {
        Robot robot = SimScenarios.noiseFree();
        DiffDrive d = new DiffDrive(robot, Pose.of(1, 2, 0.5));
        double rate = 0.5 / robot.wheelRadius();

        run(d, rate, rate, 1000, false, false);

        // encoders count whole ticks, so odometry can trail the truth by less than one tick of travel
        double truthTravel = Math.hypot(d.x() - 1, d.y() - 2);
        double odoTravel = Math.hypot(d.odoX() - 1, d.odoY() - 2);
        assertThat(truthTravel).isCloseTo(5.0, within(1e-9));
        assertThat(truthTravel - odoTravel).isBetween(0.0, d.metresPerTick());
        assertThat(d.odoHeading()).isEqualTo(d.heading());
        assertThat(d.heading()).isCloseTo(0.5, within(1e-15));
    }

    @Test
    void stall_whenLeftWheelBlockedAndEncoderBlind_thenTruthTurnsByVtOverWheelbaseAndOdometryDoesNot() {
        // Kinematics of a differential drive (common practice, no source): one wheel stopped while
        // the other runs at v for t seconds turns the robot by v * t / wheelbase about the stopped
        // wheel.
        Robot robot = SimScenarios.noiseFree();
        DiffDrive d = new DiffDrive(robot, Pose.of(0, 0, 0));
        double v = 0.3;
        double t = 1.5;

        run(d, v / robot.wheelRadius(), v / robot.wheelRadius(), (int) Math.round(t / DT), true, false);

        assertThat(d.heading()).isCloseTo(v * t / robot.wheelbase(), within(1e-9));
        // the robot pivots about the left wheel at (0, b/2): the centre stays on that circle
        assertThat(Math.hypot(d.x(), d.y() - robot.wheelbase() / 2)).isCloseTo(robot.wheelbase() / 2, within(1e-6));
        // both encoders counted the commanded turns, so odometry went straight
        assertThat(d.odoHeading()).isZero();
        assertThat(d.odoX()).isCloseTo(v * t, within(d.metresPerTick()));
    }

    @Test
    void stall_whenEncoderSeesIt_thenOdometryTurnsToo() {
        Robot robot = SimScenarios.noiseFree();
        DiffDrive d = new DiffDrive(robot, Pose.of(0, 0, 0));
        double v = 0.3;

        run(d, v / robot.wheelRadius(), v / robot.wheelRadius(), 100, true, true);

        // one tick of the running wheel turns odometry by metresPerTick / wheelbase
        assertThat(d.odoHeading()).isCloseTo(d.heading(), within(d.metresPerTick() / robot.wheelbase()));
        assertThat(d.leftTicks()).isZero();
    }

    @Test
    void turnInPlace_whenWheelbaseLongerThanNominal_thenTruthTurnsLess() {
        // Kinematics (common practice, no source): rotation = wheel travel difference / wheelbase.
        Robot t = SimScenarios.noiseFree();
        Robot robot = new Robot(
                t.wheelbase(),
                t.wheelRadius(),
                t.ticksPerTurn(),
                t.footprintRadius(),
                1,
                1,
                1.05,
                0,
                t.maxSpeed(),
                t.maxTurnRate(),
                t.maxAcceleration());
        DiffDrive d = new DiffDrive(robot, Pose.of(0, 0, 0));
        double wheelRate = 0.1 / robot.wheelRadius();

        run(d, -wheelRate, wheelRate, 100, false, false);

        assertThat(d.heading()).isCloseTo(0.2 / (0.4 * 1.05), within(1e-9));
        assertThat(d.odoHeading()).isCloseTo(0.2 / 0.4, within(2 * d.metresPerTick() / 0.4));
    }
}
