package dev.driftlab.scenario;

/** What a gate measures in each trial; each trial passes when its figure is within the bound. */
public enum GateMetric {
    /** Every kidnap in the trial is recovered within the bound, in seconds. */
    RECOVERY_TIME("s"),
    /** Position error at the end of the trial is under the bound, in metres. */
    FINAL_ERROR("m"),
    /** The longest lost episode lasts under the bound, in seconds. */
    LONGEST_LOST("s"),
    /** Global localization converges within the bound, in seconds. */
    CONVERGENCE_TIME("s"),
    /** Root mean square position error over the trial is under the bound, in metres. */
    POSITION_RMSE("m");

    private final String unit;

    GateMetric(String unit) {
        this.unit = unit;
    }

    /** Unit of the bound: "s" or "m". */
    public String unit() {
        return unit;
    }
}
