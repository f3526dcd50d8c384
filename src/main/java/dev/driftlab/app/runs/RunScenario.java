package dev.driftlab.app.runs;

import dev.driftlab.app.runs.persistence.RunRepository.RunRow;
import dev.driftlab.app.scenarios.ScenarioStore;
import dev.driftlab.scenario.Scenario;
import dev.driftlab.scenario.ScenarioFiles;

/** The scenario a run ran, read back from its stored revision. */
public final class RunScenario {

    private RunScenario() {}

    /** The scenario of the run's revision, or {@link RunNotFound} when it no longer reads. */
    public static Scenario of(ScenarioStore store, RunRow run) {
        String doc = store.documentOfRevision(run.revisionId()).orElseThrow(RunNotFound::new);
        return ScenarioFiles.check(doc).scenario().orElseThrow(RunNotFound::new);
    }
}
