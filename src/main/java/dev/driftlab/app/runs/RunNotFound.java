package dev.driftlab.app.runs;

/** A run that does not exist or is not reachable through the link used. Answered 404. */
public class RunNotFound extends RuntimeException {
    public RunNotFound() {
        super("This run was not found.");
    }
}
