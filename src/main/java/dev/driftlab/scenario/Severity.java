package dev.driftlab.scenario;

/** How serious a validation problem is. */
public enum Severity {
    /** The scenario is refused. */
    ERROR,
    /** The scenario is allowed; the problem may be the point of the test. */
    WARNING
}
