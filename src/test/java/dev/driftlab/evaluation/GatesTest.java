package dev.driftlab.evaluation;

import static org.assertj.core.api.Assertions.assertThat;

import dev.driftlab.scenario.Gate;
import dev.driftlab.scenario.GateMetric;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;

class GatesTest {

    private static TrialOutcome trial(long seed, double recoveredAfter, double finalError) {
        List<KidnapOutcome> k = List.of(new KidnapOutcome(60, 0.5, recoveredAfter));
        return new TrialOutcome("base", seed, 180, 0.1, 0.1, finalError, 0.01, 0, List.of(), k, 0, 2000);
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
        // Wilson 95 % for 18/20 (design CHECKS.md): [0.6990, 0.9721]
        assertThat(v.interval().lower()).isBetween(0.6989, 0.6991);
        assertThat(v.uncertain()).isTrue();
        assertThat(v.reason())
                .isEqualTo("18 of 20 trials (90 %, 95 % interval 69.9 % to 97.2 %) recovered from every kidnap "
                        + "within 20 s, meeting the required 90 %");
    }

    @Test
    void recoveryGate_failsWhenRecoveryIsTooSlow() {
        List<TrialOutcome> ts = List.of(trial(1, 25, 0.1), trial(2, 5, 0.1));

        GateVerdict v = Gates.evaluate(new Gate("g", GateMetric.RECOVERY_TIME, 20, 0.9), "base", ts);

        assertThat(v.pass()).isFalse();
        assertThat(v.reason()).contains("1 of 2 trials").contains("below the required 90 %");
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
    void batchSummary_pairsVariantsBySeed() {
        List<TrialOutcome> ts = new ArrayList<>();
        for (int i = 0; i < 10; i++) {
            ts.add(trial(i, 8, 0.1));
            List<KidnapOutcome> k = List.of(new KidnapOutcome(60, 2, i < 3 ? 15 : Double.NaN));
            ts.add(new TrialOutcome("no injection", i, 180, 0.5, 0.5, 3, 0.1, 0, List.of(), k, 0, 2000));
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
}
