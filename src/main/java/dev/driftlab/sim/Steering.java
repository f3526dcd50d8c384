package dev.driftlab.sim;

/** Which pose the route follower steers by. */
public enum Steering {
    /**
     * The true pose: the robot drives the route as drawn, whatever its odometry says. Use this for
     * localization tests, where the route should visit the places the scenario names.
     */
    TRUE_POSE,
    /**
     * The odometry pose: the robot believes its wheels, as in an odometry calibration run. The
     * true path drifts away from the route.
     */
    ODOMETRY
}
