package dev.driftlab.evaluation;

import dev.driftlab.scenario.Gate;
import dev.driftlab.scenario.GateMetric;
import dev.driftlab.scenario.GateRule;
import dev.driftlab.scenario.Scenario;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

/**
 * Evaluates gates over trials, counting only the trials that exercised each gate.
 *
 * <p>A trial <em>exercises</em> a gate when the gate's event had its chance in it:
 *
 * <ul>
 *   <li>recovery-time: a kidnap fired and the trial ran on for the gate's bound after the last one
 *       (or every kidnap was recovered within the bound anyway): a kidnap in the trial's last
 *       seconds gives the filter no chance to recover, so it neither passes nor fails;
 *   <li>final-error, longest-lost, position-rmse: the trial drove its whole route (a trial that
 *       stopped early is judged by the route rule instead, never by the pose at the moment it
 *       stopped);
 *   <li>relative-pose-error-1s / -5s: the trial drove its whole route and lasted at least one
 *       interval;
 *   <li>convergence-time: the filter converged, or the trial lasted as long as the bound (a trial
 *       that had its chance and never converged fails);
 *   <li>answer-time: every trial whose answer times were measured (the 99th percentile of the
 *       localizer's per-scan answer time must be within the bound);
 *   <li>route-completed and no-contact: every trial.
 * </ul>
 *
 * <p>The share, its Wilson interval and the verdict are over the exercised trials. A gate that no
 * trial exercised fails, with a reason that says so.
 */
public final class Gates {

    /** Confidence level of the reported intervals. */
    public static final double CONFIDENCE = 0.95;

    /**
     * The gate every scenario gets when it has no route-completed gate of its own and its route
     * does not allow contact: every trial must drive its whole route.
     */
    public static final Gate ROUTE_DEFAULT = new Gate("route-completed (default)", GateMetric.ROUTE_COMPLETED, 0, 1.0);

    /** Most extra trials the "how many more" search tries before it says the gate cannot pass. */
    private static final int MAX_MORE = 10_000_000;

    private Gates() {}

    /**
     * The gates a scenario's trials are judged by: its own, plus {@link #ROUTE_DEFAULT} unless the
     * scenario has a route-completed gate or its route allows contact.
     */
    public static List<Gate> effective(Scenario scenario) {
        List<Gate> out = new ArrayList<>(scenario.gates());
        boolean own = out.stream().anyMatch(g -> g.metric() == GateMetric.ROUTE_COMPLETED);
        if (!own && !scenario.route().contactAllowed()) {
            out.add(ROUTE_DEFAULT);
        }
        return out;
    }

    /** Whether the gate was added by {@link #effective} rather than written in the scenario. */
    public static boolean isDefault(Gate gate) {
        return gate == ROUTE_DEFAULT;
    }

    /** Whether a trial exercised the gate (see the class comment). */
    public static boolean exercised(Gate gate, TrialOutcome t) {
        boolean whole = !t.end().early();
        return switch (gate.metric()) {
            case RECOVERY_TIME ->
                t.kidnapped()
                        && (t.allRecoveredWithin(gate.bound())
                                || t.duration()
                                                - t.kidnaps()
                                                        .get(t.kidnaps().size() - 1)
                                                        .at()
                                        >= gate.bound());
            case FINAL_ERROR, LONGEST_LOST, POSITION_RMSE -> whole;
            case RELATIVE_POSE_ERROR_1S -> whole && Double.isFinite(t.rpe1());
            case RELATIVE_POSE_ERROR_5S -> whole && Double.isFinite(t.rpe5());
            case CONVERGENCE_TIME -> t.converged() || t.duration() >= gate.bound();
            case ANSWER_TIME -> t.answerTimed();
            case ROUTE_COMPLETED, NO_CONTACT -> true;
        };
    }

    /** Whether one trial that exercised the gate is within its bound. */
    public static boolean passes(Gate gate, TrialOutcome t) {
        double bound = gate.bound();
        return switch (gate.metric()) {
            case RECOVERY_TIME -> t.kidnapped() && t.allRecoveredWithin(bound);
            case FINAL_ERROR -> t.finalPositionError() <= bound;
            case LONGEST_LOST -> t.longestLost() <= bound;
            case CONVERGENCE_TIME -> t.converged() && t.convergenceTime() <= bound;
            case POSITION_RMSE -> t.rmse() <= bound;
            case ROUTE_COMPLETED -> !t.end().early();
            case NO_CONTACT -> t.collisions() <= bound;
            case RELATIVE_POSE_ERROR_1S -> t.rpe1() <= bound;
            case RELATIVE_POSE_ERROR_5S -> t.rpe5() <= bound;
            case ANSWER_TIME -> t.answerP99() <= bound;
        };
    }

    /**
     * Evaluates a gate over the trials of one variant: the share of passing trials among those that
     * exercised the gate must reach the required share (or, under {@link
     * GateRule#INTERVAL_LOWER_END}, the lower end of its 95 % Wilson interval must). A gate no trial
     * exercised fails.
     */
    public static GateVerdict evaluate(Gate gate, String variant, List<TrialOutcome> trials) {
        if (trials.isEmpty()) {
            throw new IllegalArgumentException("a gate needs at least one trial");
        }
        int passed = 0;
        int exercised = 0;
        for (TrialOutcome t : trials) {
            if (exercised(gate, t)) {
                exercised++;
                if (passes(gate, t)) {
                    passed++;
                }
            }
        }
        int n = trials.size();
        if (exercised == 0) {
            String reason = "not exercised: " + notExercised(gate, trials) + ", so the gate cannot pass";
            return new GateVerdict(
                    gate, variant, 0, 0, n, new Interval(0, 1, CONFIDENCE), false, reason, isDefault(gate), -1);
        }
        Interval ci = Stats.wilson(passed, exercised, CONFIDENCE);
        double share = (double) passed / exercised;
        boolean pass = holds(gate.rule(), passed, exercised, gate.share());
        int more = pass ? 0 : morePassingNeeded(gate.rule(), passed, exercised, gate.share());
        StringBuilder reason = new StringBuilder(String.format(
                Locale.ROOT,
                "%d of %d %s (%s, 95 %% interval %s to %s) %s",
                passed,
                exercised,
                exercisedNoun(gate),
                pct(share),
                pct(ci.lower()),
                pct(ci.upper()),
                describe(gate)));
        if (gate.rule() == GateRule.INTERVAL_LOWER_END) {
            reason.append(String.format(
                    Locale.ROOT,
                    "; judged by the interval's lower end, %s %s the required %s",
                    pct(ci.lower()),
                    pass ? "meets" : "is below",
                    pct(gate.share())));
        } else {
            reason.append(pass ? ", meeting" : ", below")
                    .append(" the required ")
                    .append(pct(gate.share()));
        }
        if (!pass) {
            reason.append(
                    more < 0
                            ? "; no number of further passing trials would be enough under this rule"
                            : "; " + more + " more passing trial" + (more == 1 ? "" : "s") + " would be needed");
        }
        if (exercised < n) {
            reason.append(String.format(
                    Locale.ROOT, "; %d of %d trials %s and are not counted", n - exercised, n, notExercisedVerb(gate)));
        }
        return new GateVerdict(gate, variant, passed, exercised, n, ci, pass, reason.toString(), isDefault(gate), more);
    }

    /** Whether {@code passed} of {@code exercised} trials meet the share under the rule. */
    static boolean holds(GateRule rule, int passed, int exercised, double share) {
        if (exercised == 0) {
            return false;
        }
        double figure = rule == GateRule.INTERVAL_LOWER_END
                ? Stats.wilson(passed, exercised, CONFIDENCE).lower()
                : (double) passed / exercised;
        return figure + 1e-12 >= share;
    }

    /**
     * The fewest further trials, all passing, that would make the gate hold; -1 when none would (a
     * required share of 100 % after a failure, or an interval lower end that never reaches it).
     */
    static int morePassingNeeded(GateRule rule, int passed, int exercised, double share) {
        if (holds(rule, passed, exercised, share)) {
            return 0;
        }
        if (!holds(rule, passed + MAX_MORE, exercised + MAX_MORE, share)) {
            return -1;
        }
        // both rules grow monotonically with added passing trials: bisect on the count
        int lo = 0;
        int hi = MAX_MORE;
        while (hi - lo > 1) {
            int mid = lo + (hi - lo) / 2;
            if (holds(rule, passed + mid, exercised + mid, share)) {
                hi = mid;
            } else {
                lo = mid;
            }
        }
        return hi;
    }

    private static String exercisedNoun(Gate gate) {
        return switch (gate.metric()) {
            case RECOVERY_TIME -> "trials with a kidnap and " + num(gate.bound()) + " s to recover";
            case FINAL_ERROR, LONGEST_LOST, POSITION_RMSE -> "trials that drove the whole route";
            case RELATIVE_POSE_ERROR_1S, RELATIVE_POSE_ERROR_5S -> "trials that drove the whole route";
            case CONVERGENCE_TIME -> "trials that converged or lasted " + num(gate.bound()) + " s";
            case ANSWER_TIME -> "trials with measured answer times";
            case ROUTE_COMPLETED, NO_CONTACT -> "trials";
        };
    }

    private static String notExercisedVerb(Gate gate) {
        return switch (gate.metric()) {
            case RECOVERY_TIME -> "had no kidnap, or ended within " + num(gate.bound()) + " s of it,";
            case FINAL_ERROR, LONGEST_LOST, POSITION_RMSE -> "ended early";
            case RELATIVE_POSE_ERROR_1S, RELATIVE_POSE_ERROR_5S -> "ended early or were too short";
            case CONVERGENCE_TIME -> "ended before " + num(gate.bound()) + " s without converging";
            case ANSWER_TIME -> "had no measured answer times";
            case ROUTE_COMPLETED, NO_CONTACT -> "were not run";
        };
    }

    private static String notExercised(Gate gate, List<TrialOutcome> trials) {
        int n = trials.size();
        int kidnapped = (int) trials.stream().filter(TrialOutcome::kidnapped).count();
        return switch (gate.metric()) {
            case RECOVERY_TIME ->
                kidnapped == 0
                        ? "the kidnap fired in 0 of " + n + " trials"
                        : "the kidnap fired in " + kidnapped + " of " + n + " trials, but none ran on for the "
                                + num(gate.bound()) + " s the gate allows for recovery";
            case FINAL_ERROR, LONGEST_LOST, POSITION_RMSE -> "the route was driven to its end in 0 of " + n + " trials";
            case RELATIVE_POSE_ERROR_1S, RELATIVE_POSE_ERROR_5S ->
                "the route was driven to its end, over more than one interval, in 0 of " + n + " trials";
            case CONVERGENCE_TIME ->
                "in 0 of " + n + " trials did the filter converge or the trial last the " + num(gate.bound()) + " s";
            case ANSWER_TIME -> "the localizer's answer times were measured in 0 of " + n + " trials";
            case ROUTE_COMPLETED, NO_CONTACT -> "0 of " + n + " trials ran";
        };
    }

    /** What a passing trial does, in words: "recovered from every kidnap within 20 s". */
    public static String describe(Gate gate) {
        String b = num(gate.bound());
        return switch (gate.metric()) {
            case RECOVERY_TIME -> "recovered from every kidnap within " + b + " s";
            case FINAL_ERROR -> "ended the route with position error under " + b + " m";
            case LONGEST_LOST -> "were never lost longer than " + b + " s";
            case CONVERGENCE_TIME -> "converged within " + b + " s";
            case POSITION_RMSE -> "kept the RMS position error under " + b + " m";
            case ROUTE_COMPLETED -> "drove the whole route";
            case NO_CONTACT -> gate.bound() == 0 ? "touched nothing" : "touched obstacles at most " + b + " times";
            case RELATIVE_POSE_ERROR_1S -> "kept the relative pose error over 1 s under " + b + " m";
            case RELATIVE_POSE_ERROR_5S -> "kept the relative pose error over 5 s under " + b + " m";
            case ANSWER_TIME -> "answered 99 % of scans within " + b + " s";
        };
    }

    /** Metric name as written in files and reports. */
    public static String metricName(GateMetric m) {
        return m.fileName();
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
