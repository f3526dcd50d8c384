package dev.driftlab.evaluation;

import dev.driftlab.sim.FaultFiring;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;

/**
 * How often one scheduled fault fired over the trials of a variant, and why it did not when it
 * did not.
 *
 * @param id the fault's id
 * @param fired trials in which it fired
 * @param trials trials of the variant
 * @param reasons distinct reasons it did not fire (at most three, the first seen)
 */
public record FaultTally(String id, int fired, int trials, List<String> reasons) {

    /** Most distinct reasons kept per fault. */
    static final int MAX_REASONS = 3;

    /** Copies the list. */
    public FaultTally {
        reasons = List.copyOf(reasons);
    }

    /** Whether the fault failed to fire in some trial: a report warns about it. */
    public boolean missed() {
        return fired < trials;
    }

    /** "fired in 3 of 20 trials". */
    public String sentence() {
        return "fired in " + fired + " of " + trials + " trials";
    }

    /** One tally per fault, in scenario order, over the given trials. */
    public static List<FaultTally> of(List<TrialOutcome> trials) {
        Map<String, int[]> counts = new LinkedHashMap<>();
        Map<String, Set<String>> why = new LinkedHashMap<>();
        for (TrialOutcome t : trials) {
            for (FaultFiring f : t.faults()) {
                counts.computeIfAbsent(f.id(), k -> new int[1]);
                Set<String> reasons = why.computeIfAbsent(f.id(), k -> new LinkedHashSet<>());
                if (f.fired()) {
                    counts.get(f.id())[0]++;
                } else if (reasons.size() < MAX_REASONS) {
                    reasons.add(generalise(f.reason()));
                }
            }
        }
        List<FaultTally> out = new ArrayList<>();
        for (var e : counts.entrySet()) {
            out.add(new FaultTally(e.getKey(), e.getValue()[0], trials.size(), new ArrayList<>(why.get(e.getKey()))));
        }
        return out;
    }

    /** Drops the per-trial end time so that trials that missed for one reason share it. */
    private static String generalise(String reason) {
        return reason.replaceAll(",? (at|early at) [0-9.]+ s$", "").replaceAll(" at [0-9.]+ s$", "");
    }
}
