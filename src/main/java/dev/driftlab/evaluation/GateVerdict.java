package dev.driftlab.evaluation;

import dev.driftlab.scenario.Gate;

/**
 * The result of one gate over a batch's trials for one settings variant.
 *
 * @param gate the gate
 * @param variant settings variant name
 * @param passed trials within the bound
 * @param trials trials evaluated
 * @param interval 95 % Wilson score interval of the passing share
 * @param pass whether the observed share meets the required share
 * @param reason one plain sentence saying why
 */
public record GateVerdict(
        Gate gate, String variant, int passed, int trials, Interval interval, boolean pass, String reason) {

    /** Observed passing share. */
    public double share() {
        return trials == 0 ? 0 : (double) passed / trials;
    }

    /**
     * Whether the interval straddles the required share: the verdict could flip with more seeds.
     */
    public boolean uncertain() {
        return interval.lower() < gate.share() && interval.upper() >= gate.share();
    }
}
