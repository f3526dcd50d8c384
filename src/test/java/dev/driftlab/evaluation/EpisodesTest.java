package dev.driftlab.evaluation;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.List;
import org.junit.jupiter.api.Test;

/** Convergence, lost and kidnap detection on scripted error series with known answers. */
class EpisodesTest {

    private static final EpisodeRules RULES = EpisodeRules.defaults();

    /** A trace at 10 Hz whose position error follows {@code err(t)} along x, heading exact. */
    private static RunTrace trace(double seconds, java.util.function.DoubleUnaryOperator err) {
        RunTrace tr = new RunTrace();
        int n = (int) Math.round(seconds * 10);
        for (int i = 0; i <= n; i++) {
            double t = i / 10.0;
            tr.add(t, t, 0, 0, t + err.applyAsDouble(t), 0, 0, 1.0, 100, 500, 0, 1, 1);
        }
        return tr;
    }

    @Test
    void convergence_firstTimeErrorStaysUnderForHold() {
        // error 2 m until 12.0 s, a dip under 0.3 m for 1 s at 5 s (too short), then 0.1 m
        RunTrace tr = trace(30, t -> t >= 12 ? 0.1 : (t >= 5 && t < 6 ? 0.1 : 2));

        assertThat(Episodes.convergence(tr, RULES)).isCloseTo(12.0, within(1e-9));
    }

    @Test
    void convergence_neverConverges_isNaN() {
        assertThat(Episodes.convergence(trace(30, t -> 1.0), RULES)).isNaN();
    }

    @Test
    void convergence_atLastFrame_withoutHold_isNotConvergence() {
        RunTrace tr = trace(30, t -> t >= 29.95 ? 0.1 : 2);

        assertThat(Episodes.convergence(tr, RULES)).isNaN();
        EpisodeRules noHold = new EpisodeRules(0.3, Math.toRadians(10), 0, 1, Math.toRadians(30), 1, 0.5, 5);
        assertThat(Episodes.convergence(tr, noHold)).isCloseTo(30.0, within(1e-9));
    }

    @Test
    void lost_countsOnlyStretchesLongerThanHold() {
        // over 1 m during [10, 10.5) (too short) and [20, 24) (an episode)
        RunTrace tr = trace(30, t -> (t >= 10 && t < 10.5) || (t >= 20 && t < 24) ? 3 : 0.05);

        List<Episode> lost = Episodes.lost(tr, RULES, 0);

        assertThat(lost).hasSize(1);
        assertThat(lost.get(0).start()).isCloseTo(20, within(1e-9));
        assertThat(lost.get(0).duration()).isCloseTo(4, within(1e-9));
        assertThat(lost.get(0).ended()).isTrue();
    }

    @Test
    void lost_openAtEnd_isNotEnded() {
        List<Episode> lost = Episodes.lost(trace(30, t -> t >= 25 ? 3 : 0.05), RULES, 0);

        assertThat(lost).singleElement().satisfies(e -> {
            assertThat(e.ended()).isFalse();
            assertThat(e.duration()).isCloseTo(5, within(1e-9));
        });
    }

    @Test
    void twoKidnaps_eachGetsItsOwnRecovery_andAnUnrecoveredFirstCannotBorrowTheSecondsRecovery() {
        // kidnap at 10 s recovered at 15 s; kidnap at 20 s never recovered before 30 s... then a third
        // scripted case: kidnap at 40 s still wrong when the next kidnap hits at 50 s, recovered at 55 s
        RunTrace tr = trace(70, t -> {
            if (t >= 10 && t < 15) {
                return 4;
            }
            if (t >= 40 && t < 55) {
                return 4;
            }
            return 0.05;
        });
        tr.addKidnap(10);
        tr.addKidnap(40);
        tr.addKidnap(50);

        List<KidnapOutcome> k = Episodes.kidnaps(tr, RULES);

        assertThat(k).hasSize(3);
        assertThat(k.get(0).recoveredAfter()).isCloseTo(5, within(1e-9));
        assertThat(k.get(1).recovered()).isFalse();
        assertThat(k.get(2).recoveredAfter()).isCloseTo(5, within(1e-9));
    }

    @Test
    void kidnap_noticedByLikelihoodDrop() {
        RunTrace tr = new RunTrace();
        for (int i = 0; i <= 300; i++) {
            double t = i / 10.0;
            double lik = t >= 12.3 && t < 14 ? 0.2 : 1.0;
            tr.add(t, 0, 0, 0, 0, 0, 0, lik, 100, 500, 0, 1, 1);
        }
        tr.addKidnap(12);

        KidnapOutcome k = Episodes.kidnaps(tr, RULES).get(0);

        assertThat(k.noticedAfter()).isCloseTo(0.3, within(1e-9));
    }

    @Test
    void kidnap_noticedByInjection() {
        RunTrace tr = new RunTrace();
        for (int i = 0; i <= 300; i++) {
            double t = i / 10.0;
            tr.add(t, 0, 0, 0, 0, 0, 0, 1.0, 100, 500, t >= 13 && t < 14 ? 20 : 0, 1, 1);
        }
        tr.addKidnap(12);

        assertThat(Episodes.kidnaps(tr, RULES).get(0).noticedAfter()).isCloseTo(1.0, within(1e-9));
    }
}
