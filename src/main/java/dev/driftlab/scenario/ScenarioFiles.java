package dev.driftlab.scenario;

import java.util.ArrayList;
import java.util.List;
import java.util.Optional;

/** Reads and validates in one step: what the command line, the web app and the tests call. */
public final class ScenarioFiles {

    private ScenarioFiles() {}

    /**
     * The outcome of checking one document.
     *
     * @param scenario the scenario, present when it could be read (it may still have errors)
     * @param report every problem found, format and meaning together
     */
    public record Checked(Optional<Scenario> scenario, ValidationReport report) {
        /** Whether the scenario is usable: read and free of errors. */
        public boolean ok() {
            return scenario.isPresent() && !report.hasErrors();
        }

        /** The scenario when usable, else a {@link ScenarioException} with every problem. */
        public Scenario orThrow() {
            if (!ok()) {
                throw new ScenarioException(report.problems());
            }
            return scenario.orElseThrow();
        }
    }

    /** Reads and validates a JSON document; never throws for bad input. */
    public static Checked check(String json) {
        Scenario scenario;
        try {
            scenario = ScenarioJson.read(json);
        } catch (ScenarioException e) {
            return new Checked(Optional.empty(), new ValidationReport(e.problems()));
        }
        List<Problem> all = new ArrayList<>(ScenarioValidator.validate(scenario).problems());
        return new Checked(Optional.of(scenario), new ValidationReport(all));
    }

    /** Reads and validates; returns the scenario or throws {@link ScenarioException} listing every error. */
    public static Scenario load(String json) {
        return check(json).orThrow();
    }
}
