package dev.driftlab.app.runs;

import dev.driftlab.evaluation.Verdict;

/**
 * The results of one run.
 *
 * @param resultJson one JSON document (metrics, episodes, gate verdicts), stored as text and served
 *     unchanged by the API
 * @param verdict the run's verdict at a glance, stored beside the document so that run lists need
 *     not read it
 */
public record StoredResult(String resultJson, Verdict verdict) {
    /** Checks presence. */
    public StoredResult {
        if (resultJson == null || resultJson.isBlank()) {
            throw new IllegalArgumentException("resultJson must be a JSON document");
        }
        if (verdict == null) {
            throw new IllegalArgumentException("verdict must be given");
        }
    }
}
