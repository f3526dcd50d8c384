package dev.driftlab.scenario;

import java.util.List;

/**
 * A scenario document that cannot be read or is refused by validation. Carries every problem found,
 * each with its path, so callers can show them all at once.
 */
public final class ScenarioException extends RuntimeException {

    private static final long serialVersionUID = 1L;

    private final transient List<Problem> problems;

    /** Creates the exception from the problems found; at least one should be an error. */
    public ScenarioException(List<Problem> problems) {
        super(summary(problems));
        this.problems = List.copyOf(problems);
    }

    /** All problems, errors and warnings. */
    public List<Problem> problems() {
        return problems;
    }

    private static String summary(List<Problem> problems) {
        return problems.stream()
                .filter(Problem::isError)
                .findFirst()
                .map(p -> p.path() + ": " + p.message()
                        + (problems.size() > 1 ? " (and " + (problems.size() - 1) + " more)" : ""))
                .orElse("scenario refused");
    }
}
