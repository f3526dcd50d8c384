package dev.driftlab.evaluation;

import dev.driftlab.scenario.Gate;

/**
 * The result of one gate over a batch's trials for one settings variant.
 *
 * @param gate the gate
 * @param variant settings variant name
 * @param passed exercised trials within the bound
 * @param exercised trials that exercised the gate (see {@link Gates})
 * @param trials all trials evaluated
 * @param interval 95 % Wilson score interval of the passing share among exercised trials ([0, 1]
 *     when none exercised it)
 * @param pass whether the gate holds under its rule; false when no trial exercised it
 * @param reason one plain sentence saying why
 * @param byDefault whether the gate was added by default rather than written in the scenario
 * @param morePassingNeeded further passing trials that would make a failing gate hold; 0 when it
 *     holds, -1 when no number would (or when it was not exercised)
 */
public record GateVerdict(
        Gate gate,
        String variant,
        int passed,
        int exercised,
        int trials,
        Interval interval,
        boolean pass,
        String reason,
        boolean byDefault,
        int morePassingNeeded) {

    /** Observed passing share among exercised trials; NaN when none exercised the gate. */
    public double share() {
        return exercised == 0 ? Double.NaN : (double) passed / exercised;
    }

    /** Whether no trial exercised the gate. */
    public boolean notExercised() {
        return exercised == 0;
    }

    /**
     * Whether the interval straddles the required share: the verdict could flip with more seeds.
     */
    public boolean uncertain() {
        return exercised > 0 && interval.lower() < gate.share() && interval.upper() >= gate.share();
    }
}
