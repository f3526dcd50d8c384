package dev.driftlab.scenario;

import java.util.List;

/**
 * Every problem found in a scenario, errors and warnings together, in the order found.
 *
 * @param problems all findings
 */
public record ValidationReport(List<Problem> problems) {
    /** Copies the list. */
    public ValidationReport {
        problems = List.copyOf(problems);
    }

    /** The errors only. */
    public List<Problem> errors() {
        return problems.stream().filter(Problem::isError).toList();
    }

    /** The warnings only. */
    public List<Problem> warnings() {
        return problems.stream().filter(p -> !p.isError()).toList();
    }

    /** Whether the scenario must be refused. */
    public boolean hasErrors() {
        return problems.stream().anyMatch(Problem::isError);
    }

    /** Whether nothing at all was found. */
    public boolean isClean() {
        return problems.isEmpty();
    }
}
