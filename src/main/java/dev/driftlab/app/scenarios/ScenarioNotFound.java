package dev.driftlab.app.scenarios;

/** A scenario or revision that does not exist (or is not reachable through the link used). Answered 404. */
public class ScenarioNotFound extends RuntimeException {
    public ScenarioNotFound(String what) {
        super(what + " was not found.");
    }
}
