package dev.driftlab.scenario;

import static org.assertj.core.api.Assertions.assertThat;

import dev.driftlab.geometry.Polygon;
import dev.driftlab.geometry.Pose;
import java.util.EnumMap;
import java.util.Map;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.EnumSource;

/**
 * Every fault kind of the one list has a check of its own fields that can refuse a fault: one bad
 * fault per kind, with the path and message the validator must give. A kind added to {@link
 * FaultKind} without a row here fails this test. Source: common practice, no source.
 */
class FaultChecksTest {

    private static final Trigger AT_5 = new Trigger.AtTime(5);

    /** One fault per kind that breaks a rule of that kind, with the expected path and message. */
    private record Bad(Fault fault, String path, String message) {}

    private static final Map<FaultKind, Bad> BAD = new EnumMap<>(FaultKind.class);

    static {
        BAD.put(
                FaultKind.SLIP,
                new Bad(
                        new Fault.Slip("f", AT_5, Wheel.LEFT, 1.5, 2),
                        "faults[0].fraction",
                        "1.5 is out of range; allowed 0 to 1"));
        BAD.put(
                FaultKind.STALL,
                new Bad(
                        new Fault.Stall("f", AT_5, Wheel.RIGHT, 0, true),
                        "faults[0].duration",
                        "must be more than 0 s"));
        BAD.put(
                FaultKind.KIDNAP,
                new Bad(new Fault.Kidnap("f", AT_5, Pose.of(4, 5.3, 0)), "faults[0].to", "inside fixture \"Cabinet\""));
        BAD.put(
                FaultKind.BUMP,
                new Bad(
                        new Fault.Bump("f", AT_5, 0.1, 0, 2),
                        "faults[0].turn",
                        "2 rad is out of range; allowed -1.571 to 1.571 rad"));
        BAD.put(
                FaultKind.DOOR_CHANGE,
                new Bad(
                        new Fault.DoorChange("f", AT_5, "front-door", DoorState.CLOSED),
                        "faults[0].door",
                        "no door with id \"front-door\""));
        BAD.put(
                FaultKind.CLUTTER,
                new Bad(
                        new Fault.ClutterChange("f", AT_5, "cart", true),
                        "faults[0].clutter",
                        "no clutter with id \"cart\""));
        BAD.put(
                FaultKind.BLACKOUT,
                new Bad(
                        new Fault.Blackout("f", AT_5, 1e6),
                        "faults[0].duration",
                        "1000000 s is longer than the longest run"));
        BAD.put(
                FaultKind.NOISE_BURST,
                new Bad(
                        new Fault.NoiseBurst("f", AT_5, 2, 0.5),
                        "faults[0].factor",
                        "0.5 is out of range; allowed 1 to 100"));
        BAD.put(
                FaultKind.SPURIOUS_MAX_RANGE,
                new Bad(
                        new Fault.SpuriousMaxRange("f", AT_5, 2, 2),
                        "faults[0].share",
                        "2 is out of range; allowed 0 to 1"));
    }

    @ParameterizedTest
    @EnumSource(FaultKind.class)
    void everyKind_hasACheckThatRefusesABadFault(FaultKind kind) {
        Bad bad = BAD.get(kind);
        assertThat(bad).as("a bad %s fault for this test", kind.fileName()).isNotNull();
        assertThat(FaultKind.of(bad.fault())).isEqualTo(kind);

        ValidationReport r = ScenarioValidator.validate(
                Scenarios.corridor().withFault(bad.fault()).build());

        assertThat(r.errors()).as("errors: %s", r.problems()).anySatisfy(p -> {
            assertThat(p.path()).isEqualTo(bad.path());
            assertThat(p.message()).contains(bad.message());
        });
    }

    @ParameterizedTest
    @EnumSource(FaultKind.class)
    void everyKind_withTheEditorsInitialValues_isAccepted(FaultKind kind) {
        Fault good = switch (kind) {
            case SLIP -> new Fault.Slip("f", AT_5, Wheel.LEFT, 0.3, 2);
            case STALL -> new Fault.Stall("f", AT_5, Wheel.LEFT, 1.5, false);
            case KIDNAP -> new Fault.Kidnap("f", AT_5, Pose.of(10, 1, 0));
            case BUMP -> new Fault.Bump("f", AT_5, 0.1, 0, Math.toRadians(10));
            case DOOR_CHANGE -> new Fault.DoorChange("f", AT_5, "side-door", DoorState.CLOSED);
            case CLUTTER -> new Fault.ClutterChange("f", AT_5, "box", true);
            case BLACKOUT -> new Fault.Blackout("f", AT_5, 2);
            case NOISE_BURST -> new Fault.NoiseBurst("f", AT_5, 2, 5);
            case SPURIOUS_MAX_RANGE -> new Fault.SpuriousMaxRange("f", AT_5, 2, 0.3);
        };
        Scenarios.Builder b = Scenarios.corridor().withFault(good);
        if (kind == FaultKind.CLUTTER) {
            b.clutter.add(new Clutter("box", "Box", Polygon.rectangle(10, 0.2, 0.3, 0.3), 0, Double.POSITIVE_INFINITY));
        }

        ValidationReport r = ScenarioValidator.validate(b.build());

        assertThat(r.errors()).as("errors: %s", r.problems()).isEmpty();
    }
}
