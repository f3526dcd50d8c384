package dev.driftlab.scenario;

/**
 * A point the robot drives to, turning in place first to face it.
 *
 * @param x east coordinate in metres
 * @param y north coordinate in metres
 * @param speed speed limit on the leg that ends here, metres per second
 * @param dwell time to stand still on arrival, seconds
 */
public record Waypoint(double x, double y, double speed, double dwell) {
    /** Checks finiteness. */
    public Waypoint {
        Checks.finite(x, "x");
        Checks.finite(y, "y");
        Checks.finite(speed, "speed");
        Checks.finite(dwell, "dwell");
    }
}
