package dev.driftlab.scenario;

import static org.assertj.core.api.Assertions.assertThat;

import dev.driftlab.geometry.Pose;
import org.junit.jupiter.api.Test;

/** The gate keys added for honest verdicts: read, written back unchanged, and checked with their path. */
class GateFormatTest {

    @Test
    void contactAllowedAndIntervalRule_roundTrip() {
        Scenario s = Scenarios.corridor()
                .withKidnapAt(10, Pose.of(15, 1, 0))
                .withContactAllowed(true)
                .withGate(new Gate("confident", GateMetric.RECOVERY_TIME, 20, 0.8, GateRule.INTERVAL_LOWER_END))
                .withGate(new Gate("untouched", GateMetric.NO_CONTACT, 0, 1))
                .withGate(new Gate("drift", GateMetric.RELATIVE_POSE_ERROR_5S, 0.3, 0.9))
                .build();

        String json = ScenarioJson.write(s);
        Scenario back = ScenarioJson.read(json);

        assertThat(json).contains("\"contactAllowed\" : true").contains("\"judgedBy\" : \"interval-lower-end\"");
        assertThat(back).isEqualTo(s);
        assertThat(ScenarioJson.write(back)).isEqualTo(json);
    }

    @Test
    void defaults_areNotWritten_soOlderFilesStayByteIdentical() {
        String json = Scenarios.corridor()
                .withGate(new Gate("final", GateMetric.FINAL_ERROR, 0.5, 0.9))
                .json();

        assertThat(json).doesNotContain("contactAllowed").doesNotContain("judgedBy");
    }

    @Test
    void routeCompletedGate_takesNoBound() {
        ValidationReport r = ScenarioValidator.validate(Scenarios.corridor()
                .withGate(new Gate("route", GateMetric.ROUTE_COMPLETED, 3, 1))
                .build());

        assertThat(r.errors())
                .anySatisfy(p -> assertThat(p.path() + ": " + p.message())
                        .isEqualTo("gates[0].bound: route-completed takes no bound; leave it out or write 0"));
        assertThat(ScenarioValidator.validate(Scenarios.corridor()
                                .withGate(new Gate("route", GateMetric.ROUTE_COMPLETED, 0, 1))
                                .build())
                        .errors())
                .isEmpty();
    }

    @Test
    void noContactGate_boundIsAWholeNumberOfContacts() {
        for (double bad : new double[] {-1, 0.5, Limits.MAX_GATE_CONTACTS + 1}) {
            ValidationReport r = ScenarioValidator.validate(Scenarios.corridor()
                    .withGate(new Gate("c", GateMetric.NO_CONTACT, bad, 1))
                    .build());
            assertThat(r.errors())
                    .as("bound %s", bad)
                    .anySatisfy(p -> assertThat(p.path()).isEqualTo("gates[0].bound"));
        }
        for (double good : new double[] {0, 2, Limits.MAX_GATE_CONTACTS}) {
            assertThat(ScenarioValidator.validate(Scenarios.corridor()
                                    .withGate(new Gate("c", GateMetric.NO_CONTACT, good, 1))
                                    .build())
                            .errors())
                    .as("bound %s", good)
                    .isEmpty();
        }
    }

    @Test
    void unknownJudgingRule_isRefusedWithThePathAndTheChoices() {
        String json = Scenarios.corridor()
                .withGate(new Gate("final", GateMetric.FINAL_ERROR, 0.5, 0.9))
                .json()
                .replace("\"share\" : 0.9", "\"share\" : 0.9, \"judgedBy\" : \"gut-feeling\"");

        ValidationReport r = ScenarioFiles.check(json).report();

        assertThat(r.errors())
                .anySatisfy(p -> assertThat(p.path() + ": " + p.message())
                        .isEqualTo("gates[0].judgedBy: must be one of observed-share, interval-lower-end, got"
                                + " \"gut-feeling\""));
    }
}
