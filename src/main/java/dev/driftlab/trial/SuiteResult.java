package dev.driftlab.trial;

import dev.driftlab.evaluation.BatchSummary;
import dev.driftlab.evaluation.GateTally;
import dev.driftlab.evaluation.GateVerdict;
import dev.driftlab.evaluation.TrialOutcome;
import dev.driftlab.evaluation.VariantSummary;
import dev.driftlab.evaluation.Verdict;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;

/**
 * The outcome of a suite run: per scenario, the trials of every column (each trial's variant is
 * its column's name) and their summary, in which the first variant is the scenario as it is, so
 * each profile's paired comparison is against the scenario as it is on the same seeds.
 *
 * @param plan what was planned
 * @param rows one per scenario, in plan order
 * @param planned trials planned
 * @param cancelled whether the run stopped before every trial ran
 * @param seconds wall-clock time taken
 */
public record SuiteResult(SuitePlan plan, List<Row> rows, int planned, boolean cancelled, double seconds) {

    /**
     * One scenario's trials and their summary.
     *
     * @param plan the planned row (its cells say which profiles made the scenario invalid)
     * @param trials finished trials of every column that ran, ordered by column then seed
     * @param summary per-column figures and gate verdicts (empty when no trial finished)
     * @param gates the gates the scenario is judged by (its own and the default route gate)
     */
    public record Row(
            SuitePlan.Row plan,
            List<TrialOutcome> trials,
            BatchSummary summary,
            List<dev.driftlab.scenario.Gate> gates) {
        /** Copies the lists. */
        public Row {
            trials = List.copyOf(trials);
            gates = List.copyOf(gates);
        }

        /** The scenario's name in the suite. */
        public String name() {
            return plan.entry().name();
        }

        /** The summary of one column, when it ran. */
        public Optional<VariantSummary> column(String name) {
            return summary.variants().stream()
                    .filter(v -> v.variant().equals(name))
                    .findFirst();
        }

        /** The trials of one column. */
        public List<TrialOutcome> trials(String column) {
            return trials.stream().filter(t -> t.variant().equals(column)).toList();
        }

        /** The planned cell of one column. */
        public SuitePlan.Cell cell(String column) {
            return plan.cells().stream()
                    .filter(c -> c.name().equals(column))
                    .findFirst()
                    .orElseThrow();
        }
    }

    /** Copies the list. */
    public SuiteResult {
        rows = List.copyOf(rows);
    }

    /** Trials that finished. */
    public int finished() {
        return rows.stream().mapToInt(r -> r.trials().size()).sum();
    }

    /** Every gate verdict of every cell that ran, scenario by scenario, column by column. */
    public List<GateVerdict> verdicts() {
        List<GateVerdict> out = new ArrayList<>();
        rows.forEach(r -> out.addAll(r.summary().verdicts()));
        return out;
    }

    /** The cells a profile made invalid, as (scenario, cell). */
    public List<SuitePlan.Cell> invalidCells() {
        return rows.stream()
                .flatMap(r -> r.plan().cells().stream())
                .filter(SuitePlan.Cell::invalid)
                .toList();
    }

    /**
     * Each gate of each cell that ran with its trials' marks, for comparing with a later run.
     */
    public List<GateTally> tallies() {
        List<GateTally> out = new ArrayList<>();
        for (Row r : rows) {
            for (VariantSummary v : r.summary().variants()) {
                List<TrialOutcome> ts = r.trials(v.variant());
                for (GateVerdict g : v.gates()) {
                    out.add(GateTally.of(r.name(), v.variant(), g, ts));
                }
            }
        }
        return out;
    }

    /** Gates planned: every gate of every cell, those of invalid cells included. */
    public int gatesPlanned() {
        int n = 0;
        for (Row r : rows) {
            n += r.gates().size() * r.plan().cells().size();
        }
        return n;
    }

    /** Gates that held. */
    public int gatesPassing() {
        return (int) verdicts().stream().filter(GateVerdict::pass).count();
    }

    /**
     * The verdict of the suite: the verdict of every gate of every cell that ran; a cell that a
     * profile made invalid had its gates tested by no trial, so a suite that would otherwise pass
     * reads {@link Verdict#NOT_EXERCISED}.
     */
    public Verdict verdict() {
        Verdict v = Verdict.of(verdicts(), !cancelled && finished() >= planned);
        return v == Verdict.PASS && !invalidCells().isEmpty() ? Verdict.NOT_EXERCISED : v;
    }
}
