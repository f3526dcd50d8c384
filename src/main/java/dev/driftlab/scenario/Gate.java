package dev.driftlab.scenario;

/**
 * A pass/fail criterion over trials: the metric must be within the bound in at least the required
 * share of trials, e.g. recovery within 20 s in at least 90 % of trials.
 *
 * @param id unique id among the gates
 * @param metric what is measured per trial
 * @param bound limit in the metric's unit (seconds or metres)
 * @param share required share of passing trials, in (0, 1]
 */
public record Gate(String id, GateMetric metric, double bound, double share) {
    /** Checks presence and finiteness. */
    public Gate {
        Checks.present(id, "id");
        Checks.present(metric, "metric");
        Checks.finite(bound, "bound");
        Checks.finite(share, "share");
    }
}
