package dev.driftlab.evaluation;

import java.util.ArrayList;
import java.util.List;

/**
 * One gate's verdict in one cell of a suite (a scenario as it is, or under a profile) with each
 * trial's mark, so that two runs of the cell can be paired seed by seed.
 *
 * @param scenario the scenario's name in the suite
 * @param column "as is" or the profile's name
 * @param gate the gate's id
 * @param pass whether the gate held
 * @param passed exercised trials within the bound
 * @param exercised trials that exercised the gate
 * @param marks one per trial, in seed order
 */
public record GateTally(
        String scenario, String column, String gate, boolean pass, int passed, int exercised, List<Mark> marks) {

    /**
     * One trial's part in a gate.
     *
     * @param seed the trial's seed
     * @param exercised whether the trial exercised the gate
     * @param passed whether it passed (false when not exercised)
     */
    public record Mark(long seed, boolean exercised, boolean passed) {}

    /** Copies the list and checks the counts agree with the marks. */
    public GateTally {
        marks = List.copyOf(marks);
        long e = marks.stream().filter(Mark::exercised).count();
        long p = marks.stream().filter(Mark::passed).count();
        if (e != exercised || p != passed || marks.stream().anyMatch(m -> m.passed() && !m.exercised())) {
            throw new IllegalArgumentException("gate " + gate + ": the counts " + passed + " of " + exercised
                    + " do not agree with the trials' marks");
        }
    }

    /**
     * The tally of a verdict over the trials it was judged on (the trials of one column).
     *
     * @param scenario the scenario's name
     * @param column the column's name
     * @param verdict the gate's verdict for the column
     * @param trials the column's trials
     */
    public static GateTally of(String scenario, String column, GateVerdict verdict, List<TrialOutcome> trials) {
        List<Mark> marks = new ArrayList<>(trials.size());
        for (TrialOutcome t : trials) {
            boolean ex = Gates.exercised(verdict.gate(), t);
            marks.add(new Mark(t.seed(), ex, ex && Gates.passes(verdict.gate(), t)));
        }
        marks.sort(java.util.Comparator.comparingLong(Mark::seed));
        return new GateTally(
                scenario, column, verdict.gate().id(), verdict.pass(), verdict.passed(), verdict.exercised(), marks);
    }

    /** Observed passing share among exercised trials; NaN when none exercised the gate. */
    public double share() {
        return exercised == 0 ? Double.NaN : (double) passed / exercised;
    }

    /** "2 of 3": passing of exercised trials. */
    public String counts() {
        return passed + " of " + exercised;
    }
}
