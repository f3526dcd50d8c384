package dev.driftlab.report;

import dev.driftlab.evaluation.AnswerTimes;
import dev.driftlab.evaluation.EpisodeRules;
import dev.driftlab.evaluation.FaultTally;
import dev.driftlab.evaluation.GateVerdict;
import dev.driftlab.evaluation.Gates;
import dev.driftlab.evaluation.Interval;
import dev.driftlab.evaluation.KidnapOutcome;
import dev.driftlab.evaluation.PairedComparison;
import dev.driftlab.evaluation.Spread;
import dev.driftlab.evaluation.Stats;
import dev.driftlab.evaluation.TrialOutcome;
import dev.driftlab.evaluation.VariantSummary;
import dev.driftlab.evaluation.Verdict;
import dev.driftlab.scenario.Gate;
import dev.driftlab.scenario.GateRule;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

/**
 * A report as the page shows it: every figure computed and every number formatted here, so the
 * template ({@code report-templates/report.html}) only lays text out. Markup that is drawn, not
 * written (plots, plans, frames), comes as finished SVG.
 */
public final class ReportView {

    /** Episode rows listed before the table is cut short, so a large batch stays readable. */
    static final int MAX_EPISODE_ROWS = 500;

    /**
     * Trial rows listed before the table is cut short: a batch of 10,000 seeds and 21 variants is
     * 210,000 rows, far more markup than a page or a PDF should be made of; the result document has
     * them all (a size bound on the page: common practice, no source).
     */
    static final int MAX_TRIAL_ROWS = 1_000;

    /** A term and its definition, or a fact and its value. */
    public record Entry(String name, String text) {}

    /** The verdict at the top: symbol (hidden from screen readers, the word says it), word, reason. */
    public record Badge(boolean pass, String symbol, String word, String text) {}

    public record FaultRow(String id, boolean missed, String sentence, String reasons) {}

    public record GateRow(
            boolean pass,
            String id,
            boolean byDefault,
            String variant,
            String criterion,
            String counts,
            String interval,
            String verdict,
            boolean uncertain,
            String reason) {}

    public record VariantRow(
            String variant,
            int trials,
            String recovery,
            String recoveryTimes,
            String converged,
            String convergence,
            String rmse,
            String finalError,
            String longestLost) {}

    public record EpisodeRow(String variant, long seed, String at, String noticed, String recovered) {}

    public record ComparisonRow(
            String variant,
            int pairs,
            String recovered,
            String shareDifference,
            String rmseDifference,
            String timeDifference) {}

    /** One sweep count against the KLD bound; {@code below} is shown in words and emphasis, not colour. */
    public record KldRow(String particles, boolean below, String bound) {}

    public record TrialRow(
            String variant,
            long seed,
            String rmse,
            String finalError,
            String convergedAt,
            String longestLost,
            String rpe,
            String kidnaps,
            int contacts,
            boolean early,
            String ended,
            String faultsNotFired,
            String answerTime) {}

    private final Report r;
    private final ReportDrawings drawn;

    /**
     * @param budget the drawing budget of the document; each drawing's size is checked against it
     *     before the drawing is made, in page order (the template asks for each drawing once)
     */
    ReportView(Report r, DrawingBudget budget) {
        this.r = r;
        this.drawn = new ReportDrawings(r, budget.spending());
    }

    public String title() {
        return "Localization report: " + r.scenario().name();
    }

    public String caution() {
        return Report.CAUTION;
    }

    public Badge badge() {
        Verdict v = r.verdict();
        String text = switch (v) {
            case PASS -> r.verdicts().isEmpty() ? "every trial ran; the scenario has no gates" : "every gate holds";
            case FAIL -> "a gate fails on trials that exercised it";
            case ENDED_EARLY -> "trials ended before their route did";
            case NOT_EXERCISED -> "a gate was exercised by no trial";
            case INCOMPLETE -> r.cancelled() ? "not every trial ran (stopped early)" : "not every trial has run";
        };
        return new Badge(v == Verdict.PASS, v.symbol(), v.word(), text);
    }

    public List<Entry> facts() {
        List<Entry> out = new ArrayList<>();
        out.add(new Entry("Kind", r.kind().name().toLowerCase(Locale.ROOT)));
        out.add(new Entry("Scenario source", r.source()));
        out.add(new Entry("Seeds", seedText()));
        out.add(new Entry("Trials", r.trials().size() + " of " + r.planned() + (r.cancelled() ? " (cancelled)" : "")));
        out.add(new Entry(
                "Variants",
                String.join(
                        ", ",
                        r.summary().variants().stream()
                                .map(VariantSummary::variant)
                                .toList())));
        out.add(new Entry("Localizer", r.outsideLocalizer() ? "outside: " + r.localizer() : "built-in"));
        out.add(new Entry("Answer time per scan", answerTimes()));
        out.add(new Entry("Generated", r.generatedAt()));
        out.add(new Entry("Time taken", String.format(Locale.ROOT, "%.1f s", r.seconds())));
        r.kldRequired()
                .ifPresent(k -> out.add(
                        new Entry("KLD bound for the start belief", String.format(Locale.ROOT, "%,d particles", k))));
        return out;
    }

    /** The localizer's answer times against the scan period, in words. */
    String answerTimes() {
        AnswerTimes a =
                AnswerTimes.of(r.trials(), 1 / r.scenario().rangefinder().rate());
        if (!a.measured()) {
            return "not measured";
        }
        return String.format(
                Locale.ROOT,
                "median %s ms (median trial), 99th percentile up to %s ms (slowest trial), against a scan period of"
                        + " %s ms; %d of %d timed trials over the period",
                ms(a.p50()),
                ms(a.worstP99()),
                ms(a.scanPeriod()),
                a.overPeriod(),
                a.timed());
    }

    private static String ms(double seconds) {
        double m = seconds * 1000;
        return m >= 100 ? String.format(Locale.ROOT, "%.0f", m) : String.format(Locale.ROOT, "%.2f", m);
    }

    private String seedText() {
        long[] s = r.seeds();
        if (s.length == 0) {
            return "none";
        }
        return s.length == 1 ? Long.toString(s[0]) : s[0] + " to " + s[s.length - 1] + " (" + s.length + ")";
    }

    public List<String> findings() {
        return Findings.headline(r);
    }

    public List<FaultRow> faults() {
        List<FaultRow> out = new ArrayList<>();
        for (FaultTally f : Findings.faults(r)) {
            out.add(new FaultRow(f.id(), f.missed(), f.sentence(), String.join("; ", f.reasons())));
        }
        return out;
    }

    public List<GateRow> gates() {
        List<GateRow> out = new ArrayList<>();
        for (GateVerdict v : r.verdicts()) {
            String criterion =
                    Gates.describe(v.gate()) + " in at least " + pct(v.gate().share())
                            + " of exercised trials"
                            + (v.gate().rule() == GateRule.INTERVAL_LOWER_END
                                    ? ", judged by the interval's lower end"
                                    : ", judged by the observed share");
            out.add(new GateRow(
                    v.pass(),
                    v.gate().id(),
                    v.byDefault(),
                    v.variant(),
                    criterion,
                    v.passed() + " / " + v.exercised() + " / " + v.trials()
                            + (v.notExercised() ? "" : " (" + pct(v.share()) + ")"),
                    v.notExercised() ? "n/a" : interval(v.interval()),
                    v.pass() ? "\u2713 pass" : v.notExercised() ? "\u2205 not exercised" : "\u2717 fail",
                    v.uncertain(),
                    v.reason()));
        }
        return out;
    }

    public List<VariantRow> variants() {
        List<VariantRow> out = new ArrayList<>();
        for (VariantSummary v : r.summary().variants()) {
            String recovery = v.kidnapTrials() == 0
                    ? "no kidnap"
                    : v.recovered() + " / " + v.kidnapTrials() + " within " + num(v.recoveryDeadline()) + " s ("
                            + pct(v.recoveryShare()) + ", " + interval(v.recoveryRate()) + ")";
            out.add(new VariantRow(
                    v.variant(),
                    v.trials(),
                    recovery,
                    spread(v.recoveryTimes(), "s"),
                    v.converged() + " / " + v.trials(),
                    twoOf(v.convergenceTimes(), "s"),
                    spread(v.rmse(), "m"),
                    twoOf(v.finalError(), "m"),
                    num(v.longestLost().p50()) + " / " + num(v.longestLost().max()) + " s"));
        }
        return out;
    }

    /** Whether any variant had a kidnap, so the recovery section is shown. */
    public boolean hasKidnaps() {
        return r.summary().variants().stream().anyMatch(v -> v.kidnapTrials() > 0);
    }

    /** The recovery plots: success with its interval, and the distribution of recovery times. */
    public List<String> recoveryCharts() {
        return drawn.recoveryCharts();
    }

    /** Whether rows name their variant and seed (a batch or sweep; a single run has one of each). */
    public boolean many() {
        return r.kind() != Report.Kind.RUN;
    }

    /** The kidnap episodes, at most {@link #MAX_EPISODE_ROWS}. */
    public List<EpisodeRow> episodes() {
        List<EpisodeRow> out = new ArrayList<>();
        for (TrialOutcome t : r.trials()) {
            for (KidnapOutcome k : t.kidnaps()) {
                if (out.size() == MAX_EPISODE_ROWS) {
                    return out;
                }
                out.add(new EpisodeRow(
                        t.variant(),
                        t.seed(),
                        num(k.at()) + " s",
                        k.noticed() ? num(k.noticedAfter()) + " s" : "not noticed",
                        k.recovered() ? num(k.recoveredAfter()) + " s" : "not recovered"));
            }
        }
        return out;
    }

    /** Whether episodes were left out of the table. */
    public boolean episodesCut() {
        return r.trials().stream().mapToLong(t -> t.kidnaps().size()).sum() > MAX_EPISODE_ROWS;
    }

    public int maxEpisodeRows() {
        return MAX_EPISODE_ROWS;
    }

    public List<ComparisonRow> comparisons() {
        List<ComparisonRow> out = new ArrayList<>();
        for (PairedComparison c : r.summary().comparisons()) {
            out.add(new ComparisonRow(
                    c.variant(),
                    c.pairs(),
                    c.bothRecovered() + " / " + c.onlyBaseRecovered() + " / " + c.onlyVariantRecovered() + " / "
                            + c.neitherRecovered(),
                    signedPct(c.recoveryShareDifference()) + " [" + signedPct(c.recoveryShareLow()) + ", "
                            + signedPct(c.recoveryShareHigh()) + "]",
                    signed(c.rmseDifference()) + " m [" + signed(c.rmseLow()) + ", " + signed(c.rmseHigh()) + "]",
                    Double.isNaN(c.medianRecoveryTimeDifference())
                            ? "n/a"
                            : signed(c.medianRecoveryTimeDifference()) + " s"));
        }
        return out;
    }

    public boolean sweep() {
        return r.kind() == Report.Kind.SWEEP;
    }

    /**
     * Per sweep count, the share of its trials passing every gate they exercise (the default gate
     * included), with its 95 % Wilson interval; without kidnaps or gates of the scenario's own, the
     * share converged instead.
     */
    public SweepShares sweepShares() {
        List<VariantSummary> vs = r.summary().variants();
        List<Gate> gates = Gates.effective(r.scenario());
        List<String> labels = new ArrayList<>();
        double[] share = new double[vs.size()];
        double[] lo = new double[vs.size()];
        double[] hi = new double[vs.size()];
        for (int i = 0; i < vs.size(); i++) {
            VariantSummary v = vs.get(i);
            labels.add(v.variant());
            int ok = 0;
            for (TrialOutcome t : r.trials()) {
                if (t.variant().equals(v.variant())
                        && gates.stream().allMatch(g -> !Gates.exercised(g, t) || Gates.passes(g, t))) {
                    ok++;
                }
            }
            Interval ci = Stats.wilson(ok, Math.max(1, v.trials()), 0.95);
            share[i] = v.trials() == 0 ? 0 : (double) ok / v.trials();
            lo[i] = ci.lower();
            hi[i] = ci.upper();
            if (v.kidnapTrials() == 0 && r.scenario().gates().isEmpty()) {
                share[i] = v.converged() / (double) Math.max(1, v.trials());
            }
        }
        return new SweepShares(labels, share, lo, hi);
    }

    /** Passing shares of a sweep, one per count, with the interval's ends. */
    public record SweepShares(List<String> labels, double[] share, double[] lower, double[] upper) {}

    public String sweepChart() {
        return drawn.sweepChart(sweepShares());
    }

    public List<KldRow> kld() {
        if (r.kldRequired().isEmpty()) {
            return List.of();
        }
        int k = r.kldRequired().getAsInt();
        List<KldRow> out = new ArrayList<>();
        for (int c : r.sweepCounts()) {
            out.add(new KldRow(String.format(Locale.ROOT, "%,d", c), c < k, String.format(Locale.ROOT, "%,d", k)));
        }
        return out;
    }

    /** The plots of a single run over time; empty without a trace. */
    public List<String> runCharts() {
        return drawn.runCharts();
    }

    /** Each key frame over the plan, or the note where one is over the budget (never drawn then). */
    public List<String> keyFrames() {
        return drawn.keyFrames();
    }

    /** The site plan, or the note where it stood when it is over the budget (never drawn then). */
    public String sitePlan() {
        return drawn.sitePlan();
    }

    /** Trials of the report, all of them (the table lists at most {@link #MAX_TRIAL_ROWS}). */
    public int trialCount() {
        return r.trials().size();
    }

    /** Whether trials were left out of the table. */
    public boolean trialsCut() {
        return r.trials().size() > MAX_TRIAL_ROWS;
    }

    public int maxTrialRows() {
        return MAX_TRIAL_ROWS;
    }

    /** The first {@link #MAX_TRIAL_ROWS} trials as rows; rows past them are never made. */
    public List<TrialRow> trials() {
        List<TrialOutcome> listed = r.trials().subList(0, Math.min(r.trials().size(), MAX_TRIAL_ROWS));
        List<TrialRow> out = new ArrayList<>(listed.size());
        for (TrialOutcome t : listed) {
            List<String> ks = new ArrayList<>();
            for (KidnapOutcome k : t.kidnaps()) {
                ks.add(num(k.at()) + " s (" + (k.recovered() ? num(k.recoveredAfter()) + " s" : "not recovered") + ")");
            }
            out.add(new TrialRow(
                    t.variant(),
                    t.seed(),
                    num(t.rmse()) + " m",
                    num(t.finalPositionError()) + " m",
                    t.converged() ? num(t.convergenceTime()) + " s" : "never",
                    num(t.longestLost()) + " s",
                    num(t.rpe1()) + " / " + num(t.rpe5()) + " m",
                    ks.isEmpty() ? "none" : String.join(", ", ks),
                    t.collisions(),
                    t.end().early(),
                    t.localizerTrouble().isEmpty()
                            ? t.end().describe()
                            : t.end().describe() + ". " + t.localizerTrouble(),
                    String.join(
                            "; ",
                            t.faults().stream()
                                    .filter(f -> !f.fired())
                                    .map(f -> f.id() + ": " + f.reason())
                                    .toList()),
                    t.answerTimed() ? ms(t.answerP50()) + " / " + ms(t.answerP99()) + " ms" : "not measured"));
        }
        return out;
    }

    public List<Entry> glossary() {
        EpisodeRules e = EpisodeRules.defaults();
        return List.of(
                new Entry(
                        "Converged",
                        String.format(
                                Locale.ROOT,
                                "the estimate came within %s m and %.0f degrees of the truth and stayed there for %s s.",
                                num(e.convergePosition()),
                                Math.toDegrees(e.convergeHeading()),
                                num(e.convergeHold()))),
                new Entry(
                        "Lost",
                        String.format(
                                Locale.ROOT,
                                "after converging, the position error stayed over %s m (or the heading error over %.0f"
                                        + " degrees) for %s s; the episode lasts until the estimate converges again.",
                                num(e.lostPosition()),
                                Math.toDegrees(e.lostHeading()),
                                num(e.lostHold()))),
                new Entry(
                        "Noticed",
                        String.format(
                                Locale.ROOT,
                                "after a kidnap, the mean likelihood fell under %.0f %% of its level in the %s s before"
                                        + " it, or the filter injected particles.",
                                e.noticeRatio() * 100,
                                num(e.noticeWindow()))),
                new Entry(
                        "Recovered",
                        "after a kidnap, the estimate converged again (same thresholds as converged); the recovery"
                                + " time counts from the kidnap."),
                new Entry(
                        "Exercised",
                        "a trial exercises a gate when the gate's event had its chance in it: a kidnap fired (recovery"
                                + " time); the route was driven to its end (final error, longest lost, RMS error, relative"
                                + " pose error); the filter converged or the trial lasted the gate's bound (convergence"
                                + " time); every trial (route completed, no contact). Shares and intervals count exercised"
                                + " trials only; a gate no trial exercised fails."),
                new Entry(
                        "Ended early",
                        "the trial stopped before its route did: the footprint touched an obstacle (contact), or the"
                                + " route was not done within three times its planned duration plus a minute (time limit)."
                                + " Unless the route allows contact or the scenario has its own route-completed gate, the"
                                + " default gate \"route-completed (default)\" fails every trial that ended early."),
                new Entry(
                        "Relative pose error",
                        "over every pair of frames 1 s (or 5 s) apart, the difference between the true and the"
                                + " estimated motion, as a root mean square of its translation (Sturm et al., IROS 2012);"
                                + " pairs that span a kidnap or a shove are left out."),
                new Entry(
                        "95 % interval",
                        "the Wilson score interval of the passing share (Wilson 1927). A gate judged by the"
                                + " interval's lower end passes only when that end reaches the required share."));
    }

    private static String spread(Spread s, String unit) {
        return s.count() == 0 ? "n/a" : num(s.p50()) + " / " + num(s.p90()) + " / " + num(s.max()) + " " + unit;
    }

    private static String twoOf(Spread s, String unit) {
        return s.count() == 0 ? "n/a" : num(s.p50()) + " / " + num(s.p90()) + " " + unit;
    }

    private static String interval(Interval i) {
        return pct(i.lower()) + " to " + pct(i.upper());
    }

    static String pct(double share) {
        return Double.isNaN(share) ? "n/a" : String.format(Locale.ROOT, "%.1f %%", share * 100);
    }

    private static String signedPct(double share) {
        return Double.isNaN(share) ? "n/a" : String.format(Locale.ROOT, "%+.1f %%", share * 100);
    }

    private static String signed(double v) {
        return Double.isNaN(v) ? "n/a" : String.format(Locale.ROOT, "%+.3f", v);
    }

    static String num(double v) {
        if (Double.isNaN(v)) {
            return "n/a";
        }
        return String.format(Locale.ROOT, Math.abs(v) >= 100 ? "%.0f" : "%.2f", v);
    }
}
