package dev.driftlab.localizer.protocol;

import dev.driftlab.localizer.LocalizerFailure;

/** A message that breaks the protocol: what is wrong, naming the message and field. */
public final class ProtocolException extends RuntimeException {

    private static final long serialVersionUID = 1L;

    private final LocalizerFailure.Kind kind;

    /**
     * A broken message.
     *
     * @param kind {@code MALFORMED}, {@code NOT_FINITE} or {@code VERSION}
     * @param message plain words with the field's path ("estimate.pose.x is NaN")
     */
    public ProtocolException(LocalizerFailure.Kind kind, String message) {
        super(message);
        this.kind = kind;
    }

    /** What kind of failure this is. */
    public LocalizerFailure.Kind kind() {
        return kind;
    }
}
