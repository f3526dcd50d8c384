package dev.driftlab.report;

import dev.driftlab.evaluation.GateChange;
import dev.driftlab.evaluation.GateChanges;
import dev.driftlab.evaluation.GateTally;
import dev.driftlab.evaluation.Verdict;
import dev.driftlab.trial.SuitePlan;
import dev.driftlab.trial.SuiteResult;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;

/**
 * Everything a suite report shows, independent of how it is rendered (HTML page, JSON, JUnit XML):
 * the run, what changed against the previous run of the suite (the baseline) and against each
 * scenario as it is, and the share of passing gates over earlier runs.
 *
 * @param name the suite's name
 * @param description what the suite is for; may be empty
 * @param source where the suite came from (file or folder name)
 * @param result the run
 * @param baseline the previous run, when one was given
 * @param baselineChanges gates whose verdict flipped since the baseline, regressions first
 * @param profileChanges gates whose verdict differs under a profile from the scenario as it is,
 *     regressions first
 * @param history earlier runs' passing shares, oldest first (the baseline's chain and the
 *     baseline), without this run
 * @param generatedAt ISO-8601 time the report was made
 * @param localizer the localizer every cell judged: {@link Report#BUILT_IN} or an outside one's
 *     name (its command on the command line, its listed name on a server)
 */
public record SuiteReport(
        String name,
        String description,
        String source,
        SuiteResult result,
        Optional<Baseline> baseline,
        List<GateChange> baselineChanges,
        List<GateChange> profileChanges,
        List<TrendPoint> history,
        String generatedAt,
        String localizer) {

    /** Most earlier runs a result carries in its history. */
    public static final int MAX_HISTORY = 50;

    /**
     * One run's share of passing gates, for the trend.
     *
     * @param generatedAt when the run's report was made
     * @param passing gates that held
     * @param gates gates planned (those of cells a profile made invalid included)
     */
    public record TrendPoint(String generatedAt, int passing, int gates) {
        /** Passing share, NaN without gates. */
        public double share() {
            return gates == 0 ? Double.NaN : (double) passing / gates;
        }
    }

    /**
     * A previous run of the suite, read from its result document.
     *
     * @param suite the suite's name in that run
     * @param generatedAt when it ran
     * @param tallies each gate of each cell that ran, with its trials' marks
     * @param history its own earlier runs, oldest first
     * @param point its own passing share
     */
    public record Baseline(
            String suite, String generatedAt, List<GateTally> tallies, List<TrendPoint> history, TrendPoint point) {
        /** Copies the lists. */
        public Baseline {
            tallies = List.copyOf(tallies);
            history = List.copyOf(history);
        }
    }

    /** Copies the lists. */
    public SuiteReport {
        baselineChanges = List.copyOf(baselineChanges);
        profileChanges = List.copyOf(profileChanges);
        history = List.copyOf(history);
    }

    /**
     * The report of a run, compared with its baseline when there is one.
     *
     * @param name the suite's name
     * @param description what it is for
     * @param source where it came from
     * @param result the run
     * @param baseline the previous run, if any
     * @param generatedAt ISO-8601 time
     */
    public static SuiteReport of(
            String name,
            String description,
            String source,
            SuiteResult result,
            Optional<Baseline> baseline,
            String generatedAt) {
        List<GateTally> tallies = result.tallies();
        List<GateChange> since =
                baseline.map(b -> GateChanges.between(b.tallies(), tallies)).orElse(List.of());
        List<TrendPoint> history = new ArrayList<>();
        baseline.ifPresent(b -> {
            history.addAll(b.history());
            history.add(b.point());
        });
        while (history.size() > MAX_HISTORY) {
            history.remove(0);
        }
        return new SuiteReport(
                name,
                description,
                source,
                result,
                baseline,
                since,
                GateChanges.underProfiles(tallies, SuitePlan.AS_IS),
                history,
                generatedAt,
                Report.BUILT_IN);
    }

    /** The same report of cells that judged the named localizer. */
    public SuiteReport withLocalizer(String localizerName) {
        return new SuiteReport(
                name,
                description,
                source,
                result,
                baseline,
                baselineChanges,
                profileChanges,
                history,
                generatedAt,
                localizerName);
    }

    /** Whether the cells judged an outside localizer. */
    public boolean outsideLocalizer() {
        return !localizer.equals(Report.BUILT_IN);
    }

    /** This run's passing share. */
    public TrendPoint point() {
        return new TrendPoint(generatedAt, result.gatesPassing(), result.gatesPlanned());
    }

    /** The verdict at a glance. */
    public Verdict verdict() {
        return result.verdict();
    }

    /** Gates that held in the baseline and fail now. */
    public List<GateChange> regressions() {
        return baselineChanges.stream().filter(GateChange::regression).toList();
    }

    /**
     * Whether the suite passes: every gate of every cell holds and none regressed against the
     * baseline (a regression is a gate that fails now, so it is the verdict that decides).
     */
    public boolean passed() {
        return verdict() == Verdict.PASS && regressions().isEmpty();
    }
}
