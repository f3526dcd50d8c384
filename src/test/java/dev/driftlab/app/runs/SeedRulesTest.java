package dev.driftlab.app.runs;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import org.junit.jupiter.api.Test;

/** Seed lists a run may be asked for: no wrap-around past the largest seed, no repeats. */
class SeedRulesTest {

    @Test
    void consecutiveSeeds_nearTheTopOfTheRange_areRefusedInsteadOfWrapping() {
        assertThatThrownBy(() -> RunQueue.consecutiveSeeds(Long.MAX_VALUE - 1, 3))
                .isInstanceOf(RunRefused.class)
                .hasMessage("firstSeed: " + (Long.MAX_VALUE - 1) + " plus 3 seeds passes the largest seed, "
                        + Long.MAX_VALUE + "; start at most at " + (Long.MAX_VALUE - 2))
                .extracting(e -> ((RunRefused) e).field())
                .isEqualTo("firstSeed");
        // the last seed may be the largest one itself
        assertThat(RunQueue.consecutiveSeeds(Long.MAX_VALUE - 2, 3))
                .containsExactly(Long.MAX_VALUE - 2, Long.MAX_VALUE - 1, Long.MAX_VALUE);
    }

    @Test
    void consecutiveSeeds_countOutOfRange_isRefused() {
        assertThatThrownBy(() -> RunQueue.consecutiveSeeds(1, 0)).hasMessageStartingWith("seedCount: 0 seeds");
        assertThatThrownBy(() -> RunQueue.consecutiveSeeds(1, RunQueue.MAX_SEEDS + 1))
                .hasMessageStartingWith("seedCount: " + (RunQueue.MAX_SEEDS + 1) + " seeds asked for");
        assertThat(RunQueue.consecutiveSeeds(-2, 3)).containsExactly(-2L, -1L, 0L);
    }
}
