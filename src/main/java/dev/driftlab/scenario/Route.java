package dev.driftlab.scenario;

import dev.driftlab.geometry.Pose;
import java.util.List;

/**
 * The path the robot is told to drive.
 *
 * @param start start pose (metres, radians)
 * @param waypoints points to visit in order
 * @param settle seconds to keep the run going after the last waypoint is reached
 * @param contactAllowed whether a trial that stops early because the footprint touched an obstacle
 *     may still pass; when false (the default) every trial must drive its whole route
 */
public record Route(Pose start, List<Waypoint> waypoints, double settle, boolean contactAllowed) {
    /** Copies the waypoint list. */
    public Route {
        Checks.present(start, "start");
        waypoints = List.copyOf(waypoints);
        Checks.finite(settle, "settle");
    }

    /** A route on which contact ends the trial as a failure (the default). */
    public Route(Pose start, List<Waypoint> waypoints, double settle) {
        this(start, waypoints, settle, false);
    }
}
