package dev.driftlab.scenario;

/**
 * A pass/fail criterion over trials: the metric must be within the bound in at least the required
 * share of the trials that exercised it, e.g. recovery within 20 s in at least 90 % of the trials
 * in which a kidnap happened.
 *
 * @param id unique id among the gates
 * @param metric what is measured per trial
 * @param bound limit in the metric's unit (seconds, metres or contacts; not used by every metric)
 * @param share required share of passing trials, in (0, 1]
 * @param rule whether the observed share or the lower end of its interval must reach {@code share}
 */
public record Gate(String id, GateMetric metric, double bound, double share, GateRule rule) {
    /** Checks presence and finiteness. */
    public Gate {
        Checks.present(id, "id");
        Checks.present(metric, "metric");
        Checks.finite(bound, "bound");
        Checks.finite(share, "share");
        Checks.present(rule, "rule");
    }

    /** A gate judged by the observed share (the default rule). */
    public Gate(String id, GateMetric metric, double bound, double share) {
        this(id, metric, bound, share, GateRule.OBSERVED_SHARE);
    }
}
