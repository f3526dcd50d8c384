package dev.driftlab.app.runs;

import dev.driftlab.app.runs.persistence.RunColumns;
import dev.driftlab.app.runs.persistence.RunRepository.RunRow;

/**
 * How to run the trials.
 *
 * @param recordFrames whether to hand recorded frames to {@link TrialContext#frameChunk}
 * @param particles a fixed particle count replacing the variant's own (a particle-count sweep),
 *     or 0 to keep the variant's settings
 * @param localizer name of an outside localizer from the administrator's allow-list ({@link
 *     LocalizerAllowList}), or null for the built-in one
 */
public record TrialOptions(boolean recordFrames, int particles, String localizer) {

    /** Checks the particle count is 0 (none) or positive, and the localizer's name is well formed. */
    public TrialOptions {
        if (particles < 0) {
            throw new IllegalArgumentException("particles must be 0 (the variant's own) or positive");
        }
        if (localizer != null && !LocalizerAllowList.NAME.matcher(localizer).matches()) {
            throw new IllegalArgumentException("not a localizer name: " + localizer);
        }
    }

    /** The built-in localizer with these frames and particles. */
    public TrialOptions(boolean recordFrames, int particles) {
        this(recordFrames, particles, null);
    }

    /** The same options judging another localizer (null: the built-in one). */
    public TrialOptions withLocalizer(String name) {
        return new TrialOptions(recordFrames, particles, name);
    }

    /** Whether the trials run an outside localizer. */
    public boolean outside() {
        return localizer != null;
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
        return new TrialOptions(o.recordFrames(), o.particles(), o.localizer());
    }

    /** These options as stored with a run. */
    RunColumns.Options stored() {
        return new RunColumns.Options(recordFrames, particles, localizer);
    }
}
