package dev.driftlab.evaluation;

import static org.assertj.core.api.Assertions.assertThat;

import dev.driftlab.geometry.Polygon;
import dev.driftlab.geometry.Pose;
import dev.driftlab.report.Findings;
import dev.driftlab.report.Report;
import dev.driftlab.scenario.Fault;
import dev.driftlab.scenario.Fixture;
import dev.driftlab.scenario.FloorZone;
import dev.driftlab.scenario.Gate;
import dev.driftlab.scenario.GateMetric;
import dev.driftlab.scenario.Scenario;
import dev.driftlab.scenario.ScenarioValidator;
import dev.driftlab.scenario.Scenarios;
import dev.driftlab.scenario.Surface;
import dev.driftlab.scenario.Trigger;
import dev.driftlab.scenario.Waypoint;
import dev.driftlab.scenario.Wheel;
import dev.driftlab.trial.BatchProgress;
import dev.driftlab.trial.BatchResult;
import dev.driftlab.trial.BatchRunner;
import java.util.List;
import java.util.Optional;
import java.util.OptionalInt;
import java.util.concurrent.atomic.AtomicBoolean;
import org.junit.jupiter.api.Test;

/**
 * Whole batches of the two cases that showed verdicts could not be trusted: a pillar that stops
 * every trial before the scheduled kidnap, and a route whose robot is stopped by a wall beside the
 * door it should pass. The verdicts must say what happened (definition, no source: a trial that
 * never met a gate's event does not count for it, and a gate no trial exercised fails).
 */
class HonestVerdictsTest {

    private static final long[] SEEDS = {1, 2, 3, 4};

    /** A carpet strip with an unseen stall, then a pillar square on the route before a kidnap at 25 s. */
    private static Scenario pillarBeforeTheKidnap() {
        return Scenarios.corridor()
                .withZone(new FloorZone("carpet", "Carpet", Surface.CARPET, Polygon.rectangle(5, 0, 3, 2), 0.05, 1.5))
                .withFixture(new Fixture("pillar", "Pillar", Polygon.rectangle(9.6, 0.6, 0.8, 0.8)))
                .withFault(new Fault.Stall("stall", new Trigger.OnEntering("carpet"), Wheel.RIGHT, 2, false))
                .withKidnapAt(25, Pose.of(15, 1, 0))
                .withGate(new Gate("recovers", GateMetric.RECOVERY_TIME, 20, 0.8))
                .withGate(new Gate("final", GateMetric.FINAL_ERROR, 0.5, 0.8))
                .build();
    }

    private static Report batch(Scenario s) {
        assertThat(ScenarioValidator.validate(s).errors()).isEmpty();
        BatchRunner runner = new BatchRunner(s, 2);
        BatchResult result =
                runner.run(s.allVariants(), SEEDS, EpisodeRules.defaults(), BatchProgress.NONE, new AtomicBoolean());
        return Report.of(
                Report.Kind.BATCH,
                s,
                "test",
                SEEDS,
                result,
                Optional.empty(),
                OptionalInt.empty(),
                new int[0],
                "2026-01-01T00:00:00Z");
    }

    @Test
    void pillarBeforeTheKidnap_recoveryGateIsNotExercised_andTheReportSaysWhy() {
        Report r = batch(pillarBeforeTheKidnap());

        assertThat(r.trials()).hasSize(4).allSatisfy(t -> {
            assertThat(t.end().kind()).isEqualTo(TrialEnd.Kind.CONTACT);
            // the pillar's west face is at x = 9.6; the robot's centre stops a footprint radius before it
            assertThat(t.end().x()).isBetween(8.5, 9.6);
            assertThat(t.kidnapped()).isFalse();
            assertThat(t.faults())
                    .filteredOn(f -> f.id().startsWith("kidnap"))
                    .singleElement()
                    .satisfies(f -> {
                        assertThat(f.fired()).isFalse();
                        // the trial ended at the contact, about 20 s in
                        assertThat(f.reason())
                                .matches("scheduled at 25.0 s, but the trial ended first, at 19\\.[0-9] s|"
                                        + "scheduled at 25.0 s, but the trial ended first, at 20\\.[0-9] s");
                    });
        });
        GateVerdict recovery = verdict(r, "recovers");
        assertThat(recovery.pass()).isFalse();
        assertThat(recovery.exercised()).isZero();
        assertThat(recovery.reason()).contains("the kidnap fired in 0 of 4 trials");
        // the final error is not judged on the pose where the robot stopped
        assertThat(verdict(r, "final").exercised()).isZero();
        GateVerdict route = verdict(r, Gates.ROUTE_DEFAULT.id());
        assertThat(route.byDefault()).isTrue();
        assertThat(route.passed()).isZero();
        assertThat(route.exercised()).isEqualTo(4);
        assertThat(r.verdict()).isEqualTo(Verdict.ENDED_EARLY);
        assertThat(r.passed()).isFalse();
        assertThat(Findings.headline(r))
                .anySatisfy(line -> assertThat(line).startsWith("4 of 4 trials stopped at a contact near (9."))
                .anySatisfy(line -> assertThat(line)
                        .startsWith("Fault \"kidnap-1\" fired in 0 of 4 trials (scheduled at 25.0 s, but the trial"
                                + " ended first)"));
    }

    @Test
    void pillarBeforeTheKidnap_withContactAllowed_isStillNotExercised() {
        Scenario s = Scenarios.corridor()
                .withFixture(new Fixture("pillar", "Pillar", Polygon.rectangle(9.6, 0.6, 0.8, 0.8)))
                .withKidnapAt(25, Pose.of(15, 1, 0))
                .withGate(new Gate("recovers", GateMetric.RECOVERY_TIME, 20, 0.8))
                .withContactAllowed(true)
                .build();

        Report r = batch(s);

        assertThat(r.verdicts()).extracting(v -> v.gate().id()).containsExactly("recovers");
        assertThat(r.verdict()).isEqualTo(Verdict.NOT_EXERCISED);
    }

    @Test
    void routeStoppedByTheWallBesideTheDoor_endsEarly_andFails() {
        // the side room's door spans x = 2.55 to 3.45; driving north at x = 4.2 meets the wall instead
        Scenario s = Scenarios.corridor()
                .withoutWaypoints()
                .withWaypoints(new Waypoint(4.2, 1, 0.5, 0), new Waypoint(4.2, 4, 0.5, 0))
                .build();

        Report r = batch(s);

        assertThat(r.trials()).allSatisfy(t -> {
            assertThat(t.end().kind()).isEqualTo(TrialEnd.Kind.CONTACT);
            assertThat(t.end().y()).isBetween(1.2, 2.0);
        });
        assertThat(r.verdict()).isEqualTo(Verdict.ENDED_EARLY);
        assertThat(verdict(r, Gates.ROUTE_DEFAULT.id()).reason()).startsWith("0 of 4 trials (0 %");
    }

    @Test
    void theSameRouteThroughTheDoor_passes() {
        Scenario s = Scenarios.corridor()
                .withoutWaypoints()
                .withWaypoints(new Waypoint(3, 1, 0.5, 0), new Waypoint(3, 4, 0.5, 0))
                .build();

        Report r = batch(s);

        assertThat(r.trials()).allSatisfy(t -> assertThat(t.end().early()).isFalse());
        assertThat(r.verdict()).isEqualTo(Verdict.PASS);
    }

    private static GateVerdict verdict(Report r, String id) {
        List<GateVerdict> vs =
                r.verdicts().stream().filter(v -> v.gate().id().equals(id)).toList();
        assertThat(vs).hasSize(1);
        return vs.get(0);
    }
}
