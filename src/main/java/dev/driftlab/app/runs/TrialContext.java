package dev.driftlab.app.runs;

/**
 * What a {@link TrialExecutor} may do while a unit is going: report, check for a cancel, store
 * frames and finished trials.
 */
public interface TrialContext {

    /** Largest frame chunk stored, in bytes. */
    int MAX_CHUNK_BYTES = 16 * 1024 * 1024;

    /**
     * Reports how far this unit is.
     *
     * @param fraction done share of the unit's seeds, from 0 to 1 (clamped)
     * @param message short plain text, e.g. "seed 4 (2 of 3)"
     */
    void progress(double fraction, String message);

    /** Whether the run was cancelled or the process is stopping; also true when the thread is interrupted. */
    boolean cancelled();

    /**
     * Stores one chunk of recorded frames at once (the player fetches them by index). Storing a
     * chunk index again leaves the first copy.
     *
     * @param index chunk number, from 0
     * @param data opaque bytes in the recorder's format, at most {@link #MAX_CHUNK_BYTES}
     */
    void frameChunk(int index, byte[] data);

    /** Stores one finished trial; storing a seed again leaves the first copy. */
    void trialDone(TrialRecord trial);
}
