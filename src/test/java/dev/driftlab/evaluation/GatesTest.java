package dev.driftlab.evaluation;

import static org.assertj.core.api.Assertions.assertThat;

import dev.driftlab.scenario.Gate;
import dev.driftlab.scenario.GateMetric;
import dev.driftlab.scenario.GateRule;
import java.util.ArrayList;
import java.util.List;
import org.apache.commons.math3.stat.interval.IntervalUtils;
import org.junit.jupiter.api.Test;

class GatesTest {

    private static TrialOutcome trial(long seed, double recoveredAfter, double finalError) {
        List<KidnapOutcome> k = List.of(new KidnapOutcome(60, 0.5, recoveredAfter));
        return trial("base", seed, k, finalError, TrialEnd.completed(180, 0, 0), 0);
    }

    private static TrialOutcome trial(
            String variant, long seed, List<KidnapOutcome> kidnaps, double finalError, TrialEnd end, int contacts) {
        return new TrialOutcome(
                variant,
                seed,
                end.time(),
                0.1,
                0.1,
                finalError,
                0.01,
                0,
                List.of(),
                kidnaps,
                contacts,
                2000,
                end,
                List.of(),
                0.02,
                0.05);
    }

    private static TrialOutcome stoppedAtContact(long seed, double at) {
        return trial("base", seed, List.of(), 0.05, new TrialEnd(TrialEnd.Kind.CONTACT, at, 5.2, 5.9), 1);
    }

    @Test
    void recoveryGate_passesAtTheRequiredShare_withWilsonInterval() {
        List<TrialOutcome> ts = new ArrayList<>();
        for (int i = 0; i < 20; i++) {
            ts.add(trial(i, i < 18 ? 12 : Double.NaN, 0.1));
        }
        Gate gate = new Gate("recovers", GateMetric.RECOVERY_TIME, 20, 0.9);

        GateVerdict v = Gates.evaluate(gate, "base", ts);

        assertThat(v.pass()).isTrue();
        assertThat(v.passed()).isEqualTo(18);
        assertThat(v.exercised()).isEqualTo(20);
        // Wilson score interval, 95 %, 18 of 20: [0.6990, 0.9721] (Wilson, "Probable inference, the law of
        // succession, and statistical inference", JASA 22, 1927; values from Commons Math IntervalUtils)
        assertThat(v.interval().lower()).isBetween(0.6989, 0.6991);
        assertThat(v.interval().upper()).isBetween(0.9720, 0.9722);
        assertThat(v.uncertain()).isTrue();
        assertThat(v.reason())
                .isEqualTo("18 of 20 trials with a kidnap and 20 s to recover (90 %, 95 % interval 69.9 % to 97.2 %)"
                        + " recovered from every kidnap within 20 s, meeting the required 90 %");
    }

    @Test
    void recoveryGate_failsWhenRecoveryIsTooSlow() {
        List<TrialOutcome> ts = List.of(trial(1, 25, 0.1), trial(2, 5, 0.1));

        GateVerdict v = Gates.evaluate(new Gate("g", GateMetric.RECOVERY_TIME, 20, 0.9), "base", ts);

        assertThat(v.pass()).isFalse();
        assertThat(v.passed()).isEqualTo(1);
        // 1 of 2 at 90 % required: (1 + k) / (2 + k) >= 0.9 first holds at k = 8
        assertThat(v.morePassingNeeded()).isEqualTo(8);
        assertThat(v.reason()).contains("below the required 90 %").contains("8 more passing trials would be needed");
    }

    /** The case that made this rule: 17 of 20 trials stopped at a pillar before the kidnap at 55 s. */
    @Test
    void recoveryGate_countsOnlyTrialsWhereTheKidnapFired() {
        List<TrialOutcome> ts = new ArrayList<>();
        for (int i = 0; i < 17; i++) {
            ts.add(stoppedAtContact(i, 37));
        }
        ts.add(trial(17, 8, 0.1));
        ts.add(trial(18, 9, 0.1));
        ts.add(trial(19, Double.NaN, 0.1));
        Gate gate = new Gate("recovers", GateMetric.RECOVERY_TIME, 20, 0.8);

        GateVerdict v = Gates.evaluate(gate, "base", ts);

        assertThat(v.exercised()).isEqualTo(3);
        assertThat(v.passed()).isEqualTo(2);
        assertThat(v.trials()).isEqualTo(20);
        assertThat(v.share()).isEqualTo(2.0 / 3.0);
        assertThat(v.pass()).isFalse();
        // the interval is over the 3 exercised trials, not the 20
        org.apache.commons.math3.stat.interval.ConfidenceInterval ref =
                IntervalUtils.getWilsonScoreInterval(3, 2, 0.95);
        assertThat(v.interval().lower()).isCloseTo(ref.getLowerBound(), org.assertj.core.data.Offset.offset(1e-9));
        assertThat(v.reason())
                .contains("17 of 20 trials had no kidnap, or ended within 20 s of it, and are not counted");
    }

    @Test
    void recoveryGate_aKidnapInTheLastSecondsIsNotExercised_unlessItWasRecoveredAnyway() {
        Gate gate = new Gate("recovers", GateMetric.RECOVERY_TIME, 20, 0.8);
        TrialOutcome late = trial(
                "base", 1, List.of(new KidnapOutcome(170, 0.5, Double.NaN)), 0.1, TrialEnd.completed(180, 0, 0), 0);
        TrialOutcome lateButQuick =
                trial("base", 2, List.of(new KidnapOutcome(170, 0.5, 4)), 0.1, TrialEnd.completed(180, 0, 0), 0);
        TrialOutcome inTime = trial(
                "base", 3, List.of(new KidnapOutcome(160, 0.5, Double.NaN)), 0.1, TrialEnd.completed(180, 0, 0), 0);

        assertThat(Gates.exercised(gate, late)).isFalse();
        assertThat(Gates.exercised(gate, lateButQuick)).isTrue();
        assertThat(Gates.passes(gate, lateButQuick)).isTrue();
        assertThat(Gates.exercised(gate, inTime)).isTrue();
        assertThat(Gates.passes(gate, inTime)).isFalse();
        assertThat(Gates.evaluate(gate, "base", List.of(late)).reason())
                .isEqualTo("not exercised: the kidnap fired in 1 of 1 trials, but none ran on for the 20 s the gate"
                        + " allows for recovery, so the gate cannot pass");
    }

    @Test
    void gateExercisedByNoTrial_failsAndSaysSo() {
        List<TrialOutcome> ts = new ArrayList<>();
        for (int i = 0; i < 20; i++) {
            ts.add(stoppedAtContact(i, 37));
        }

        GateVerdict v = Gates.evaluate(new Gate("recovers", GateMetric.RECOVERY_TIME, 20, 0.8), "base", ts);

        assertThat(v.pass()).isFalse();
        assertThat(v.notExercised()).isTrue();
        assertThat(v.exercised()).isZero();
        assertThat(v.share()).isNaN();
        assertThat(v.reason()).isEqualTo("not exercised: the kidnap fired in 0 of 20 trials, so the gate cannot pass");
    }

    @Test
    void finalErrorGate_isNotJudgedOnThePoseWhereATrialStopped() {
        // the stopped trial has a tiny error at the moment of contact: it must not count as a pass
        List<TrialOutcome> ts = List.of(stoppedAtContact(1, 8), trial(2, 5, 0.4));

        GateVerdict v = Gates.evaluate(new Gate("g", GateMetric.FINAL_ERROR, 0.25, 0.5), "base", ts);

        assertThat(v.exercised()).isEqualTo(1);
        assertThat(v.passed()).isZero();
        assertThat(v.pass()).isFalse();
    }

    @Test
    void finalErrorGate() {
        List<TrialOutcome> ts = List.of(trial(1, 5, 0.2), trial(2, 5, 0.3));

        assertThat(Gates.evaluate(new Gate("g", GateMetric.FINAL_ERROR, 0.25, 0.5), "base", ts)
                        .pass())
                .isTrue();
        assertThat(Gates.evaluate(new Gate("g", GateMetric.FINAL_ERROR, 0.25, 1.0), "base", ts)
                        .pass())
                .isFalse();
    }

    @Test
    void routeAndContactGates_judgeEveryTrial() {
        List<TrialOutcome> ts = List.of(stoppedAtContact(1, 8), trial(2, 5, 0.1), trial(3, 5, 0.1));

        GateVerdict route = Gates.evaluate(new Gate("r", GateMetric.ROUTE_COMPLETED, 0, 1.0), "base", ts);
        GateVerdict contact = Gates.evaluate(new Gate("c", GateMetric.NO_CONTACT, 0, 1.0), "base", ts);

        assertThat(route.exercised()).isEqualTo(3);
        assertThat(route.passed()).isEqualTo(2);
        assertThat(route.pass()).isFalse();
        // 2 of 3 with 100 % required: no number of further passing trials can help
        assertThat(route.morePassingNeeded()).isEqualTo(-1);
        assertThat(contact.passed()).isEqualTo(2);
    }

    @Test
    void convergenceGate_exercisedWhenConvergedOrWhenTheTrialLastedTheBound() {
        TrialOutcome shortNeverConverged = new TrialOutcome(
                "base",
                1,
                3,
                1,
                1,
                1,
                0.1,
                Double.NaN,
                List.of(),
                List.of(),
                1,
                500,
                new TrialEnd(TrialEnd.Kind.CONTACT, 3, 0, 0),
                List.of(),
                Double.NaN,
                Double.NaN);
        TrialOutcome longNeverConverged = new TrialOutcome(
                "base",
                2,
                60,
                1,
                1,
                1,
                0.1,
                Double.NaN,
                List.of(),
                List.of(),
                0,
                500,
                TrialEnd.completed(60, 0, 0),
                List.of(),
                Double.NaN,
                Double.NaN);
        Gate gate = new Gate("conv", GateMetric.CONVERGENCE_TIME, 10, 1.0);

        assertThat(Gates.exercised(gate, shortNeverConverged)).isFalse();
        assertThat(Gates.exercised(gate, longNeverConverged)).isTrue();
        // a trial that had its chance and never converged fails
        assertThat(Gates.passes(gate, longNeverConverged)).isFalse();
    }

    @Test
    void intervalLowerEndRule_needsMoreEvidenceThanTheObservedShare() {
        List<TrialOutcome> ts = new ArrayList<>();
        for (int i = 0; i < 20; i++) {
            ts.add(trial(i, i < 19 ? 5 : Double.NaN, 0.1));
        }
        Gate observed = new Gate("g", GateMetric.RECOVERY_TIME, 20, 0.8);
        Gate confident = new Gate("g", GateMetric.RECOVERY_TIME, 20, 0.8, GateRule.INTERVAL_LOWER_END);

        GateVerdict a = Gates.evaluate(observed, "base", ts);
        GateVerdict b = Gates.evaluate(confident, "base", ts);

        assertThat(a.pass()).isTrue();
        // Wilson 95 % lower end of 19/20 is 0.7639 (IntervalUtils), below 0.8
        assertThat(b.interval().lower()).isCloseTo(0.7639, org.assertj.core.data.Offset.offset(1e-4));
        assertThat(b.pass()).isFalse();
        assertThat(b.reason()).contains("judged by the interval's lower end");
        // the smallest k with Wilson lower (19 + k, 20 + k) >= 0.8, searched here independently with Commons Math
        int k = 0;
        while (IntervalUtils.getWilsonScoreInterval(20 + k, 19 + k, 0.95).getLowerBound() < 0.8) {
            k++;
        }
        assertThat(b.morePassingNeeded()).isEqualTo(k).isPositive();
    }

    @Test
    void intervalLowerEndRule_cannotReachAHundredPercent() {
        List<TrialOutcome> ts = List.of(trial(1, 5, 0.1), trial(2, 5, 0.1));

        GateVerdict v = Gates.evaluate(
                new Gate("g", GateMetric.RECOVERY_TIME, 20, 1.0, GateRule.INTERVAL_LOWER_END), "base", ts);

        assertThat(v.pass()).isFalse();
        assertThat(v.morePassingNeeded()).isEqualTo(-1);
        assertThat(v.reason()).contains("no number of further passing trials would be enough");
    }

    @Test
    void verdict_wordsForEachCause() {
        List<TrialOutcome> stopped = List.of(stoppedAtContact(1, 37), stoppedAtContact(2, 38));
        List<TrialOutcome> fine = List.of(trial(1, 5, 0.1), trial(2, 5, 0.1));
        Gate recovery = new Gate("recovers", GateMetric.RECOVERY_TIME, 20, 0.8);

        List<GateVerdict> unexercised = List.of(Gates.evaluate(recovery, "base", stopped));
        List<GateVerdict> early = List.of(
                Gates.evaluate(recovery, "base", stopped), Gates.evaluate(Gates.ROUTE_DEFAULT, "base", stopped));
        List<GateVerdict> failing =
                List.of(Gates.evaluate(new Gate("g", GateMetric.FINAL_ERROR, 0.01, 1), "base", fine));
        List<GateVerdict> passing = List.of(Gates.evaluate(recovery, "base", fine));

        assertThat(Verdict.of(unexercised, true)).isEqualTo(Verdict.NOT_EXERCISED);
        assertThat(Verdict.of(early, true)).isEqualTo(Verdict.ENDED_EARLY);
        assertThat(Verdict.of(failing, true)).isEqualTo(Verdict.FAIL);
        assertThat(Verdict.of(passing, true)).isEqualTo(Verdict.PASS);
        assertThat(Verdict.of(passing, false)).isEqualTo(Verdict.INCOMPLETE);
    }

    @Test
    void batchSummary_pairsVariantsBySeed() {
        List<TrialOutcome> ts = new ArrayList<>();
        for (int i = 0; i < 10; i++) {
            ts.add(trial(i, 8, 0.1));
            List<KidnapOutcome> k = List.of(new KidnapOutcome(60, 2, i < 3 ? 15 : Double.NaN));
            ts.add(trial("no injection", i, k, 3, TrialEnd.completed(180, 0, 0), 0));
        }

        BatchSummary s = BatchSummary.of(ts, List.of(new Gate("g", GateMetric.RECOVERY_TIME, 20, 0.9)));

        assertThat(s.variants()).extracting(VariantSummary::variant).containsExactly("base", "no injection");
        assertThat(s.variants().get(0).recovered()).isEqualTo(10);
        assertThat(s.variants().get(1).recovered()).isEqualTo(3);
        PairedComparison c = s.comparisons().get(0);
        assertThat(c.pairs()).isEqualTo(10);
        assertThat(c.bothRecovered()).isEqualTo(3);
        assertThat(c.onlyBaseRecovered()).isEqualTo(7);
        assertThat(c.recoveryShareDifference()).isEqualTo(-0.7, org.assertj.core.data.Offset.offset(1e-12));
        assertThat(c.medianRecoveryTimeDifference()).isEqualTo(7.0);
        assertThat(s.allGatesPass()).isFalse();
    }

    @Test
    void earlyEndsAndFaultTallies_sayWhatHappened() {
        List<TrialOutcome> ts = new ArrayList<>();
        for (int i = 0; i < 17; i++) {
            ts.add(new TrialOutcome(
                    "base",
                    i,
                    37,
                    0.1,
                    0.1,
                    0.1,
                    0.01,
                    2,
                    List.of(),
                    List.of(),
                    1,
                    500,
                    new TrialEnd(TrialEnd.Kind.CONTACT, 36 + i / 8.0, 5.2, 5.9),
                    List.of(new dev.driftlab.sim.FaultFiring(
                            "carried", false, Double.NaN, "scheduled at 55.0 s, but the trial ended first, at 37.0 s")),
                    0.02,
                    0.05));
        }
        for (int i = 17; i < 20; i++) {
            ts.add(new TrialOutcome(
                    "base",
                    i,
                    90,
                    0.1,
                    0.1,
                    0.1,
                    0.01,
                    2,
                    List.of(),
                    List.of(new KidnapOutcome(55, 1, 6)),
                    0,
                    500,
                    TrialEnd.completed(90, 1, 1),
                    List.of(new dev.driftlab.sim.FaultFiring("carried", true, 55, "")),
                    0.02,
                    0.05));
        }

        List<EarlyEnds> early = EarlyEnds.of(ts);
        List<FaultTally> faults = FaultTally.of(ts);

        assertThat(early).hasSize(1);
        assertThat(early.get(0).sentence())
                .startsWith("17 of 20 trials stopped at a contact near (5.2, 5.9) at about 37 s");
        assertThat(faults)
                .containsExactly(
                        new FaultTally("carried", 3, 20, List.of("scheduled at 55.0 s, but the trial ended first")));
        assertThat(faults.get(0).missed()).isTrue();
    }

    @Test
    void answerTimeGate_judgesTheTimedTrials_byTheir99thPercentile() {
        Gate gate = new Gate("answers", GateMetric.ANSWER_TIME, 0.05, 0.9);
        TrialEnd done = TrialEnd.completed(60, 1, 1);
        List<TrialOutcome> ts = new ArrayList<>();
        for (int i = 0; i < 10; i++) {
            // one trial of ten over 50 ms at its 99th percentile: 90 % reach the bound
            ts.add(trial("base", i, List.of(), 0.05, done, 0).withAnswerTimes(0.004, i == 0 ? 0.08 : 0.02));
        }
        ts.add(trial("base", 99, List.of(), 0.05, done, 0));

        GateVerdict v = Gates.evaluate(gate, "base", ts);

        assertThat(v.exercised()).as("the untimed trial is not exercised").isEqualTo(10);
        assertThat(v.passed()).isEqualTo(9);
        assertThat(v.pass()).isTrue();
        assertThat(Gates.describe(gate)).isEqualTo("answered 99 % of scans within 0.05 s");
        assertThat(Gates.evaluate(gate, "base", List.of(ts.get(10))).notExercised())
                .isTrue();
    }

    @Test
    void answerTimes_areLeftOutOfEquality_butTroubleIsNot() {
        TrialOutcome t = trial("base", 1, List.of(), 0.05, TrialEnd.completed(60, 1, 1), 0);

        assertThat(t.withAnswerTimes(0.001, 0.002)).isEqualTo(t.withAnswerTimes(0.003, 0.009));
        assertThat(t.withAnswerTimes(0.001, 0.002).hashCode()).isEqualTo(t.hashCode());
        assertThat(t.withLocalizerTrouble("crash: gone")).isNotEqualTo(t);
    }
}
