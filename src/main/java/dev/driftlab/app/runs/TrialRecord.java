package dev.driftlab.app.runs;

/**
 * One finished trial as the executor hands it over to be stored.
 *
 * @param seed the trial's seed
 * @param outcome the executor's own lossless text of the outcome
 * @param trace the executor's text of the per-frame trace, or null (kept only when the run has one
 *     seed, whose report plots it)
 * @param seconds compute time, for throughput figures only (never part of a result's figures)
 */
public record TrialRecord(long seed, String outcome, String trace, double seconds) {

    /** Checks the outcome is there. */
    public TrialRecord {
        if (outcome == null || outcome.isEmpty()) {
            throw new IllegalArgumentException("a trial record needs its outcome");
        }
    }
}
