package dev.driftlab.scenario;

/**
 * Expected duration of a route when the robot turns in place at its top turn rate, then drives
 * each leg with a trapezoidal speed profile (accelerate, cruise, brake) and dwells. The simulator
 * follows the same profile, so this is the route's end time without faults.
 */
public final class RouteTiming {

    private RouteTiming() {}

    /**
     * Seconds from the start until the robot reaches and dwells at the last waypoint.
     *
     * @param route the route
     * @param robot speed, turn rate and acceleration limits
     * @return duration in seconds; 0 for a route without waypoints
     */
    public static double driveSeconds(Route route, Robot robot) {
        double x = route.start().x();
        double y = route.start().y();
        double heading = route.start().heading();
        double total = 0;
        for (Waypoint w : route.waypoints()) {
            double dx = w.x() - x;
            double dy = w.y() - y;
            double d = Math.hypot(dx, dy);
            if (d > 1e-9) {
                double bearing = Math.atan2(dy, dx);
                double turn = Math.abs(dev.driftlab.geometry.Angles.difference(bearing, heading));
                if (robot.maxTurnRate() > 0) {
                    total += turn / robot.maxTurnRate();
                }
                heading = bearing;
                total += legSeconds(d, Math.min(w.speed(), robot.maxSpeed()), robot.maxAcceleration());
            }
            total += Math.max(0, w.dwell());
            x = w.x();
            y = w.y();
        }
        return total;
    }

    /** Drive time plus the settle time: when a run of this route ends. */
    public static double runSeconds(Route route, Robot robot) {
        return driveSeconds(route, robot) + Math.max(0, route.settle());
    }

    /**
     * Time to drive a straight leg from rest to rest.
     *
     * @param distance metres
     * @param speed cruise speed limit, metres per second
     * @param acceleration metres per second squared
     * @return seconds
     */
    public static double legSeconds(double distance, double speed, double acceleration) {
        if (distance <= 0 || speed <= 0) {
            return 0;
        }
        if (acceleration <= 0) {
            return distance / speed;
        }
        double rampDistance = speed * speed / acceleration;
        if (distance >= rampDistance) {
            return distance / speed + speed / acceleration;
        }
        return 2 * Math.sqrt(distance / acceleration);
    }
}
