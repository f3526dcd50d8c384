package dev.driftlab.scenario;

import java.util.Locale;

/**
 * How a gate turns its exercised trials into a verdict. Scenario files spell these as
 * {@code "judgedBy": "observed-share"} (the default) or {@code "judgedBy": "interval-lower-end"}.
 */
public enum GateRule {
    /** The observed share of passing trials must reach the required share. */
    OBSERVED_SHARE,
    /**
     * The lower end of the 95 % Wilson score interval of the passing share must reach the required
     * share: the gate passes only when the data show the share is met with 95 % confidence, so a
     * handful of lucky trials cannot carry it.
     */
    INTERVAL_LOWER_END;

    /** The rule's name in files and reports. */
    public String fileName() {
        return name().toLowerCase(Locale.ROOT).replace('_', '-');
    }
}
