package dev.driftlab.app.suites;

import dev.driftlab.scenario.Problem;
import java.util.List;

/** A suite that cannot be stored or run, with every problem at its path. Nothing was stored. */
public class SuiteRefused extends RuntimeException {

    private final List<Problem> problems;

    public SuiteRefused(List<Problem> problems) {
        super(summary(problems));
        this.problems = List.copyOf(problems);
    }

    /** One problem. */
    public static SuiteRefused of(String path, String message) {
        return new SuiteRefused(List.of(Problem.error(path, message)));
    }

    /** Every problem found. */
    public List<Problem> problems() {
        return problems;
    }

    private static String summary(List<Problem> problems) {
        return "The suite was refused and nothing was stored: " + problems.size() + " problem(s)"
                + problems.stream().findFirst().map(p -> ", first " + p).orElse("");
    }
}
