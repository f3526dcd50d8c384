package dev.driftlab.app.runs;

import java.util.List;

/**
 * Stands in until the simulation engine is wired in: every run fails at once with a plain message,
 * so queueing, progress and states can be used and tested end to end without pretending results.
 */
final class UnwiredTrialExecutor implements TrialExecutor {

    private static final String WHY = "The simulation engine is not connected to this server yet; nothing was run.";

    @Override
    public void runSeeds(TrialRequest request, List<Long> seeds, TrialContext context) {
        throw new IllegalStateException(WHY);
    }

    @Override
    public StoredResult assemble(TrialRequest request, List<TrialRecord> trials) {
        throw new IllegalStateException(WHY);
    }
}
