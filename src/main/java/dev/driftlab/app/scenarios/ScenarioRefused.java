package dev.driftlab.app.scenarios;

import dev.driftlab.scenario.Problem;
import java.util.List;

/** A document that cannot be stored: unreadable or with errors. Nothing was stored. */
public class ScenarioRefused extends RuntimeException {

    private final List<Problem> problems;

    public ScenarioRefused(List<Problem> problems) {
        super(summary(problems));
        this.problems = List.copyOf(problems);
    }

    /** Every problem found, errors and warnings. */
    public List<Problem> problems() {
        return problems;
    }

    private static String summary(List<Problem> problems) {
        long errors = problems.stream().filter(Problem::isError).count();
        return "The scenario was refused and nothing was stored: " + errors + " error(s)"
                + problems.stream()
                        .filter(Problem::isError)
                        .findFirst()
                        .map(p -> ", first " + p)
                        .orElse("");
    }
}
