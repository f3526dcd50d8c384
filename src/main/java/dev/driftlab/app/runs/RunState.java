package dev.driftlab.app.runs;

import java.util.Locale;
import java.util.Optional;

/** Where a run is in its life. */
public enum RunState {
    QUEUED,
    RUNNING,
    DONE,
    FAILED,
    CANCELLED,
    /** Left queued or running by a server that stopped; can be run again. */
    INTERRUPTED;

    /** The word stored and shown. */
    public String word() {
        return name().toLowerCase(Locale.ROOT);
    }

    /** Whether the run will not change any more. */
    public boolean finished() {
        return this != QUEUED && this != RUNNING;
    }

    /**
     * Whether a run in the stored state can no longer change, so what is made of it may be kept:
     * finished, but not interrupted (an interrupted run may be run again).
     */
    public static boolean settled(String word) {
        return of(word).map(s -> s.finished() && s != INTERRUPTED).orElse(false);
    }

    /** The state for a stored word. */
    public static Optional<RunState> of(String word) {
        for (RunState s : values()) {
            if (s.word().equals(word)) {
                return Optional.of(s);
            }
        }
        return Optional.empty();
    }
}
