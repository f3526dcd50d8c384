package dev.driftlab.sim;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import dev.driftlab.geometry.Point;
import dev.driftlab.geometry.Polygon;
import dev.driftlab.geometry.Pose;
import dev.driftlab.scenario.Door;
import dev.driftlab.scenario.DoorState;
import dev.driftlab.scenario.Fault;
import dev.driftlab.scenario.FloorZone;
import dev.driftlab.scenario.LocalizerSettings;
import dev.driftlab.scenario.Rangefinder;
import dev.driftlab.scenario.Robot;
import dev.driftlab.scenario.Room;
import dev.driftlab.scenario.Scenario;
import dev.driftlab.scenario.Surface;
import dev.driftlab.scenario.Trigger;
import dev.driftlab.scenario.Wheel;
import dev.driftlab.site.SiteCompiler;
import java.util.Arrays;
import java.util.List;
import org.junit.jupiter.api.Test;

class SimulatorTest {

    private static Recorder run(Scenario scenario, long seed, SimOptions options) {
        Recorder rec = new Recorder();
        new Simulator(scenario, SiteCompiler.compile(scenario.site()), seed, options).run(rec);
        return rec;
    }

    private static Recorder run(Scenario scenario, long seed) {
        return run(scenario, seed, SimOptions.defaults());
    }

    /** A noisy drive through a room with faults, for determinism checks. */
    private static SimScenarios busy() {
        return SimScenarios.room(12, 8)
                .robot(SimScenarios.robot(0.995, 1.003, 0.02))
                .rangefinder(new Rangefinder(90, Math.toRadians(270), 12, 0.02, 10, Pose.of(0.1, 0, 0), 0.05))
                .zone(new FloorZone("rug", "Rug", Surface.RUG, Polygon.rectangle(4, 0, 3, 8), 0.1, 2))
                .fault(new Fault.Slip("s", new Trigger.AtTime(3), Wheel.LEFT, 0.2, 2))
                .fault(new Fault.SpuriousMaxRange("m", new Trigger.OnEntering("rug"), 1, 0.3))
                .start(1, 1, 0)
                .to(9, 1)
                .to(9, 6)
                .to(2, 6, 0.4, 1);
    }

    private static void assertSameOutput(Recorder a, Recorder b) {
        assertThat(b.steps).isEqualTo(a.steps);
        assertThat(b.events).isEqualTo(a.events);
        assertThat(b.scans).hasSameSizeAs(a.scans);
        for (int k = 0; k < a.scans.size(); k++) {
            RangeScan x = a.scans.get(k);
            RangeScan y = b.scans.get(k);
            assertThat(y.time()).isEqualTo(x.time());
            assertThat(y.truth()).isEqualTo(x.truth());
            assertThat(y.odometry()).isEqualTo(x.odometry());
            assertThat(Arrays.equals(y.copyRanges(), x.copyRanges()))
                    .as("scan %d", k)
                    .isTrue();
        }
    }

    @Test
    void run_whenSameSeed_thenBitIdenticalOutput() {
        // records compare doubles with Double.compare semantics, i.e. bit for bit
        Scenario s = busy().build();

        assertSameOutput(run(s, 42L), run(s, 42L));
    }

    @Test
    void run_whenOnlyLocalizerSettingsDiffer_thenSimulatedDataIdentical() {
        LocalizerSettings base = LocalizerSettings.defaults();
        LocalizerSettings other = new LocalizerSettings(
                new LocalizerSettings.Particles(
                        100, true, 50, 500, 0.1, 0.95, 0.25, 0.1, LocalizerSettings.Start.EVERYWHERE, 1, 1),
                base.motionNoise(),
                base.rangeModel(),
                base.resampling(),
                base.recovery());

        assertSameOutput(run(busy().build(), 7L), run(busy().localizer(other).build(), 7L));
    }

    @Test
    void run_whenSeedDiffers_thenNoisyDataDiffers() {
        Recorder a = run(busy().build(), 1L);
        Recorder b = run(busy().build(), 2L);

        assertThat(b.scans.get(5).copyRanges()).isNotEqualTo(a.scans.get(5).copyRanges());
    }

    @Test
    void run_whenNoiseFreeRoute_thenVisitsEveryWaypointAndScansAtItsRate() {
        Scenario s = SimScenarios.room(10, 6)
                .start(1, 1, 0)
                .to(8, 1)
                .to(8, 5, 0.3, 2)
                .settle(1)
                .build();

        Recorder rec = run(s, 3L);

        assertThat(rec.events(EventKind.WAYPOINT_REACHED)).hasSize(2);
        assertThat(rec.events(EventKind.ROUTE_FINISHED)).hasSize(1);
        assertThat(rec.last().truth().x()).isCloseTo(8, within(1e-3));
        assertThat(rec.last().truth().y()).isCloseTo(5, within(1e-3));
        double end = rec.last().time();
        // a scan every 0.1 s starting at 0
        assertThat(rec.scans).hasSize((int) Math.floor(end * 10 + 1e-6) + 1);
        for (int k = 0; k < rec.scans.size(); k++) {
            assertThat(rec.scans.get(k).time()).isCloseTo(k * 0.1, within(1e-9));
        }
        // speed limits hold: the 0.3 m/s leg never moves faster than 0.3 m/s
        for (int k = 1; k < rec.steps.size(); k++) {
            Pose p = rec.steps.get(k - 1).truth();
            Pose q = rec.steps.get(k).truth();
            double speed = Math.hypot(q.x() - p.x(), q.y() - p.y()) / 0.01;
            assertThat(speed).isLessThanOrEqualTo(0.5 + 1e-9);
        }
    }

    /**
     * UMBmark square driven by odometry and its end point relative to the start, for a robot whose
     * right wheel is larger than the left by 2 * delta.
     */
    private static Point umbmarkEndError(boolean clockwise, double delta) {
        double side = 4;
        double sign = clockwise ? -1 : 1;
        Scenario s = SimScenarios.room(20, 20)
                .robot(SimScenarios.robot(1 - delta, 1 + delta, 0))
                .start(5, 8, 0)
                .to(5 + side, 8)
                .to(5 + side, 8 + sign * side)
                .to(5, 8 + sign * side)
                .to(5, 8)
                .settle(0)
                .build();
        Recorder rec = run(s, 1L, SimOptions.defaults().withSteering(Steering.ODOMETRY));
        Pose end = rec.last().truth();
        return Point.of(end.x() - 5, end.y() - 8);
    }

    @Test
    void umbmark_whenWheelDiametersDiffer_thenClockwiseAndCounterClockwiseErrorsMirror() {
        // Source: Borenstein & Feng, "Measurement and correction of systematic odometry errors in
        // mobile robots" (UMBmark, 1996): unequal wheel diameters (their Type B error) curve every
        // straight leg the same way in both directions, so the return-position x errors of the
        // clockwise and counter-clockwise runs are opposite, with x_cw - x_ccw = -4 L beta, where
        // beta is the heading change per leg (relation from memory). First-order kinematics give
        // beta = L (R_right - R_left) / (R_nominal * wheelbase) and y_cw = y_ccw = -2 L beta.
        double side = 4;
        double delta = 0.001;
        double beta = side * (2 * delta) / 0.4;
        Point cw = umbmarkEndError(true, delta);
        Point ccw = umbmarkEndError(false, delta);

        // first order: 2 L beta = 16 cm; the second-order terms (legs shortened by cos of the heading
        // error) sum to about 6 L beta^2 = 1 cm, so 1.5 cm separates the pattern from its absence
        double tol = 0.015;
        assertThat(cw.x() - ccw.x()).isCloseTo(-4 * side * beta, within(tol));
        assertThat(cw.x() + ccw.x()).isCloseTo(0, within(tol));
        assertThat(cw.y()).isCloseTo(-2 * side * beta, within(tol));
        assertThat(ccw.y()).isCloseTo(-2 * side * beta, within(tol));
    }

    @Test
    void umbmark_whenWheelsExact_thenBothRunsReturnToStart() {
        Point cw = umbmarkEndError(true, 0);
        Point ccw = umbmarkEndError(false, 0);

        // only encoder quantisation remains: well under a centimetre
        assertThat(Math.hypot(cw.x(), cw.y())).isLessThan(0.005);
        assertThat(Math.hypot(ccw.x(), ccw.y())).isLessThan(0.005);
    }

    @Test
    void floorZone_whenCarpetEdgeCrossedAtAnAngle_thenHeadingKicksBySlipTimesTangent() {
        // Kinematics (common practice, no source): crossing an edge at angle theta to its normal,
        // the leading wheel is on the carpet alone for a travel of wheelbase * tan(theta) and loses
        // the slip fraction of it, turning the robot by -slip * tan(theta) (first order).
        double slip = 0.05;
        double theta = Math.toRadians(45);
        Scenario s = SimScenarios.room(20, 12)
                .zone(new FloorZone("carpet", "Carpet", Surface.CARPET, Polygon.rectangle(8, 0, 12, 12), slip, 1))
                .start(4, 2, theta)
                .to(4 + 9 * Math.cos(theta), 2 + 9 * Math.sin(theta))
                .settle(0)
                .build();

        Recorder rec = run(s, 1L, SimOptions.defaults().withSteering(Steering.ODOMETRY));

        double kick = rec.last().truth().heading() - rec.last().odometry().heading();
        assertThat(kick).isCloseTo(-slip * Math.tan(theta), within(0.1 * slip));
    }

    @Test
    void run_whenDoorActuallyClosed_thenCollisionStopsTheRobotBeforeIt() {
        Scenario s = SimScenarios.room(5, 4)
                .room(new Room("b", "Room B", Polygon.rectangle(5, 0, 5, 4)))
                .door(new Door("d", "hall", 1, 2.0, 0.9, DoorState.OPEN, DoorState.CLOSED))
                .start(1, 2, 0)
                .to(8, 2)
                .settle(1)
                .build();

        Recorder rec = run(s, 1L);

        assertThat(rec.events(EventKind.COLLISION)).hasSize(1);
        assertThat(rec.events(EventKind.ROUTE_ABANDONED)).hasSize(1);
        double footprint = Robot.typical().footprintRadius();
        for (SimStep step : rec.steps) {
            assertThat(step.truth().x()).isLessThanOrEqualTo(5 - footprint + 0.01);
        }
        assertThat(rec.last().truth().x()).isGreaterThan(5 - footprint - 0.02);
    }

    @Test
    void run_whenKidnapped_thenTruthJumpsAndOdometryDoesNot() {
        Pose to = Pose.of(7, 4, Math.PI);
        Scenario s = SimScenarios.room(10, 6)
                .start(1, 1, 0)
                .to(5, 1)
                .fault(new Fault.Kidnap("k", new Trigger.AtTime(3), to))
                .build();

        Recorder rec = run(s, 1L);

        assertThat(rec.events(EventKind.KIDNAPPED)).hasSize(1);
        SimStep at = rec.steps.stream()
                .filter(st -> st.time() >= 3 - 1e-9)
                .findFirst()
                .orElseThrow();
        assertThat(at.truth()).isEqualTo(to);
        for (int k = 1; k < rec.steps.size(); k++) {
            Pose p = rec.steps.get(k - 1).odometry();
            Pose q = rec.steps.get(k).odometry();
            assertThat(Math.hypot(q.x() - p.x(), q.y() - p.y())).isLessThan(0.01);
        }
        // the follower still drives to the waypoint from wherever the robot now is
        assertThat(rec.last().truth().x()).isCloseTo(5, within(1e-3));
    }

    @Test
    void run_whenDoorClosesOnTheTimeline_thenScansSeeIt() {
        Scenario s = SimScenarios.room(5, 4)
                .room(new Room("b", "Room B", Polygon.rectangle(5, 0, 5, 4)))
                .door(new Door("d", "hall", 1, 2.0, 0.9, DoorState.OPEN, DoorState.OPEN))
                .rangefinder(new Rangefinder(1, 0.1, 20, 0, 10, Pose.of(0, 0, 0), 0))
                .start(2, 2, 0)
                .to(2, 2, 0.5, 3)
                .fault(new Fault.DoorChange("c", new Trigger.AtTime(1), "d", DoorState.CLOSED))
                .build();

        Recorder rec = run(s, 1L);

        assertThat(rec.events(EventKind.DOOR_CHANGED)).hasSize(1);
        for (RangeScan scan : rec.scans) {
            // plane geometry: east from x = 2 the far wall is at 10, the door at 5
            assertThat((double) scan.range(0)).isCloseTo(scan.time() < 1 - 1e-9 ? 8.0 : 3.0, within(1e-5));
        }
    }

    @Test
    void run_whenEnteringARug_thenItsFaultFiresThereAndBlanksScans() {
        Scenario s = SimScenarios.room(10, 6)
                .zone(new FloorZone("rug", "Rug", Surface.RUG, Polygon.rectangle(4, 0, 2, 6), 0, 1))
                .fault(new Fault.Blackout("b", new Trigger.OnEntering("rug"), 1.0))
                .start(1, 1, 0)
                .to(8, 1)
                .build();

        Recorder rec = run(s, 1L);

        SimEvent started = rec.events(EventKind.FAULT_STARTED).get(0);
        SimStep at = rec.steps.stream()
                .filter(st -> st.time() >= started.time())
                .findFirst()
                .orElseThrow();
        assertThat(at.truth().x()).isBetween(4.0, 4.01);
        assertThat(at.activeFaults()).containsExactly("b");
        rec.scans.stream()
                .filter(sc -> sc.time() >= started.time() && sc.time() < started.time() + 1 - 1e-9)
                .forEach(sc -> assertThat(sc.copyRanges())
                        .containsOnly((float) Rangefinder.typical().maxRange()));
        assertThat(rec.events(EventKind.FAULT_ENDED)).hasSize(1);
    }

    @Test
    void run_whenBothWheelsStalledUnseenForever_thenStopsAtItsStepBound() {
        Scenario s = SimScenarios.room(10, 6)
                .start(1, 1, 0)
                .to(4, 1)
                .fault(new Fault.Stall("st", new Trigger.AtTime(0.5), Wheel.BOTH, 1e6, false))
                .build();
        Recorder rec = new Recorder();

        RunSummary summary = new Simulator(s, 1L).run(rec);

        assertThat(summary.outcome()).isEqualTo(Outcome.STEP_LIMIT);
        assertThat(summary.message()).contains("step bound");
        assertThat(rec.events(EventKind.STEP_LIMIT_REACHED)).hasSize(1);
    }

    @Test
    void constructor_whenWheelbaseNotPositive_thenMessageNamesTheField() {
        Robot t = Robot.typical();
        Robot bad = new Robot(
                0,
                t.wheelRadius(),
                t.ticksPerTurn(),
                t.footprintRadius(),
                1,
                1,
                1,
                0,
                t.maxSpeed(),
                t.maxTurnRate(),
                t.maxAcceleration());
        Scenario s = SimScenarios.room(5, 5).robot(bad).to(2, 2).build();

        assertThatThrownBy(() -> new Simulator(s, 1L))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessageStartingWith("robot.wheelbase");
    }

    @Test
    void constructor_whenFaultNamesMissingDoor_thenMessageNamesTheField() {
        Scenario s = SimScenarios.room(5, 5)
                .to(2, 2)
                .fault(new Fault.DoorChange("c", new Trigger.AtTime(1), "nope", DoorState.CLOSED))
                .build();

        assertThatThrownBy(() -> new Simulator(s, 1L)).hasMessageStartingWith("faults[0].door");
    }

    @Test
    void scanGeometry_whenFullCircle_thenBeamsDoNotRepeat() {
        ScanGeometry g = ScanGeometry.of(new Rangefinder(4, 2 * Math.PI, 10, 0, 10, Pose.of(0, 0, 0), 0));

        assertThat(g.copyAngles())
                .containsExactly(new double[] {-Math.PI, -Math.PI / 2, 0, Math.PI / 2}, within(1e-12));
        assertThat(List.of(g.beamCount())).containsExactly(4);
    }
}
