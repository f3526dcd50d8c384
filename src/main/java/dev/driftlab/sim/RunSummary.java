package dev.driftlab.sim;

/**
 * The end of a run.
 *
 * @param endTime seconds of robot time simulated
 * @param steps internal steps simulated
 * @param scans scans emitted
 * @param outcome how the run ended
 * @param message plain-words explanation of the outcome
 */
public record RunSummary(double endTime, long steps, long scans, Outcome outcome, String message) {
    /** Checks presence. */
    public RunSummary {
        if (outcome == null || message == null) {
            throw new IllegalArgumentException("outcome and message must be given");
        }
    }
}
