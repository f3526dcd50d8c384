package dev.driftlab.app.runs;

/** What a {@link TrialExecutor} may do while a run is going: report, check for a cancel, store frames. */
public interface TrialContext {

    /** Largest frame chunk stored, in bytes. */
    int MAX_CHUNK_BYTES = 16 * 1024 * 1024;

    /**
     * Reports how far the run is.
     *
     * @param fraction done share from 0 to 1 (clamped)
     * @param message short plain text, e.g. "seed 4 of 20"
     */
    void progress(double fraction, String message);

    /** Whether the run was cancelled or the server is stopping; also true when the thread is interrupted. */
    boolean cancelled();

    /**
     * Stores one chunk of recorded frames at once (the player fetches them by index).
     *
     * @param index chunk number, from 0, each used once
     * @param data opaque bytes in the recorder's format, at most {@link #MAX_CHUNK_BYTES}
     */
    void frameChunk(int index, byte[] data);
}
