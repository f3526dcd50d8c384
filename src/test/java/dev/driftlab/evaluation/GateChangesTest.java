package dev.driftlab.evaluation;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;

/** Gate changes between suite runs and under profiles: exactly the flipped gates, paired by seed. */
class GateChangesTest {

    /** A tally from per-seed marks written as "P" (passed), "F" (exercised, failed) or "-" (not exercised). */
    private static GateTally tally(String scenario, String column, String gate, boolean pass, String marks) {
        List<GateTally.Mark> ms = new ArrayList<>();
        int passed = 0;
        int exercised = 0;
        for (int i = 0; i < marks.length(); i++) {
            char c = marks.charAt(i);
            boolean ex = c != '-';
            boolean p = c == 'P';
            exercised += ex ? 1 : 0;
            passed += p ? 1 : 0;
            ms.add(new GateTally.Mark(i + 1, ex, p));
        }
        return new GateTally(scenario, column, gate, pass, passed, exercised, ms);
    }

    @Test
    void between_flagsExactlyTheGatesWhoseVerdictFlipped_regressionsFirst() {
        List<GateTally> before = List.of(
                tally("ward", "as is", "final", true, "PPPP"),
                tally("ward", "as is", "lost", false, "PFFF"),
                tally("ward", "noisy", "final", true, "PPPF"),
                tally("hall", "as is", "recovers", true, "PPPP"),
                tally("hall", "as is", "gone-now", true, "PPPP"));
        List<GateTally> after = List.of(
                tally("ward", "as is", "final", true, "PPPF"), // share moved, verdict did not: no change
                tally("ward", "as is", "lost", true, "PPPP"), // improvement
                tally("ward", "noisy", "final", false, "PFFF"), // regression
                tally("hall", "as is", "recovers", false, "PP-F"), // regression
                tally("hall", "as is", "new-gate", false, "FFFF")); // not in the baseline: not compared

        List<GateChange> changes = GateChanges.between(before, after);

        assertThat(changes)
                .extracting(c -> c.after().scenario() + "/" + c.after().column() + "/"
                        + c.after().gate() + ":" + (c.regression() ? "regression" : "improvement"))
                .containsExactly(
                        "ward/noisy/final:regression", "hall/as is/recovers:regression", "ward/as is/lost:improvement");
        // seed 3 was not exercised now, so it is not a pair
        assertThat(changes.get(1).pairs()).isEqualTo(3);
        assertThat(changes.get(1).difference()).isCloseTo(-1.0 / 3, within(1e-12));
    }

    @Test
    void underProfiles_comparesEachProfileWithTheScenarioAsItIs() {
        List<GateTally> run = List.of(
                tally("ward", "as is", "final", true, "PPP"),
                tally("ward", "noisy", "final", false, "PFF"),
                tally("ward", "few", "final", true, "PPP"),
                tally("hall", "as is", "final", false, "FFF"),
                tally("hall", "noisy", "final", true, "PPF"));

        assertThat(GateChanges.underProfiles(run, "as is"))
                .extracting(c -> c.after().scenario() + "/" + c.after().column() + "/"
                        + c.before().column() + ":" + c.regression())
                .containsExactly("ward/noisy/as is:true", "hall/noisy/as is:false");
    }

    @Test
    void pairedDifference_isTheLargeSampleIntervalOfTheMeanPerSeedDifference() {
        // 10 seeds: 6 passed in both, 3 passed before only (c = 3), 1 passed now only (b = 1).
        GateTally before = tally("s", "as is", "g", true, "PPPPPPPPPF");
        GateTally after = tally("s", "as is", "g", false, "PPPPPPFFFP");

        GateChange c = GateChanges.change(before, after);

        // Newcombe, "Improved confidence intervals for the difference between binomial proportions
        // based on paired data", Statistics in Medicine 17 (1998) 2635-2650, method 1 (the simple
        // asymptotic interval): difference (b - c) / n, standard error sqrt(b + c - (b - c)^2 / n) / n.
        // Our standard error is that of the mean of the per-seed differences with the sample
        // standard deviation (divisor n - 1), i.e. Newcombe's times sqrt(n / (n - 1)).
        int n = 10;
        int b = 1;
        int cc = 3;
        double diff = (double) (b - cc) / n;
        double se = Math.sqrt(b + cc - (double) (b - cc) * (b - cc) / n) / n * Math.sqrt((double) n / (n - 1));
        // 97.5 % normal quantile from Apache Commons Math, an independent implementation
        double z = new org.apache.commons.math3.distribution.NormalDistribution().inverseCumulativeProbability(0.975);
        assertThat(c.pairs()).isEqualTo(n);
        assertThat(c.difference()).isCloseTo(diff, within(1e-12));
        assertThat(c.low()).isCloseTo(diff - z * se, within(1e-9));
        assertThat(c.high()).isCloseTo(diff + z * se, within(1e-9));
        assertThat(c.regression()).isTrue();
    }

    @Test
    void noCommonExercisedSeed_givesNoDifference() {
        GateChange c = GateChanges.change(tally("s", "c", "g", true, "PP--"), tally("s", "c", "g", false, "--FF"));

        assertThat(c.pairs()).isZero();
        assertThat(c.difference()).isNaN();
        assertThat(c.low()).isNaN();
    }

    @Test
    void tally_refusesCountsThatDisagreeWithTheMarks() {
        org.assertj.core.api.Assertions.assertThatThrownBy(
                        () -> new GateTally("s", "c", "g", true, 2, 2, List.of(new GateTally.Mark(1, true, true))))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessageContaining("do not agree");
    }
}
