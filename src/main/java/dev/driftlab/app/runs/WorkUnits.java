package dev.driftlab.app.runs;

import java.util.ArrayList;
import java.util.List;

/**
 * How a run is cut into work units: consecutive runs of its seed list, each about the same
 * estimated work, so that a unit takes seconds rather than minutes and a process that dies loses
 * little. The engine orders waiting units by their number within their run, so a small run
 * submitted behind a large batch starts with the batch's next unit, not after the whole batch.
 */
public final class WorkUnits {

    /** Most seeds in one unit, however cheap the trials. */
    public static final int MAX_SEEDS_PER_UNIT = 10;

    /** Task name of a unit in the work engine's table. */
    public static final String TASK = "driftlab-run-unit";

    /** SQL {@code LIKE} pattern of every unit's task name, whatever its localizer ({@link #taskName}). */
    public static final String ANY_TASK = TASK + "%";

    private WorkUnits() {}

    /**
     * The engine's task name of units of runs of a localizer: {@link #TASK} for the built-in one,
     * {@code TASK@name} for an outside one. A process registers only the tasks of the localizers it
     * offers, and the engine hands a process only tasks it knows.
     */
    public static String taskName(String localizer) {
        return localizer == null ? TASK : TASK + "@" + localizer;
    }

    /**
     * One unit.
     *
     * @param unitNo number within the run, from 0
     * @param firstIndex position of its first seed in the run's seed list
     * @param seedCount how many consecutive seeds it runs
     */
    public record Unit(int unitNo, int firstIndex, int seedCount) {}

    /**
     * Cuts a seed list.
     *
     * @param seeds how many seeds the run has
     * @param trialWork estimated work of one trial (particle-beam updates)
     * @param unitWork the work one unit should hold
     */
    public static List<Unit> cut(int seeds, double trialWork, double unitWork) {
        if (seeds < 1) {
            throw new IllegalArgumentException("a run needs at least one seed");
        }
        int per = perUnit(trialWork, unitWork);
        List<Unit> out = new ArrayList<>();
        for (int first = 0, no = 0; first < seeds; first += per, no++) {
            out.add(new Unit(no, first, Math.min(per, seeds - first)));
        }
        return out;
    }

    /** Seeds per unit: as many as fit the unit's work, from 1 to {@link #MAX_SEEDS_PER_UNIT}. */
    static int perUnit(double trialWork, double unitWork) {
        if (!(trialWork > 0) || !(unitWork > 0)) {
            return 1;
        }
        double n = Math.floor(unitWork / trialWork);
        return (int) Math.max(1, Math.min(MAX_SEEDS_PER_UNIT, n));
    }

    /** The engine's instance id of a unit: the run and the unit number. */
    public static String instanceId(long runId, int unitNo) {
        return "run-" + runId + "-" + unitNo;
    }

    /** Run id and unit number from {@link #instanceId}; refuses anything else. */
    public static long[] parse(String instanceId) {
        String[] parts = instanceId.split("-");
        if (parts.length != 3 || !parts[0].equals("run")) {
            throw new IllegalArgumentException("not a unit id: " + instanceId);
        }
        return new long[] {Long.parseLong(parts[1]), Integer.parseInt(parts[2])};
    }

    /**
     * The unit's place in the engine's order (higher goes first): unit 0 of every run before unit 1
     * of any, and so on, so that runs share the processes round robin; ties go by submission time.
     */
    public static int priority(int unitNo) {
        return Math.max(Short.MIN_VALUE, Short.MAX_VALUE - unitNo);
    }
}
