package dev.driftlab.app.runs;

import dev.driftlab.app.runs.persistence.RunRepository.RunRow;
import dev.driftlab.app.scenarios.ScenarioStore;
import dev.driftlab.scenario.Profile;
import dev.driftlab.scenario.Scenario;
import dev.driftlab.scenario.ScenarioFiles;
import dev.driftlab.scenario.ScenarioJson;
import java.util.Optional;

/** The scenario a run ran, read back from its stored revision (and a suite cell's profile). */
public final class RunScenario {

    private RunScenario() {}

    /** The scenario of the run's revision, or {@link RunNotFound} when it no longer reads. */
    public static Scenario of(ScenarioStore store, RunRow run) {
        String doc = document(store, run).orElseThrow(RunNotFound::new);
        return ScenarioFiles.check(doc).scenario().orElseThrow(RunNotFound::new);
    }

    /**
     * The document the run's trials run: the revision's document, or for a suite cell the revision
     * with the cell's profile merged in ({@link Profile#apply}), written back by the core's writer.
     * Empty when the revision is gone or the profile no longer makes a valid scenario of it.
     */
    public static Optional<String> document(ScenarioStore store, RunRow run) {
        Optional<String> doc = store.documentOfRevision(run.revisionId());
        if (doc.isEmpty() || run.profile().isEmpty()) {
            return doc;
        }
        Optional<Scenario> asIs = ScenarioFiles.check(doc.get()).scenario();
        if (asIs.isEmpty()) {
            return Optional.empty();
        }
        return Profile.read(run.profile().get()).apply(asIs.get()).scenario().map(ScenarioJson::write);
    }
}
