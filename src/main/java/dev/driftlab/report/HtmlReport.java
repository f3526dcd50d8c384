package dev.driftlab.report;

import dev.driftlab.evaluation.EpisodeRules;
import dev.driftlab.evaluation.FaultTally;
import dev.driftlab.evaluation.GateVerdict;
import dev.driftlab.evaluation.Gates;
import dev.driftlab.evaluation.Interval;
import dev.driftlab.evaluation.KidnapOutcome;
import dev.driftlab.evaluation.PairedComparison;
import dev.driftlab.evaluation.RunTrace;
import dev.driftlab.evaluation.Spread;
import dev.driftlab.evaluation.TrialOutcome;
import dev.driftlab.evaluation.VariantSummary;
import dev.driftlab.evaluation.Verdict;
import dev.driftlab.scenario.GateRule;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

/**
 * Renders a report as one self-contained HTML page: styles inline, plots as inline SVG, no scripts
 * and no external files, so it can be attached to a CI build, mailed or printed.
 */
public final class HtmlReport {

    /** Episode rows listed before the table is cut short, so a large batch stays readable. */
    private static final int MAX_EPISODE_ROWS = 500;

    private final StringBuilder sb = new StringBuilder(64 * 1024);
    private final Report r;
    private final boolean xhtml;

    private HtmlReport(Report r, boolean xhtml) {
        this.r = r;
        this.xhtml = xhtml;
    }

    /** The page as text. */
    public static String render(Report r) {
        return new HtmlReport(r, false).page();
    }

    /**
     * The same page as well-formed XHTML (void elements closed, XHTML namespace), for renderers
     * that read XML such as the PDF renderer.
     */
    public static String renderXhtml(Report r) {
        return new HtmlReport(r, true).page();
    }

    private String page() {
        String title = "Localization report: " + r.scenario().name();
        String close = xhtml ? "/>" : ">";
        sb.append("<!DOCTYPE html>\n<html lang=\"en\"")
                .append(xhtml ? " xmlns=\"http://www.w3.org/1999/xhtml\"" : "")
                .append("><head><meta charset=\"utf-8\"")
                .append(close)
                .append("<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\"")
                .append(close)
                .append("<title>")
                .append(esc(title))
                .append("</title><style>")
                .append(CSS)
                .append("</style></head><body>");
        sb.append("<header><h1>").append(esc(title)).append("</h1>");
        verdictBadge();
        sb.append("<dl class=\"facts\">");
        fact("Kind", r.kind().name().toLowerCase(Locale.ROOT));
        fact("Scenario source", r.source());
        fact("Seeds", seedText());
        fact("Trials", r.trials().size() + " of " + r.planned() + (r.cancelled() ? " (cancelled)" : ""));
        fact(
                "Variants",
                String.join(
                        ", ",
                        r.summary().variants().stream()
                                .map(VariantSummary::variant)
                                .toList()));
        fact("Generated", r.generatedAt());
        fact("Time taken", String.format(Locale.ROOT, "%.1f s", r.seconds()));
        r.kldRequired()
                .ifPresent(k -> fact("KLD bound for the start belief", String.format(Locale.ROOT, "%,d particles", k)));
        sb.append("</dl></header>");
        sb.append("<p class=\"caution\" role=\"note\"><strong>Caution.</strong> ")
                .append(esc(Report.CAUTION))
                .append("</p>");
        findings();
        gates();
        faults();
        variants();
        recovery();
        comparisons();
        sweep();
        run();
        keyFrames();
        sb.append("<section><h2>Site plan</h2><figure class=\"plan\">")
                .append(SitePlanSvg.render(r.scenario()))
                .append("</figure></section>");
        trials();
        glossary();
        sb.append("<footer>").append(esc(Report.CAUTION)).append("</footer></body></html>\n");
        return sb.toString();
    }

    private void verdictBadge() {
        Verdict v = r.verdict();
        String text = switch (v) {
            case PASS -> r.verdicts().isEmpty() ? "every trial ran; the scenario has no gates" : "every gate holds";
            case FAIL -> "a gate fails on trials that exercised it";
            case ENDED_EARLY -> "trials ended before their route did";
            case NOT_EXERCISED -> "a gate was exercised by no trial";
            case INCOMPLETE -> r.cancelled() ? "not every trial ran (stopped early)" : "not every trial has run";
        };
        sb.append("<p class=\"verdict ")
                .append(v == Verdict.PASS ? "pass" : "fail")
                .append("\" id=\"verdict\"><span aria-hidden=\"true\">")
                .append(v.symbol())
                .append("</span> Verdict: ")
                .append(esc(v.word()))
                .append(" \u2014 ")
                .append(esc(text))
                .append("</p>");
    }

    private void findings() {
        List<String> lines = Findings.headline(r);
        if (lines.isEmpty()) {
            return;
        }
        sb.append("<section class=\"findings\" aria-labelledby=\"findings-h\"><h2 id=\"findings-h\">"
                + "Read this first</h2><ul>");
        for (String line : lines) {
            sb.append("<li>").append(esc(line)).append("</li>");
        }
        sb.append("</ul></section>");
    }

    private void faults() {
        List<FaultTally> tallies = Findings.faults(r);
        if (tallies.isEmpty()) {
            return;
        }
        sb.append("<section><h2>Scheduled faults</h2><table class=\"faults\"><thead><tr><th>Fault</th>"
                + "<th>Fired</th><th>Why not, where it did not</th></tr></thead><tbody>");
        for (FaultTally f : tallies) {
            sb.append("<tr><td>")
                    .append(esc(f.id()))
                    .append("</td><td>")
                    .append(f.missed() ? "<strong class=\"fail\">\u26A0 " : "")
                    .append(esc(f.sentence()))
                    .append(f.missed() ? "</strong>" : "")
                    .append("</td><td>")
                    .append(esc(f.reasons().isEmpty() ? "" : String.join("; ", f.reasons())))
                    .append("</td></tr>");
        }
        sb.append("</tbody></table></section>");
    }

    private void glossary() {
        EpisodeRules e = EpisodeRules.defaults();
        sb.append("<section><h2>Glossary</h2><dl class=\"glossary\">");
        term(
                "Converged",
                String.format(
                        Locale.ROOT,
                        "the estimate came within %s m and %.0f degrees of the truth and stayed there for %s s.",
                        num(e.convergePosition()),
                        Math.toDegrees(e.convergeHeading()),
                        num(e.convergeHold())));
        term(
                "Lost",
                String.format(
                        Locale.ROOT,
                        "after converging, the position error stayed over %s m (or the heading error over %.0f degrees)"
                                + " for %s s; the episode lasts until the estimate converges again.",
                        num(e.lostPosition()),
                        Math.toDegrees(e.lostHeading()),
                        num(e.lostHold())));
        term(
                "Noticed",
                String.format(
                        Locale.ROOT,
                        "after a kidnap, the mean likelihood fell under %.0f %% of its level in the %s s before it, or"
                                + " the filter injected particles.",
                        e.noticeRatio() * 100,
                        num(e.noticeWindow())));
        term(
                "Recovered",
                "after a kidnap, the estimate converged again (same thresholds as converged); the recovery"
                        + " time counts from the kidnap.");
        term(
                "Exercised",
                "a trial exercises a gate when the gate's event had its chance in it: a kidnap fired (recovery"
                        + " time); the route was driven to its end (final error, longest lost, RMS error, relative pose error);"
                        + " the filter converged or the trial lasted the gate's bound (convergence time); every trial (route"
                        + " completed, no contact). Shares and intervals count exercised trials only; a gate no trial exercised"
                        + " fails.");
        term(
                "Ended early",
                "the trial stopped before its route did: the footprint touched an obstacle (contact), or the"
                        + " route was not done within three times its planned duration plus a minute (time limit). Unless the"
                        + " route allows contact or the scenario has its own route-completed gate, the default gate"
                        + " \"route-completed (default)\" fails every trial that ended early.");
        term(
                "Relative pose error",
                "over every pair of frames 1 s (or 5 s) apart, the difference between the true and"
                        + " the estimated motion, as a root mean square of its translation (Sturm et al., IROS 2012); pairs that"
                        + " span a kidnap or a shove are left out.");
        term(
                "95 % interval",
                "the Wilson score interval of the passing share (Wilson 1927). A gate judged by the"
                        + " interval's lower end passes only when that end reaches the required share.");
        sb.append("</dl></section>");
    }

    private void term(String name, String text) {
        sb.append("<dt>")
                .append(esc(name))
                .append("</dt><dd>")
                .append(esc(text))
                .append("</dd>");
    }

    private String seedText() {
        long[] s = r.seeds();
        if (s.length == 0) {
            return "none";
        }
        return s.length == 1 ? Long.toString(s[0]) : s[0] + " to " + s[s.length - 1] + " (" + s.length + ")";
    }

    private void gates() {
        sb.append("<section><h2>Gates</h2>");
        if (r.verdicts().isEmpty()) {
            sb.append("<p>The scenario defines no gates.</p></section>");
            return;
        }
        sb.append("<table class=\"gates\"><thead><tr><th>Gate</th><th>Variant</th><th>Criterion</th>"
                + "<th>Passing / exercised / all trials</th><th>95 % interval (exercised)</th><th>Verdict</th>"
                + "</tr></thead><tbody>");
        for (GateVerdict v : r.verdicts()) {
            String criterion =
                    Gates.describe(v.gate()) + " in at least " + pct(v.gate().share())
                            + " of exercised trials"
                            + (v.gate().rule() == GateRule.INTERVAL_LOWER_END
                                    ? ", judged by the interval's lower end"
                                    : ", judged by the observed share");
            sb.append("<tr class=\"")
                    .append(v.pass() ? "pass" : "fail")
                    .append("\"><td>")
                    .append(esc(v.gate().id()))
                    .append(v.byDefault() ? " <span class=\"note\">(added by default)</span>" : "")
                    .append("</td><td>")
                    .append(esc(v.variant()))
                    .append("</td><td>")
                    .append(esc(criterion))
                    .append("</td><td>")
                    .append(v.passed())
                    .append(" / ")
                    .append(v.exercised())
                    .append(" / ")
                    .append(v.trials())
                    .append(v.notExercised() ? "" : " (" + pct(v.share()) + ")")
                    .append("</td><td>")
                    .append(v.notExercised() ? "n/a" : interval(v.interval()))
                    .append("</td><td>")
                    .append(v.pass() ? "\u2713 pass" : v.notExercised() ? "\u2205 not exercised" : "\u2717 fail")
                    .append(v.uncertain() ? " <span class=\"note\">(interval spans the requirement)</span>" : "")
                    .append("</td></tr><tr class=\"reason\"><td colspan=\"6\">")
                    .append(esc(v.reason()))
                    .append("</td></tr>");
        }
        sb.append("</tbody></table></section>");
    }

    private void variants() {
        sb.append("<section><h2>Variants</h2><table><thead><tr><th>Variant</th><th>Trials</th><th>Kidnap recovery</th>"
                + "<th>Recovery time p50 / p90 / max</th><th>Converged</th><th>Convergence p50 / p90</th>"
                + "<th>RMS error p50 / p90 / max</th><th>Final error p50 / p90</th><th>Longest lost p50 / max</th>"
                + "</tr></thead><tbody>");
        for (VariantSummary v : r.summary().variants()) {
            sb.append("<tr><td>")
                    .append(esc(v.variant()))
                    .append("</td><td>")
                    .append(v.trials())
                    .append("</td><td>");
            if (v.kidnapTrials() == 0) {
                sb.append("no kidnap");
            } else {
                sb.append(v.recovered())
                        .append(" / ")
                        .append(v.kidnapTrials())
                        .append(" within ")
                        .append(num(v.recoveryDeadline()))
                        .append(" s (")
                        .append(pct(v.recoveryShare()))
                        .append(", ")
                        .append(interval(v.recoveryRate()))
                        .append(")");
            }
            sb.append("</td><td>")
                    .append(spread(v.recoveryTimes(), "s"))
                    .append("</td><td>")
                    .append(v.converged())
                    .append(" / ")
                    .append(v.trials())
                    .append("</td><td>")
                    .append(twoOf(v.convergenceTimes(), "s"))
                    .append("</td><td>")
                    .append(spread(v.rmse(), "m"))
                    .append("</td><td>")
                    .append(twoOf(v.finalError(), "m"))
                    .append("</td><td>")
                    .append(num(v.longestLost().p50()))
                    .append(" / ")
                    .append(num(v.longestLost().max()))
                    .append(" s</td></tr>");
        }
        sb.append("</tbody></table></section>");
    }

    private void recovery() {
        List<VariantSummary> vs = r.summary().variants();
        if (vs.stream().allMatch(v -> v.kidnapTrials() == 0)) {
            return;
        }
        sb.append("<section><h2>Kidnapped-robot recovery</h2>");
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
            List<Double> ts = new ArrayList<>();
            for (TrialOutcome t : r.trials()) {
                if (t.variant().equals(v.variant())) {
                    for (KidnapOutcome k : t.kidnaps()) {
                        if (k.recovered()) {
                            ts.add(k.recoveredAfter());
                        }
                    }
                }
            }
            times.add(ts.stream().mapToDouble(Double::doubleValue).toArray());
        }
        double required = r.scenario().gates().stream()
                .filter(g -> g.metric() == dev.driftlab.scenario.GateMetric.RECOVERY_TIME)
                .mapToDouble(dev.driftlab.scenario.Gate::share)
                .findFirst()
                .orElse(Double.NaN);
        sb.append("<div class=\"charts\">")
                .append(SvgChart.intervals(
                        "Recovery success with 95 % Wilson interval", labels, share, lo, hi, required))
                .append(SvgChart.histogram("Recovery time distribution", "seconds after the kidnap", labels, times, 12))
                .append("</div>");
        boolean many = r.kind() != Report.Kind.RUN;
        sb.append("<h3>Kidnap episodes</h3><table><thead><tr>")
                .append(many ? "<th>Variant</th><th>Seed</th>" : "")
                .append("<th>Kidnap at</th><th>Noticed after</th><th>Recovered after</th></tr></thead><tbody>");
        int rows = 0;
        for (TrialOutcome t : r.trials()) {
            for (KidnapOutcome k : t.kidnaps()) {
                if (rows++ >= MAX_EPISODE_ROWS) {
                    continue;
                }
                sb.append("<tr class=\"episode\">");
                if (many) {
                    sb.append("<td>")
                            .append(esc(t.variant()))
                            .append("</td><td>")
                            .append(t.seed())
                            .append("</td>");
                }
                sb.append("<td>")
                        .append(num(k.at()))
                        .append(" s</td><td>")
                        .append(k.noticed() ? num(k.noticedAfter()) + " s" : "not noticed")
                        .append("</td><td>")
                        .append(k.recovered() ? num(k.recoveredAfter()) + " s" : "not recovered")
                        .append("</td></tr>");
            }
        }
        sb.append("</tbody></table>");
        if (rows > MAX_EPISODE_ROWS) {
            sb.append("<p class=\"note\">The first ")
                    .append(MAX_EPISODE_ROWS)
                    .append(" episodes are listed; the result document has them all.</p>");
        }
        sb.append("</section>");
    }

    private void comparisons() {
        if (r.summary().comparisons().isEmpty()) {
            return;
        }
        sb.append(
                "<section><h2>Paired comparison with the base</h2><p class=\"note\">Every variant ran on the same seeds, "
                        + "so each pair saw the same simulated world and sensor data. Differences are variant minus base with "
                        + "normal-approximation 95 % intervals.</p><table><thead><tr><th>Variant</th><th>Pairs</th>"
                        + "<th>Recovered: both / base only / variant only / neither</th><th>Recovery share difference</th>"
                        + "<th>RMS error difference</th><th>Median recovery time difference</th></tr></thead><tbody>");
        for (PairedComparison c : r.summary().comparisons()) {
            sb.append("<tr><td>")
                    .append(esc(c.variant()))
                    .append("</td><td>")
                    .append(c.pairs())
                    .append("</td><td>")
                    .append(c.bothRecovered())
                    .append(" / ")
                    .append(c.onlyBaseRecovered())
                    .append(" / ")
                    .append(c.onlyVariantRecovered())
                    .append(" / ")
                    .append(c.neitherRecovered())
                    .append("</td><td>")
                    .append(signedPct(c.recoveryShareDifference()))
                    .append(" [")
                    .append(signedPct(c.recoveryShareLow()))
                    .append(", ")
                    .append(signedPct(c.recoveryShareHigh()))
                    .append("]</td><td>")
                    .append(signed(c.rmseDifference()))
                    .append(" m [")
                    .append(signed(c.rmseLow()))
                    .append(", ")
                    .append(signed(c.rmseHigh()))
                    .append("]</td><td>")
                    .append(
                            Double.isNaN(c.medianRecoveryTimeDifference())
                                    ? "n/a"
                                    : signed(c.medianRecoveryTimeDifference()) + " s")
                    .append("</td></tr>");
        }
        sb.append("</tbody></table></section>");
    }

    private void sweep() {
        if (r.kind() != Report.Kind.SWEEP) {
            return;
        }
        List<VariantSummary> vs = r.summary().variants();
        List<String> labels = new ArrayList<>();
        double[] share = new double[vs.size()];
        double[] lo = new double[vs.size()];
        double[] hi = new double[vs.size()];
        for (int i = 0; i < vs.size(); i++) {
            VariantSummary v = vs.get(i);
            labels.add(v.variant());
            boolean kidnaps = v.kidnapTrials() > 0;
            int ok = 0;
            List<dev.driftlab.scenario.Gate> gates = Gates.effective(r.scenario());
            for (TrialOutcome t : r.trials()) {
                if (t.variant().equals(v.variant())
                        && gates.stream().allMatch(g -> !Gates.exercised(g, t) || Gates.passes(g, t))) {
                    ok++;
                }
            }
            Interval ci = dev.driftlab.evaluation.Stats.wilson(ok, Math.max(1, v.trials()), 0.95);
            share[i] = v.trials() == 0 ? 0 : (double) ok / v.trials();
            lo[i] = ci.lower();
            hi[i] = ci.upper();
            if (!kidnaps && r.scenario().gates().isEmpty()) {
                share[i] = v.converged() / (double) Math.max(1, v.trials());
            }
        }
        sb.append("<section><h2>Particle count sweep</h2><div class=\"charts\">")
                .append(SvgChart.intervals(
                        "Trials passing every gate, by particle count", labels, share, lo, hi, Double.NaN))
                .append("</div>");
        if (r.kldRequired().isPresent()) {
            int k = r.kldRequired().getAsInt();
            sb.append("<ul class=\"kld\">");
            for (int c : r.sweepCounts()) {
                sb.append("<li>")
                        .append(String.format(Locale.ROOT, "%,d", c))
                        .append(" particles: ")
                        .append(
                                c < k
                                        ? "<strong class=\"fail\">below</strong> the "
                                                + String.format(Locale.ROOT, "%,d", k)
                                                + " the KLD bound asks for at the start"
                                        : "meets the KLD bound")
                        .append("</li>");
            }
            sb.append("</ul>");
        }
        sb.append("</section>");
    }

    private void run() {
        if (r.trace().isEmpty()) {
            return;
        }
        RunTrace tr = r.trace().get();
        int n = tr.size();
        double[] t = tr.times();
        double[] pe = new double[n];
        double[] he = new double[n];
        double[] ess = new double[n];
        double[] count = new double[n];
        double[] lik = new double[n];
        double[] slow = new double[n];
        double[] fast = new double[n];
        double[] inj = new double[n];
        for (int i = 0; i < n; i++) {
            pe[i] = tr.positionError(i);
            he[i] = Math.toDegrees(tr.headingError(i));
            ess[i] = tr.effectiveSize(i);
            count[i] = tr.particles(i);
            lik[i] = tr.meanLikelihood(i);
            slow[i] = tr.slowAverage(i);
            fast[i] = tr.fastAverage(i);
            inj[i] = tr.injected(i);
        }
        double[] kidnaps = tr.kidnapTimes();
        sb.append("<section><h2>The run over time</h2><div class=\"charts\">")
                .append(SvgChart.lines(
                        "Position error",
                        "time (s)",
                        "metres",
                        t,
                        List.of(new SvgChart.Series("position error", pe)),
                        kidnaps,
                        "kidnap"))
                .append(SvgChart.lines(
                        "Heading error",
                        "time (s)",
                        "degrees",
                        t,
                        List.of(new SvgChart.Series("heading error", he)),
                        kidnaps,
                        "kidnap"))
                .append(SvgChart.lines(
                        "Effective sample size and particle count",
                        "time (s)",
                        "particles",
                        t,
                        List.of(
                                new SvgChart.Series("effective sample size", ess),
                                new SvgChart.Series("particles", count)),
                        kidnaps,
                        "kidnap"))
                .append(SvgChart.lines(
                        "Mean likelihood with slow and fast averages",
                        "time (s)",
                        "likelihood",
                        t,
                        List.of(
                                new SvgChart.Series("mean likelihood", lik),
                                new SvgChart.Series("slow average", slow),
                                new SvgChart.Series("fast average", fast)),
                        kidnaps,
                        "kidnap"))
                .append(SvgChart.lines(
                        "Injected particles",
                        "time (s)",
                        "particles",
                        t,
                        List.of(new SvgChart.Series("injected", inj)),
                        kidnaps,
                        "kidnap"))
                .append("</div></section>");
    }

    private void keyFrames() {
        if (r.keyFrames().isEmpty()) {
            return;
        }
        sb.append("<section><h2>Key frames</h2><p class=\"note\">Green: the true robot. Blue: the estimate and its "
                + "hypotheses (one-sigma ellipses). Purple: particles, darker for heavier. Orange: scan end points seen "
                + "from the true pose.</p><div class=\"keyframes\">");
        for (Report.KeyFrame k : r.keyFrames()) {
            sb.append("<figure>")
                    .append(FrameSvg.render(r.scenario(), k.frame(), r.beamAngles(), k.caption()))
                    .append("</figure>");
        }
        sb.append("</div></section>");
    }

    private void trials() {
        sb.append("<section><h2>Trials</h2><details><summary>")
                .append(r.trials().size())
                .append(
                        " trials</summary><table><thead><tr><th>Variant</th><th>Seed</th><th>RMS error</th><th>Final error</th>"
                                + "<th>Converged at</th><th>Longest lost</th><th>Relative pose error 1 s / 5 s</th>"
                                + "<th>Kidnaps (recovered after)</th><th>Contacts</th><th>Ended</th>"
                                + "<th>Faults that did not fire</th></tr></thead><tbody>");
        for (TrialOutcome t : r.trials()) {
            sb.append("<tr><td>")
                    .append(esc(t.variant()))
                    .append("</td><td>")
                    .append(t.seed())
                    .append("</td><td>")
                    .append(num(t.rmse()))
                    .append(" m</td><td>")
                    .append(num(t.finalPositionError()))
                    .append(" m</td><td>")
                    .append(t.converged() ? num(t.convergenceTime()) + " s" : "never")
                    .append("</td><td>")
                    .append(num(t.longestLost()))
                    .append(" s</td><td>")
                    .append(num(t.rpe1()))
                    .append(" / ")
                    .append(num(t.rpe5()))
                    .append(" m</td><td>");
            List<String> ks = new ArrayList<>();
            for (KidnapOutcome k : t.kidnaps()) {
                ks.add(num(k.at()) + " s (" + (k.recovered() ? num(k.recoveredAfter()) + " s" : "not recovered") + ")");
            }
            sb.append(esc(ks.isEmpty() ? "none" : String.join(", ", ks)))
                    .append("</td><td>")
                    .append(t.collisions())
                    .append("</td><td>")
                    .append(t.end().early() ? "\u25D1 " : "")
                    .append(esc(t.end().describe()))
                    .append("</td><td>")
                    .append(esc(String.join(
                            "; ",
                            t.faults().stream()
                                    .filter(f -> !f.fired())
                                    .map(f -> f.id() + ": " + f.reason())
                                    .toList())))
                    .append("</td></tr>");
        }
        sb.append("</tbody></table></details></section>");
    }

    private void fact(String k, String v) {
        sb.append("<dt>").append(esc(k)).append("</dt><dd>").append(esc(v)).append("</dd>");
    }

    private static String spread(Spread s, String unit) {
        if (s.count() == 0) {
            return "n/a";
        }
        return num(s.p50()) + " / " + num(s.p90()) + " / " + num(s.max()) + " " + unit;
    }

    private static String twoOf(Spread s, String unit) {
        if (s.count() == 0) {
            return "n/a";
        }
        return num(s.p50()) + " / " + num(s.p90()) + " " + unit;
    }

    private static String interval(Interval i) {
        return pct(i.lower()) + " to " + pct(i.upper());
    }

    static String pct(double share) {
        if (Double.isNaN(share)) {
            return "n/a";
        }
        return String.format(Locale.ROOT, "%.1f %%", share * 100);
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

    private static String esc(String s) {
        return SitePlanSvg.esc(s);
    }

    private static final String CSS = "body{font-family:system-ui,-apple-system,'Segoe UI',sans-serif;color:#1d2630;"
            + "background:#fbfbf8;margin:0 auto;max-width:1200px;padding:1rem 1.5rem}h1{font-size:1.4rem;margin:.2rem 0}"
            + "h2{font-size:1.1rem;border-bottom:1px solid #d9dde1;padding-bottom:.2rem;margin-top:1.6rem}"
            + ".facts{display:grid;grid-template-columns:max-content 1fr;gap:.15rem 1rem;font-size:.9rem}"
            + ".facts dt{color:#5b6873}.facts dd{margin:0}.verdict{font-weight:700;font-size:1.1rem;display:inline-block;"
            + "padding:.2rem .6rem;border-radius:4px}.verdict.pass{background:#d8f0ea;color:#0b5e4f}"
            + ".verdict.fail{background:#f6ddd6;color:#8a2c16}.caution{background:#fff7e0;border-left:4px solid #b07a12;"
            + "padding:.5rem .8rem;font-size:.9rem}table{border-collapse:collapse;width:100%;font-size:.85rem;margin:.5rem 0}"
            + "th,td{border-bottom:1px solid #e3e6e9;padding:.3rem .4rem;text-align:left;vertical-align:top}"
            + "th{background:#f1f3f5}tr.fail td:last-child{color:#8a2c16;font-weight:600}"
            + "tr.pass td:last-child{color:#0b5e4f;font-weight:600}tr.reason td{color:#5b6873;font-size:.8rem;"
            + "border-bottom:2px solid #d9dde1}.note{color:#5b6873;font-size:.85rem}.charts{display:flex;flex-wrap:wrap;"
            + "gap:1rem}.charts svg{width:calc(50% - .5rem);min-width:320px;height:auto;background:#fff;border:1px solid #e3e6e9}"
            + ".plan svg{max-width:100%;height:auto}.keyframes{display:flex;flex-wrap:wrap;gap:.8rem}"
            + ".keyframes figure{margin:0;flex:1 1 30%;min-width:300px}.keyframes svg{width:100%;height:auto}.fail{color:#8a2c16}footer{margin-top:2rem;font-size:.8rem;"
            + "color:#5b6873;border-top:1px solid #d9dde1;padding-top:.5rem}"
            + ".findings{background:#fff7e0;border:1px solid #b07a12;padding:.2rem 1rem}"
            + ".glossary dt{font-weight:600;margin-top:.4rem}.glossary dd{margin:0 0 0 1rem;font-size:.9rem}"
            + "@media print{body{max-width:none}details{display:block}section{break-inside:avoid}}";
}
