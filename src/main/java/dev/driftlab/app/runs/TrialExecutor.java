package dev.driftlab.app.runs;

/**
 * Runs the trials of one run: one scenario revision, one settings variant, a list of seeds. The
 * only way the web app reaches the simulation and the localizer, so that the in-process worker pool
 * can later be swapped for a distributed engine without touching anything else.
 *
 * <p>Contract for implementations:
 *
 * <ul>
 *   <li>Called on a worker thread of the run queue, one call per run; calls for different runs may
 *       overlap, so implementations must be thread-safe.
 *   <li>Report progress through {@link TrialContext#progress} as often as convenient; the queue
 *       throttles what it stores.
 *   <li>Stop soon after {@link TrialContext#cancelled()} turns true or the thread is interrupted
 *       (the user cancelled, or the server is stopping): return or throw {@link InterruptedException}.
 *       Whatever is returned after a cancel is discarded.
 *   <li>Hand recorded frames over in chunks through {@link TrialContext#frameChunk} while running,
 *       so no run needs all its frames in memory.
 *   <li>Any other exception marks the run failed; its message (never its stack trace) is shown, so
 *       it should name the problem plainly.
 * </ul>
 */
public interface TrialExecutor {

    /**
     * Runs the trials and returns their results.
     *
     * @param request what to run
     * @param context progress, cancellation and frame storage for this run
     * @return the results as one JSON document
     * @throws InterruptedException when stopped by a cancel or by the server stopping
     */
    StoredResult execute(TrialRequest request, TrialContext context) throws InterruptedException;
}
