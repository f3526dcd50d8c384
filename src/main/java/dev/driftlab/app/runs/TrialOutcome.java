package dev.driftlab.app.runs;

/**
 * The results of one run.
 *
 * @param resultJson one JSON document (metrics, episodes, gate verdicts), stored as text and served
 *     unchanged by the API
 */
public record TrialOutcome(String resultJson) {
    /** Checks presence. */
    public TrialOutcome {
        if (resultJson == null || resultJson.isBlank()) {
            throw new IllegalArgumentException("resultJson must be a JSON document");
        }
    }
}
