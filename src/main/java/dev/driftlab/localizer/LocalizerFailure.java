package dev.driftlab.localizer;

import java.util.Locale;

/**
 * An outside localizer failed during a trial: the trial ends there, marked with what happened and
 * the last lines the program wrote to its error stream.
 */
public final class LocalizerFailure extends RuntimeException {

    private static final long serialVersionUID = 1L;

    /** What went wrong. */
    public enum Kind {
        /** The program could not be started. */
        START,
        /** The program ended (or closed its output) before the trial did. */
        CRASH,
        /** No answer within the time limit. */
        HANG,
        /** A line that is not the JSON message expected, or a message missing a required field. */
        MALFORMED,
        /** A number in the answer that is not finite (NaN, infinity) or out of range. */
        NOT_FINITE,
        /** The program speaks another protocol version. */
        VERSION;

        /** The kind's name in result files: "not-finite". */
        public String fileName() {
            return name().toLowerCase(Locale.ROOT).replace('_', '-');
        }
    }

    private final Kind kind;
    private final String stderrTail;

    /**
     * A failure.
     *
     * @param kind what went wrong
     * @param message plain words, naming the message and field where one is at fault
     * @param stderrTail the program's last lines of standard error (bounded), possibly empty
     */
    public LocalizerFailure(Kind kind, String message, String stderrTail) {
        super(message);
        this.kind = kind;
        this.stderrTail = stderrTail == null ? "" : stderrTail;
    }

    /** What went wrong. */
    public Kind kind() {
        return kind;
    }

    /** The program's last lines of standard error, possibly empty. */
    public String stderrTail() {
        return stderrTail;
    }

    /** One text for results and reports: kind, message and the error stream's tail. */
    public String describe() {
        String head = kind.fileName() + ": " + getMessage();
        return stderrTail.isEmpty() ? head : head + "\nlast lines of its error output:\n" + stderrTail;
    }
}
