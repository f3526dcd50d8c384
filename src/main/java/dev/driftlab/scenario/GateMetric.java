package dev.driftlab.scenario;

import java.util.Locale;

/**
 * What a gate measures in each trial; each trial passes when its figure is within the bound. This
 * enum is the one list of metrics: the reader, the writer, the validator, the gates form and the
 * reports all take their names and units from here.
 */
public enum GateMetric {
    /** Every kidnap in the trial is recovered within the bound, in seconds. */
    RECOVERY_TIME("s"),
    /** Position error at the end of the route is under the bound, in metres. */
    FINAL_ERROR("m"),
    /** The longest lost episode lasts under the bound, in seconds. */
    LONGEST_LOST("s"),
    /** Global localization converges within the bound, in seconds. */
    CONVERGENCE_TIME("s"),
    /** Root mean square position error over the trial is under the bound, in metres. */
    POSITION_RMSE("m"),
    /** The robot drove its whole route (the trial did not end early); the bound is not used. */
    ROUTE_COMPLETED(""),
    /** The robot's footprint touched obstacles at most the bound's number of times (usually 0). */
    NO_CONTACT("contacts"),
    /** Relative pose error (translation, RMS) over 1 s intervals is under the bound, in metres. */
    RELATIVE_POSE_ERROR_1S("m"),
    /** Relative pose error (translation, RMS) over 5 s intervals is under the bound, in metres. */
    RELATIVE_POSE_ERROR_5S("m"),
    /**
     * The localizer answered 99 % of the trial's scans within the bound, in seconds of wall-clock
     * time on the machine that ran the trial (0.05: "answers within 50 ms in 99 % of scans").
     */
    ANSWER_TIME("s");

    private final String unit;

    GateMetric(String unit) {
        this.unit = unit;
    }

    /** Unit of the bound: "s", "m", "contacts", or "" when the metric takes no bound. */
    public String unit() {
        return unit;
    }

    /** Whether the bound means something for this metric. */
    public boolean takesBound() {
        return !unit.isEmpty();
    }

    /** The metric's name as written in scenario files, forms and reports: "recovery-time". */
    public String fileName() {
        return name().toLowerCase(Locale.ROOT).replace('_', '-');
    }

    /** The metric named as in files, if any. */
    public static java.util.Optional<GateMetric> byFileName(String name) {
        for (GateMetric m : values()) {
            if (m.fileName().equals(name)) {
                return java.util.Optional.of(m);
            }
        }
        return java.util.Optional.empty();
    }
}
