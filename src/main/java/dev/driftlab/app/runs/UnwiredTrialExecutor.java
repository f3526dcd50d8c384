package dev.driftlab.app.runs;

/**
 * Stands in until the simulation engine is wired in: every run fails at once with a plain message,
 * so queueing, progress and states can be used and tested end to end without pretending results.
 */
final class UnwiredTrialExecutor implements TrialExecutor {

    @Override
    public StoredResult execute(TrialRequest request, TrialContext context) {
        throw new IllegalStateException("The simulation engine is not connected to this server yet; nothing was run.");
    }
}
