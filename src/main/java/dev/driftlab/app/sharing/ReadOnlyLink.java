package dev.driftlab.app.sharing;

/** A view link used for a change. Answered 403. */
public class ReadOnlyLink extends RuntimeException {

    /** The answer to a scenario's view link used for a change. */
    public static final String SCENARIO =
            "This is a view link: it can open, run and read reports, but not change the scenario or its links.";

    /** The answer to a suite's view link used for a change. */
    public static final String SUITE =
            "This is a view link: it can open the suite, run it and read its reports, but not change it or its links.";

    public ReadOnlyLink() {
        this(SCENARIO);
    }

    /** A view link used for a change of something other than a scenario. */
    public ReadOnlyLink(String message) {
        super(message);
    }
}
