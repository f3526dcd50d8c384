package dev.driftlab.app.runs;

/**
 * How to run the trials.
 *
 * @param recordFrames whether to hand recorded frames to {@link TrialContext#frameChunk}
 */
public record TrialOptions(boolean recordFrames) {

    /** Results only, no frames. */
    public static TrialOptions resultsOnly() {
        return new TrialOptions(false);
    }
}
