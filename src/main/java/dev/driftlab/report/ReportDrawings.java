package dev.driftlab.report;

import dev.driftlab.evaluation.KidnapOutcome;
import dev.driftlab.evaluation.RunTrace;
import dev.driftlab.evaluation.TrialOutcome;
import dev.driftlab.evaluation.VariantSummary;
import dev.driftlab.scenario.Gate;
import dev.driftlab.scenario.GateMetric;
import java.util.ArrayList;
import java.util.List;

/**
 * The drawings of a report page: the plots (recovery, sweep, a run over time), the site plan and
 * the key frames, each finished SVG and each checked against the document's drawing budget before
 * it is made, in the order the page asks for them. {@link ReportView} hands them to the template;
 * the tables and facts stay there.
 */
final class ReportDrawings {

    private final Report r;
    private final DrawingBudget.Spending drawings;
    private SitePlanSvg.Plan plan;
    private String planSvg;

    ReportDrawings(Report r, DrawingBudget.Spending drawings) {
        this.r = r;
        this.drawings = drawings;
    }

    /** The scenario's plan, its walls worked out once for the plan and every key frame. */
    private SitePlanSvg.Plan plan() {
        if (plan == null) {
            plan = SitePlanSvg.plan(r.scenario());
        }
        return plan;
    }

    /** The plan's drawing, made at most once and only for a drawing that fits the budget. */
    private String planSvg() {
        if (planSvg == null) {
            planSvg = plan().svg();
        }
        return planSvg;
    }

    /** The recovery plots: success with its interval, and the distribution of recovery times. */
    List<String> recoveryCharts() {
        List<VariantSummary> vs = r.summary().variants();
        List<String> labels = new ArrayList<>();
        double[] share = new double[vs.size()];
        double[] lo = new double[vs.size()];
        double[] hi = new double[vs.size()];
        List<double[]> times = new ArrayList<>();
        for (int i = 0; i < vs.size(); i++) {
            VariantSummary v = vs.get(i);
            labels.add(v.variant());
            share[i] = v.kidnapTrials() == 0 ? 0 : v.recoveryShare();
            lo[i] = v.recoveryRate().lower();
            hi[i] = v.recoveryRate().upper();
            times.add(recoveryTimes(v.variant()));
        }
        double required = r.scenario().gates().stream()
                .filter(g -> g.metric() == GateMetric.RECOVERY_TIME)
                .mapToDouble(Gate::share)
                .findFirst()
                .orElse(Double.NaN);
        return List.of(
                drawings.drawn(SvgChart.intervals(
                        "Recovery success with 95 % Wilson interval", labels, share, lo, hi, required)),
                drawings.drawn(SvgChart.histogram(
                        "Recovery time distribution", "seconds after the kidnap", labels, times, 12)));
    }

    /** Seconds from kidnap to recovery of every recovered kidnap of one variant, in trial order. */
    double[] recoveryTimes(String variant) {
        List<Double> ts = new ArrayList<>();
        for (TrialOutcome t : r.trials()) {
            if (t.variant().equals(variant)) {
                for (KidnapOutcome k : t.kidnaps()) {
                    if (k.recovered()) {
                        ts.add(k.recoveredAfter());
                    }
                }
            }
        }
        return ts.stream().mapToDouble(Double::doubleValue).toArray();
    }

    /** The sweep's passing shares by particle count, with their intervals. */
    String sweepChart(ReportView.SweepShares s) {
        return drawings.drawn(SvgChart.intervals(
                "Trials passing every gate, by particle count",
                s.labels(),
                s.share(),
                s.lower(),
                s.upper(),
                Double.NaN));
    }

    /** The plots of a single run over time; empty without a trace. */
    List<String> runCharts() {
        if (r.trace().isEmpty()) {
            return List.of();
        }
        RunTrace tr = r.trace().get();
        int n = tr.size();
        double[] t = tr.times();
        double[][] s = new double[8][n];
        for (int i = 0; i < n; i++) {
            s[0][i] = tr.positionError(i);
            s[1][i] = Math.toDegrees(tr.headingError(i));
            s[2][i] = tr.effectiveSize(i);
            // a localizer that reports no particles has no count: a gap in the plot, not zero
            s[3][i] = tr.particles(i) < 0 ? Double.NaN : tr.particles(i);
            s[4][i] = tr.meanLikelihood(i);
            s[5][i] = tr.slowAverage(i);
            s[6][i] = tr.fastAverage(i);
            s[7][i] = tr.injected(i);
        }
        double[] k = tr.kidnapTimes();
        return List.of(
                line("Position error", "metres", t, k, new SvgChart.Series("position error", s[0])),
                line("Heading error", "degrees", t, k, new SvgChart.Series("heading error", s[1])),
                line(
                        "Effective sample size and particle count",
                        "particles",
                        t,
                        k,
                        new SvgChart.Series("effective sample size", s[2]),
                        new SvgChart.Series("particles", s[3])),
                line(
                        "Mean likelihood with slow and fast averages",
                        "likelihood",
                        t,
                        k,
                        new SvgChart.Series("mean likelihood", s[4]),
                        new SvgChart.Series("slow average", s[5]),
                        new SvgChart.Series("fast average", s[6])),
                line("Injected particles", "particles", t, k, new SvgChart.Series("injected", s[7])));
    }

    private String line(String title, String unit, double[] t, double[] kidnaps, SvgChart.Series... series) {
        return drawings.drawn(SvgChart.lines(title, "time (s)", unit, t, List.of(series), kidnaps, "kidnap"));
    }

    /** Each key frame over the plan, or the note where one is over the budget (never drawn then). */
    List<String> keyFrames() {
        if (r.keyFrames().isEmpty()) {
            return List.of();
        }
        int planElements = plan().elements();
        List<String> out = new ArrayList<>();
        for (Report.KeyFrame k : r.keyFrames()) {
            out.add(drawings.draw(
                    FrameSvg.elements(planElements, k.frame(), r.beamAngles()),
                    () -> FrameSvg.render(r.scenario(), planSvg(), k.frame(), r.beamAngles(), k.caption())));
        }
        return out;
    }

    /** The site plan, or the note where it stood when it is over the budget (never drawn then). */
    String sitePlan() {
        return drawings.draw(plan().elements(), this::planSvg);
    }
}
