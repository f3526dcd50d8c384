package dev.driftlab.localizer;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import org.junit.jupiter.api.Test;

class LikelihoodAveragesTest {

    @Test
    void injectionProbability_followsTheRunningAveragesExactly_onAScriptedSequence() {
        // Thrun, Burgard and Fox (2005), table 8.3 (augmented MCL): w_slow += a_slow (w_avg - w_slow),
        // w_fast += a_fast (w_avg - w_fast), both from 0; inject with max(0, 1 - w_fast / w_slow).
        double slowRate = 0.05;
        double fastRate = 0.5;
        double[] script = {2.0, 2.0, 2.1, 1.9, 2.0, 0.2, 0.1, 0.1, 0.05, 2.0, 2.0, 3.0};
        LikelihoodAverages avg = new LikelihoodAverages(slowRate, fastRate);
        double slow = 0;
        double fast = 0;
        boolean sawInjection = false;
        for (double w : script) {
            avg.update(w);
            slow = slow + slowRate * (w - slow);
            fast = fast + fastRate * (w - fast);
            double p = Math.max(0, 1 - fast / slow);
            assertThat(avg.slow()).isCloseTo(slow, within(1e-15));
            assertThat(avg.fast()).isCloseTo(fast, within(1e-15));
            assertThat(avg.injectionProbability()).isCloseTo(p, within(1e-15));
            sawInjection |= p > 0;
        }
        assertThat(sawInjection)
                .as("the collapse in the script triggers injection")
                .isTrue();
        // Hand-computed at the sixth step (w = 0.2): fast = 0, 1, 1.5, 1.8, 1.85, 1.925, 1.0625;
        // slow = 0.43959059375.
        LikelihoodAverages hand = new LikelihoodAverages(slowRate, fastRate);
        for (int i = 0; i < 6; i++) {
            hand.update(script[i]);
        }
        assertThat(hand.fast()).isCloseTo(1.0625, within(1e-12));
        assertThat(hand.slow()).isCloseTo(0.43959059375, within(1e-12));
        assertThat(hand.injectionProbability()).isZero();
    }

    @Test
    void injectionProbability_isZeroBeforeAnyLikelihood() {
        assertThat(new LikelihoodAverages(0.001, 0.1).injectionProbability()).isZero();
    }
}
