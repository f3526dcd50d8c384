package dev.driftlab.app.runs;

import dev.driftlab.app.runs.persistence.RunColumns;
import dev.driftlab.app.runs.persistence.RunRepository.RunRow;

/**
 * How to run the trials.
 *
 * @param recordFrames whether to hand recorded frames to {@link TrialContext#frameChunk}
 * @param particles a fixed particle count replacing the variant's own (a particle-count sweep),
 *     or 0 to keep the variant's settings
 */
public record TrialOptions(boolean recordFrames, int particles) {

    /** Checks the particle count is 0 (none) or positive. */
    public TrialOptions {
        if (particles < 0) {
            throw new IllegalArgumentException("particles must be 0 (the variant's own) or positive");
        }
    }

    /** The variant's own settings, frames as given. */
    public TrialOptions(boolean recordFrames) {
        this(recordFrames, 0);
    }

    /** Results only, no frames. */
    public static TrialOptions resultsOnly() {
        return new TrialOptions(false);
    }

    /** Whether these runs are one count of a particle-count sweep. */
    public boolean sweep() {
        return particles > 0;
    }

    /** The options a stored run was queued with. */
    public static TrialOptions of(RunRow run) {
        RunColumns.Options o = run.storedOptions();
        return new TrialOptions(o.recordFrames(), o.particles());
    }

    /** These options as stored with a run. */
    RunColumns.Options stored() {
        return new RunColumns.Options(recordFrames, particles);
    }
}
