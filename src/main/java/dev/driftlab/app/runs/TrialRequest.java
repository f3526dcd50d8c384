package dev.driftlab.app.runs;

import java.util.List;

/**
 * What one run asks for.
 *
 * @param scenarioJson the scenario document of the exact revision run, as stored
 * @param variant settings variant name: {@code base} or a name from the scenario's variants
 * @param seeds one trial per seed, in this order
 * @param options how to run
 */
public record TrialRequest(String scenarioJson, String variant, List<Long> seeds, TrialOptions options) {
    /** Copies the seed list. */
    public TrialRequest {
        seeds = List.copyOf(seeds);
    }
}
