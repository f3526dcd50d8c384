package dev.driftlab.scenario;

import static org.assertj.core.api.Assertions.assertThat;

import dev.driftlab.geometry.Polygon;
import dev.driftlab.geometry.Pose;
import java.util.List;
import org.junit.jupiter.api.Test;

/** One failing case per validation rule, each with the expected path and message. */
class ScenarioValidatorTest {

    private static ValidationReport check(String json) {
        return ScenarioFiles.check(json).report();
    }

    private static ValidationReport check(Scenarios.Builder b) {
        return ScenarioValidator.validate(b.build());
    }

    private static void assertError(ValidationReport r, String path, String message) {
        assertThat(r.errors()).as("errors: %s", r.problems()).anySatisfy(p -> {
            assertThat(p.path()).isEqualTo(path);
            assertThat(p.message()).contains(message);
        });
    }

    private static void assertWarning(ValidationReport r, String path, String message) {
        assertThat(r.warnings()).as("warnings: %s", r.problems()).anySatisfy(p -> {
            assertThat(p.path()).isEqualTo(path);
            assertThat(p.message()).contains(message);
        });
    }

    @Test
    void baseScenario_isClean() {
        assertThat(check(Scenarios.corridor()).problems()).isEmpty();
    }

    @Test
    void doorWiderThanWall_namesWallRoomAndLengths() {
        ValidationReport r = check(Docs.corridor()
                .set("site.doors[0].wall", "1")
                .set("site.doors[0].along", "1")
                .set("site.doors[0].width", "2.5")
                .json());

        assertError(r, "site.doors[0].width", "2.5 m is wider than wall 1 of room \"Test corridor\" (2 m)");
    }

    @Test
    void doorOffItsWall_isRefused() {
        ValidationReport r =
                check(Docs.corridor().set("site.doors[0].along", "19.8").json());

        assertError(r, "site.doors[0].along", "door spans 19.35 to 20.25 m along wall 2");
    }

    @Test
    void doorOnMissingWall_isRefused() {
        ValidationReport r =
                check(Docs.corridor().set("site.doors[0].wall", "4").json());

        assertError(r, "site.doors[0].wall", "room \"Test corridor\" has walls 0 to 3, not 4");
    }

    @Test
    void danglingDoorRoom_isRefused() {
        ValidationReport r =
                check(Docs.corridor().set("site.doors[0].room", "\"kitchen\"").json());

        assertError(r, "site.doors[0].room", "no room with id \"kitchen\"");
    }

    @Test
    void doorNarrowerThanRobot_isOnlyAWarning() {
        ValidationReport r =
                check(Docs.corridor().set("site.doors[0].width", "0.5").json());

        assertWarning(r, "site.doors[0].width", "narrower than the robot (0.6 m across)");
        assertThat(r.hasErrors()).isFalse();
    }

    @Test
    void doorUnderAccessibleWidth_warnsWithSource() {
        // ADA 2010 Standards 404.2.3: clear width at least 815 mm (32 in)
        ValidationReport r =
                check(Docs.corridor().set("site.doors[0].width", "0.7").json());

        assertWarning(r, "site.doors[0].width", "0.815 m accessible clear width (ADA 2010");
    }

    @Test
    void duplicateId_namesTheFirstOwner() {
        ValidationReport r =
                check(Docs.corridor().set("site.fixtures[0].id", "\"side\"").json());

        assertError(r, "site.fixtures[0].id", "\"side\" is already the id of site.rooms[1]");
    }

    @Test
    void polygonWithTwoCorners_isRefused() {
        ValidationReport r = check(Docs.corridor()
                .set("site.fixtures[0].outline", "[[3.5,5],[4.5,5]]")
                .json());

        assertError(r, "site.fixtures[0].outline", "needs at least 3 corners, has 2");
    }

    @Test
    void selfCrossingRoom_isRefused() {
        // a bow tie: edges 0 and 2 cross
        ValidationReport r = check(Docs.corridor()
                .set("site.rooms[1].outline", "[[1,2],[5,6],[5,2],[1,6]]")
                .json());

        assertError(r, "site.rooms[1].outline", "crosses itself: edge 0 meets edge 2");
    }

    @Test
    void startOutsideEveryRoom_isRefused() {
        ValidationReport r = check(Scenarios.corridor().withStart(Pose.of(30, 1, 0)));

        assertError(r, "route.start", "(30, 1) is outside every room");
    }

    @Test
    void startInsideFixture_isRefused() {
        ValidationReport r = check(Scenarios.corridor().withStart(Pose.of(4, 5.3, 0)));

        assertError(r, "route.start", "inside fixture \"Cabinet\"");
    }

    @Test
    void startInsideWall_isRefused() {
        ValidationReport r = check(Scenarios.corridor().withStart(Pose.of(10, 0.1, 0)));

        assertError(r, "route.start", "is inside a wall");
    }

    @Test
    void waypointThroughWall_isAWarning() {
        ValidationReport r =
                check(Scenarios.corridor().withWaypoints(new Waypoint(18, 1, 0.5, 0), new Waypoint(4, 4, 0.5, 0)));

        assertWarning(r, "route.waypoints[1]", "crosses a wall");
        assertThat(r.hasErrors()).isFalse();
    }

    @Test
    void faultAfterRouteEnds_isRefused() {
        // 17 m at 0.5 m/s with 0.5 m/s^2: 17/0.5 + 0.5/0.5 = 35 s, plus 5 s settle = 40 s
        ValidationReport r = check(Scenarios.corridor().withKidnapAt(95, Pose.of(10, 1, 0)));

        assertError(r, "faults[0].at", "95 s is after the route ends (about 40 s)");
    }

    @Test
    void faultNamingMissingZone_isRefused() {
        ValidationReport r = check(Scenarios.corridor()
                .withFault(new Fault.Stall("st", new Trigger.OnEntering("carpet"), Wheel.LEFT, 1, false)));

        assertError(r, "faults[0].enters", "no room or floor zone with id \"carpet\"");
    }

    @Test
    void faultNamingMissingDoorOrClutter_isRefused() {
        ValidationReport r = check(Scenarios.corridor()
                .withFault(new Fault.DoorChange("d", new Trigger.AtTime(5), "front-door", DoorState.CLOSED))
                .withFault(new Fault.ClutterChange("c", new Trigger.AtTime(5), "cart", true)));

        assertError(r, "faults[0].door", "no door with id \"front-door\"");
        assertError(r, "faults[1].clutter", "no clutter with id \"cart\"");
    }

    @Test
    void kidnapIntoFixture_isRefused() {
        ValidationReport r = check(Scenarios.corridor().withKidnapAt(10, Pose.of(4, 5.3, 0)));

        assertError(r, "faults[0].to", "inside fixture \"Cabinet\"");
    }

    @Test
    void duplicateFaultIds_areRefused() {
        ValidationReport r = check(Scenarios.corridor()
                .withFault(new Fault.Blackout("x", new Trigger.AtTime(1), 1))
                .withFault(new Fault.Blackout("x", new Trigger.AtTime(2), 1)));

        assertError(r, "faults[1].id", "\"x\" is already the id of faults[0]");
    }

    @Test
    void zeroParticles_isRefusedNamingTheSetting() {
        ValidationReport r =
                check(Docs.corridor().set("localizer.particles.count", "0").json());

        assertError(r, "localizer.particles.count", "must be at least 1, got 0");
    }

    @Test
    void absurdParticleCount_isRefused() {
        ValidationReport r = check(
                Docs.corridor().set("localizer.particles.count", "50000000").json());

        assertError(r, "localizer.particles.count", "50,000,000 is over the maximum of 1,000,000");
    }

    @Test
    void absurdBeamCount_isRefused() {
        ValidationReport r =
                check(Docs.corridor().set("rangefinder.beams", "100000").json());

        assertError(r, "rangefinder.beams", "100,000 is over the maximum of 4,096");
    }

    @Test
    void negativeNoise_isRefused() {
        ValidationReport r = check(Docs.corridor()
                .set("localizer.motionNoise.driveFromDrive", "-0.1")
                .json());

        assertError(r, "localizer.motionNoise.driveFromDrive", "-0.1 is out of range; allowed 0 to 10");
    }

    @Test
    void mixtureWeightsNotSummingToOne_isRefused() {
        ValidationReport r = check(
                Docs.corridor().set("localizer.rangeModel.hitWeight", "0.5").json());

        assertError(r, "localizer.rangeModel", "mixture weights add up to 0.6; they must add up to 1");
    }

    @Test
    void thresholdOutOfUnitInterval_isRefused() {
        ValidationReport r = check(
                Docs.corridor().set("localizer.resampling.essFraction", "1.5").json());

        assertError(r, "localizer.resampling.essFraction", "1.5 is out of range; allowed 0 to 1");
    }

    @Test
    void kldConfidence_isAcceptedFromOneHalfTo0point9999AndRefusedOutside() {
        // Below 0.5 the normal quantile z_{1-delta} is negative (z_{0.5} = 0 by the symmetry of
        // the normal distribution), so Fox's bound, Wilson-Hilferty form (Fox, "Adapting the
        // sample size in particle filters through KLD-sampling", IJRR 22(12), 2003), falls under
        // the chi-square mean, and at 0.03 it is zero or below for two bins; 1 itself has an
        // infinite quantile.
        for (String ok : List.of("0.5", "0.99", "0.9999")) {
            ValidationReport r = check(
                    Docs.corridor().set("localizer.particles.confidence", ok).json());
            assertThat(r.problems()).as("confidence %s", ok).isEmpty();
        }
        for (String bad : List.of("0.03", "0.4999", "0.99991", "1")) {
            ValidationReport r = check(
                    Docs.corridor().set("localizer.particles.confidence", bad).json());
            assertError(r, "localizer.particles.confidence", "is out of range; allowed 0.5 to 0.9999");
        }
        ValidationReport variant = check(Docs.corridor()
                .set("variants", "[{\"name\":\"loose\",\"localizer\":{\"particles\":{\"confidence\":0.2}}}]")
                .json());
        assertError(variant, "variants[0].localizer.particles.confidence", "is out of range");
    }

    @Test
    void slowRateNotBelowFastRate_isRefused() {
        ValidationReport r =
                check(Docs.corridor().set("localizer.recovery.slowRate", "0.2").json());

        assertError(r, "localizer.recovery.slowRate", "0.2 must be smaller than fastRate (0.1)");
    }

    @Test
    void badVariantSetting_isReportedUnderTheVariant() {
        ValidationReport r = check(Docs.corridor()
                .set("variants", "[{\"name\":\"none\",\"localizer\":{\"particles\":{\"count\":0}}}]")
                .json());

        assertError(r, "variants[0].localizer.particles.count", "must be at least 1");
    }

    @Test
    void siteLargerThanOneKilometre_isRefused() {
        ValidationReport r =
                check(Scenarios.corridor().withRoom(new Room("far", "Far away", Polygon.rectangle(1500, 0, 5, 5))));

        assertError(r, "site", "sites up to 1000 m across are supported");
    }

    @Test
    void tooManyWaypoints_isRefused() {
        Waypoint[] many = new Waypoint[Limits.MAX_WAYPOINTS + 1];
        for (int i = 0; i < many.length; i++) {
            many[i] = new Waypoint(2 + (i % 2), 1, 0.5, 0);
        }
        ValidationReport r = check(Scenarios.corridor().withWaypoints(many));

        assertError(r, "route.waypoints", "at most 2000 are allowed");
    }

    @Test
    void gridTooFine_forTheSite_isRefused() {
        ValidationReport r = check(Scenarios.corridor()
                .withRoom(new Room("big", "Big hall", Polygon.rectangle(0, -900, 900, 900)))
                .withStart(Pose.of(1, 1, 0)));

        assertError(r, "localizer.rangeModel.cellSize", "grid cells for this site; use at least");
    }

    @Test
    void clutterVanishingBeforeItAppears_isRefused() {
        ValidationReport r = check(Scenarios.corridor()
                .withClutter(new Clutter("cart", "Cart", Polygon.rectangle(10, 1.5, 1, 0.4), 20, 10)));

        assertError(r, "site.clutter[0].vanishAt", "10 s is not after appearAt (20 s)");
    }

    @Test
    void zoneSlipOutOfRange_isRefused() {
        ValidationReport r = check(Scenarios.corridor()
                .withZone(new FloorZone("c", "Carpet", Surface.CARPET, Polygon.rectangle(5, 0, 2, 2), 1.5, 1)));

        assertError(r, "site.floorZones[0].slip", "1.5 is out of range; allowed 0 to 1");
    }

    @Test
    void gateShareOutOfRange_isRefused() {
        ValidationReport r = check(Scenarios.corridor().withGate(new Gate("g", GateMetric.FINAL_ERROR, 0.3, 90)));

        assertError(r, "gates[0].share", "90 must be more than 0 and at most 1");
    }

    @Test
    void zeroSpeed_isRefused() {
        ValidationReport r = check(Scenarios.corridor().withWaypoints(new Waypoint(18, 1, 0, 0)));

        assertError(r, "route.waypoints[0].speed", "must be more than 0 m/s");
    }

    @Test
    void everyProblemIsReportedAtOnce() {
        ValidationReport r = check(Docs.corridor()
                .set("localizer.particles.count", "0")
                .set("site.doors[0].room", "\"nowhere\"")
                .set("route.start.x", "50")
                .json());

        assertThat(r.errors())
                .extracting(Problem::path)
                .contains("localizer.particles.count", "site.doors[0].room", "route.start");
    }
}
