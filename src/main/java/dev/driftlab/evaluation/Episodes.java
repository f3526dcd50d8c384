package dev.driftlab.evaluation;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;

/** Finds convergence, lost episodes and kidnap recoveries in a run's trace. */
public final class Episodes {

    private Episodes() {}

    /**
     * First time from which the error stays under the convergence thresholds for the hold time
     * (the hold must fit inside the run), at or after {@code from} and before {@code until}.
     *
     * @return seconds from the run start, or NaN if it never converges
     */
    public static double convergence(RunTrace trace, EpisodeRules rules, double from, double until) {
        int n = trace.size();
        int runStart = -1;
        for (int i = 0; i < n; i++) {
            double t = trace.time(i);
            if (t < from) {
                continue;
            }
            if (t >= until) {
                break;
            }
            boolean under = trace.positionError(i) < rules.convergePosition()
                    && trace.headingError(i) < rules.convergeHeading();
            if (!under) {
                runStart = -1;
                continue;
            }
            if (runStart < 0) {
                runStart = i;
            }
            if (t - trace.time(runStart) >= rules.convergeHold()) {
                return trace.time(runStart);
            }
        }
        return Double.NaN;
    }

    /** Convergence over the whole run. */
    public static double convergence(RunTrace trace, EpisodeRules rules) {
        return convergence(trace, rules, Double.NEGATIVE_INFINITY, Double.POSITIVE_INFINITY);
    }

    /**
     * Lost episodes starting at or after {@code from}: maximal stretches with the error over the
     * lost thresholds that last at least the hold time (an open stretch at the end of the run
     * counts when it already lasted the hold time).
     */
    public static List<Episode> lost(RunTrace trace, EpisodeRules rules, double from) {
        List<Episode> out = new ArrayList<>();
        int n = trace.size();
        int start = -1;
        for (int i = 0; i < n; i++) {
            if (trace.time(i) < from) {
                continue;
            }
            boolean over = trace.positionError(i) > rules.lostPosition() || trace.headingError(i) > rules.lostHeading();
            if (over && start < 0) {
                start = i;
            } else if (!over && start >= 0) {
                double s = trace.time(start);
                double e = trace.time(i);
                if (e - s >= rules.lostHold()) {
                    out.add(new Episode(s, e, true));
                }
                start = -1;
            }
        }
        if (start >= 0) {
            double s = trace.time(start);
            double e = trace.time(n - 1);
            if (e - s >= rules.lostHold()) {
                out.add(new Episode(s, e, false));
            }
        }
        return out;
    }

    /**
     * Outcome of every kidnap in the trace. Recovery of a kidnap must happen before the next
     * kidnap; otherwise it counts as not recovered.
     */
    public static List<KidnapOutcome> kidnaps(RunTrace trace, EpisodeRules rules) {
        double[] times = trace.kidnapTimes();
        List<KidnapOutcome> out = new ArrayList<>();
        for (int k = 0; k < times.length; k++) {
            double at = times[k];
            double next = k + 1 < times.length ? times[k + 1] : Double.POSITIVE_INFINITY;
            double recovered = convergence(trace, rules, at, next);
            double noticed = noticed(trace, rules, at, next);
            out.add(new KidnapOutcome(at, noticed - at, recovered - at));
        }
        return out;
    }

    private static double noticed(RunTrace trace, EpisodeRules rules, double at, double until) {
        double reference = reference(trace, at - rules.noticeWindow(), at);
        for (int i = 0; i < trace.size(); i++) {
            double t = trace.time(i);
            if (t < at) {
                continue;
            }
            if (t >= until) {
                break;
            }
            if (trace.injected(i) > 0 || trace.meanLikelihood(i) < rules.noticeRatio() * reference) {
                return t;
            }
        }
        return Double.NaN;
    }

    /** Median mean-likelihood in [from, to); the first frame's value when the window is empty. */
    private static double reference(RunTrace trace, double from, double to) {
        double[] window = new double[trace.size()];
        int m = 0;
        for (int i = 0; i < trace.size(); i++) {
            double t = trace.time(i);
            if (t >= from && t < to) {
                window[m++] = trace.meanLikelihood(i);
            }
        }
        if (m == 0) {
            return trace.size() > 0 ? trace.meanLikelihood(0) : 0;
        }
        return Stats.percentile(Arrays.copyOf(window, m), 50);
    }
}
