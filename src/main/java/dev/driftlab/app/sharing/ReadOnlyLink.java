package dev.driftlab.app.sharing;

/** A view link used for a change. Answered 403. */
public class ReadOnlyLink extends RuntimeException {
    public ReadOnlyLink() {
        super("This is a view link: it can open, run and read reports, but not change the scenario or its links.");
    }

    /** A view link used for a change of something other than a scenario. */
    public ReadOnlyLink(String message) {
        super(message);
    }
}
