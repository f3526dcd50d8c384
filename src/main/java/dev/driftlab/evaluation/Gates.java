package dev.driftlab.evaluation;

import dev.driftlab.scenario.Gate;
import dev.driftlab.scenario.GateMetric;
import java.util.List;
import java.util.Locale;

/** Evaluates gates over trials. */
public final class Gates {

    /** Confidence level of the reported intervals. */
    public static final double CONFIDENCE = 0.95;

    private Gates() {}

    /** Whether one trial is within the gate's bound. */
    public static boolean passes(Gate gate, TrialOutcome t) {
        double bound = gate.bound();
        return switch (gate.metric()) {
            case RECOVERY_TIME -> t.allRecoveredWithin(bound);
            case FINAL_ERROR -> t.finalPositionError() <= bound;
            case LONGEST_LOST -> t.longestLost() <= bound;
            case CONVERGENCE_TIME -> t.converged() && t.convergenceTime() <= bound;
            case POSITION_RMSE -> t.rmse() <= bound;
        };
    }

    /**
     * Evaluates a gate over the trials of one variant: the gate passes when the observed share of
     * passing trials reaches the required share. The Wilson interval says how firm that is.
     */
    public static GateVerdict evaluate(Gate gate, String variant, List<TrialOutcome> trials) {
        if (trials.isEmpty()) {
            throw new IllegalArgumentException("a gate needs at least one trial");
        }
        int passed = 0;
        for (TrialOutcome t : trials) {
            if (passes(gate, t)) {
                passed++;
            }
        }
        int n = trials.size();
        Interval ci = Stats.wilson(passed, n, CONFIDENCE);
        double share = (double) passed / n;
        boolean pass = share + 1e-12 >= gate.share();
        String reason = String.format(
                Locale.ROOT,
                "%d of %d trials (%s, 95 %% interval %s to %s) %s, %s the required %s",
                passed,
                n,
                pct(share),
                pct(ci.lower()),
                pct(ci.upper()),
                describe(gate),
                pass ? "meeting" : "below",
                pct(gate.share()));
        return new GateVerdict(gate, variant, passed, n, ci, pass, reason);
    }

    /** What a passing trial does, in words: "recovered from every kidnap within 20 s". */
    public static String describe(Gate gate) {
        String b = num(gate.bound());
        return switch (gate.metric()) {
            case RECOVERY_TIME -> "recovered from every kidnap within " + b + " s";
            case FINAL_ERROR -> "ended with position error under " + b + " m";
            case LONGEST_LOST -> "were never lost longer than " + b + " s";
            case CONVERGENCE_TIME -> "converged within " + b + " s";
            case POSITION_RMSE -> "kept the RMS position error under " + b + " m";
        };
    }

    /** Metric name as written in files and reports. */
    public static String metricName(GateMetric m) {
        return m.name().toLowerCase(Locale.ROOT).replace('_', '-');
    }

    static String pct(double share) {
        double p = share * 100;
        return (p == Math.rint(p) ? String.format(Locale.ROOT, "%.0f", p) : String.format(Locale.ROOT, "%.1f", p))
                + " %";
    }

    static String num(double v) {
        return v == Math.rint(v) ? String.format(Locale.ROOT, "%.0f", v) : String.format(Locale.ROOT, "%s", v);
    }
}
