package dev.driftlab.trial;

import dev.driftlab.evaluation.BatchSummary;
import dev.driftlab.evaluation.TrialOutcome;
import java.util.List;

/**
 * The trials of a batch and their summary. When the batch was cancelled, {@code trials} holds the
 * trials that finished and the summary covers only those.
 *
 * @param trials finished trials, ordered by variant then seed
 * @param summary per-variant figures, paired comparisons and gate verdicts
 * @param planned trials the batch was asked to run
 * @param cancelled whether the batch stopped before running them all
 * @param seconds wall-clock time taken
 */
public record BatchResult(
        List<TrialOutcome> trials, BatchSummary summary, int planned, boolean cancelled, double seconds) {
    /** Copies the list. */
    public BatchResult {
        trials = List.copyOf(trials);
    }
}
