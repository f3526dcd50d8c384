package dev.driftlab.evaluation;

/**
 * A gate whose verdict differs between two runs of the same cell (against a baseline), or between
 * a scenario as it is and under a profile. Differences are after minus before, per seed, over the
 * seeds both exercised; the interval is the normal approximation (mean +/- 1.96 standard errors of
 * the per-seed differences), as in {@link PairedComparison}.
 *
 * @param before the gate in the earlier run, or as the scenario is
 * @param after the gate now, or under the profile
 * @param pairs seeds that exercised the gate in both
 * @param difference mean per-seed difference of passing (1 passed, 0 failed), NaN without pairs
 * @param low lower 95 % bound, NaN below two pairs
 * @param high upper 95 % bound, NaN below two pairs
 */
public record GateChange(GateTally before, GateTally after, int pairs, double difference, double low, double high) {

    /** Whether the gate held before and fails now. */
    public boolean regression() {
        return before.pass() && !after.pass();
    }

    /** Whether the gate failed before and holds now. */
    public boolean improvement() {
        return !before.pass() && after.pass();
    }
}
