package dev.driftlab.trial;

import dev.driftlab.evaluation.TrialOutcome;

/** Receives batch progress; called from worker threads, so implementations must be thread-safe. */
@FunctionalInterface
public interface BatchProgress {

    /**
     * One trial finished.
     *
     * @param done trials finished so far
     * @param total trials in the batch
     * @param last the trial that just finished
     */
    void trialDone(int done, int total, TrialOutcome last);

    /** Ignores progress. */
    BatchProgress NONE = (done, total, last) -> {};
}
