package dev.driftlab.sim;

/** How a run ended. */
public enum Outcome {
    /** The route was driven and the settle time passed. */
    FINISHED,
    /** A collision stopped the robot; the run ended after the settle time. */
    BLOCKED,
    /** The step bound was reached first (e.g. the robot was stalled too long). */
    STEP_LIMIT,
    /** Stopped from outside (cancelled) before the route ended. */
    STOPPED
}
