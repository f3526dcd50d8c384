package dev.driftlab.evaluation;

import java.util.ArrayList;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * Finds the gates whose verdict changed: between a baseline run of a suite and this one (matched by
 * scenario, column and gate), or between each scenario as it is and under each profile (matched by
 * scenario and gate). Only verdicts that flipped are changes; a share that moved without flipping
 * is not. Regressions come first, then improvements, each in the order of the later run.
 */
public final class GateChanges {

    private GateChanges() {}

    /**
     * Changes from a baseline run to this run.
     *
     * @param before the baseline's tallies
     * @param after this run's tallies
     */
    public static List<GateChange> between(List<GateTally> before, List<GateTally> after) {
        Map<String, GateTally> earlier = new HashMap<>();
        for (GateTally t : before) {
            earlier.put(key(t.scenario(), t.column(), t.gate()), t);
        }
        List<GateChange> out = new ArrayList<>();
        for (GateTally now : after) {
            GateTally then = earlier.get(key(now.scenario(), now.column(), now.gate()));
            if (then != null && then.pass() != now.pass()) {
                out.add(change(then, now));
            }
        }
        return ordered(out);
    }

    /**
     * Changes from each scenario as it is to the same scenario under each profile.
     *
     * @param tallies this run's tallies
     * @param asIs the name of the column of scenarios as they are
     */
    public static List<GateChange> underProfiles(List<GateTally> tallies, String asIs) {
        Map<String, GateTally> base = new LinkedHashMap<>();
        for (GateTally t : tallies) {
            if (t.column().equals(asIs)) {
                base.put(key(t.scenario(), "", t.gate()), t);
            }
        }
        List<GateChange> out = new ArrayList<>();
        for (GateTally t : tallies) {
            GateTally b = t.column().equals(asIs) ? null : base.get(key(t.scenario(), "", t.gate()));
            if (b != null && b.pass() != t.pass()) {
                out.add(change(b, t));
            }
        }
        return ordered(out);
    }

    /**
     * The paired difference of two tallies of the same gate: per seed that exercised the gate in
     * both, after's pass (1 or 0) minus before's; its mean and normal-approximation 95 % interval.
     */
    public static GateChange change(GateTally before, GateTally after) {
        Map<Long, GateTally.Mark> bySeed = new HashMap<>();
        for (GateTally.Mark m : before.marks()) {
            bySeed.put(m.seed(), m);
        }
        List<Double> diffs = new ArrayList<>();
        for (GateTally.Mark m : after.marks()) {
            GateTally.Mark b = bySeed.get(m.seed());
            if (b != null && b.exercised() && m.exercised()) {
                diffs.add((m.passed() ? 1.0 : 0.0) - (b.passed() ? 1.0 : 0.0));
            }
        }
        double[] d = diffs.stream().mapToDouble(Double::doubleValue).toArray();
        if (d.length == 0) {
            return new GateChange(before, after, 0, Double.NaN, Double.NaN, Double.NaN);
        }
        double[] ci = BatchSummary.meanInterval(d);
        return new GateChange(before, after, d.length, ci[0], ci[1], ci[2]);
    }

    private static List<GateChange> ordered(List<GateChange> changes) {
        List<GateChange> out =
                new ArrayList<>(changes.stream().filter(GateChange::regression).toList());
        out.addAll(changes.stream().filter(GateChange::improvement).toList());
        return out;
    }

    private static String key(String scenario, String column, String gate) {
        return scenario + '\u0000' + column + '\u0000' + gate;
    }
}
