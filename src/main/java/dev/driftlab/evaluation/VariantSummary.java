package dev.driftlab.evaluation;

import java.util.List;

/**
 * Batch figures of one settings variant.
 *
 * @param variant name
 * @param trials number of trials
 * @param recoveryDeadline seconds a kidnap recovery may take to count as a success
 * @param kidnapTrials trials that had at least one kidnap
 * @param recovered trials (among those with kidnaps) that recovered from every kidnap in time
 * @param recoveryRate Wilson interval of the recovery success share (NaN-free; [0, 1] when no kidnap)
 * @param recoveryTimes spread of recovery times over all recovered kidnaps, seconds
 * @param converged trials that converged
 * @param convergenceRate Wilson interval of the converged share
 * @param convergenceTimes spread of convergence times, seconds
 * @param rmse spread of per-trial RMS position error, metres
 * @param finalError spread of final position error, metres
 * @param longestLost spread of the longest lost episode per trial, seconds
 * @param gates verdict of every gate
 * @param earlyEnds trials that ended before their route did, grouped by why (empty when none did)
 * @param faults how often each scheduled fault fired, in scenario order
 */
public record VariantSummary(
        String variant,
        int trials,
        double recoveryDeadline,
        int kidnapTrials,
        int recovered,
        Interval recoveryRate,
        Spread recoveryTimes,
        int converged,
        Interval convergenceRate,
        Spread convergenceTimes,
        Spread rmse,
        Spread finalError,
        Spread longestLost,
        List<GateVerdict> gates,
        List<EarlyEnds> earlyEnds,
        List<FaultTally> faults) {

    /** Copies the lists. */
    public VariantSummary {
        gates = List.copyOf(gates);
        earlyEnds = List.copyOf(earlyEnds);
        faults = List.copyOf(faults);
    }

    /** Trials that ended before their route did. */
    public int endedEarly() {
        return earlyEnds.stream().mapToInt(EarlyEnds::count).sum();
    }

    /** Observed recovery success share, NaN when no trial had a kidnap. */
    public double recoveryShare() {
        return kidnapTrials == 0 ? Double.NaN : (double) recovered / kidnapTrials;
    }

    /** Whether every gate of this variant passes. */
    public boolean allGatesPass() {
        return gates.stream().allMatch(GateVerdict::pass);
    }
}
