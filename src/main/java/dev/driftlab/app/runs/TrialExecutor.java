package dev.driftlab.app.runs;

import java.util.List;

/**
 * Runs trials and assembles results: the only way the web app reaches the simulation and the
 * localizer. A run is cut into work units of a few seeds; any server or worker process may run a
 * unit ({@link #runSeeds}), and whichever finishes the run's last unit assembles its result from
 * the stored trials ({@link #assemble}). A trial must be a pure function of (revision, variant,
 * seed, options), so that where and how often it ran never changes the result.
 *
 * <p>Contract for implementations:
 *
 * <ul>
 *   <li>Calls for different units overlap, on one process and across processes: be thread-safe
 *       and keep no state between calls that a result depends on.
 *   <li>Hand every finished trial to {@link TrialContext#trialDone} at once, so that a unit
 *       stopped half-way keeps what it finished. {@link TrialRecord#outcome} and
 *       {@link TrialRecord#trace} are opaque to the queue and are read back only by
 *       {@link #assemble}.
 *   <li>Report progress through {@link TrialContext#progress} as often as convenient; the queue
 *       throttles what it stores.
 *   <li>Stop soon after {@link TrialContext#cancelled()} turns true or the thread is interrupted:
 *       throw {@link InterruptedException}.
 *   <li>Hand recorded frames over in chunks through {@link TrialContext#frameChunk} while running.
 *   <li>Any other exception marks the run failed; its message (never its stack trace) is shown, so
 *       it should name the problem plainly.
 * </ul>
 */
public interface TrialExecutor {

    /**
     * Runs some of a run's seeds.
     *
     * @param request the whole run (its full seed list decides which seed records frames)
     * @param seeds the seeds to run now, a part of {@code request.seeds()}
     * @param context progress, cancellation, frames and finished trials for this unit
     * @throws InterruptedException when stopped by a cancel or by the process stopping
     */
    void runSeeds(TrialRequest request, List<Long> seeds, TrialContext context) throws InterruptedException;

    /**
     * The run's result from the trials of every seed.
     *
     * @param request the whole run
     * @param trials one record per seed, in the order of {@code request.seeds()}
     */
    StoredResult assemble(TrialRequest request, List<TrialRecord> trials);
}
