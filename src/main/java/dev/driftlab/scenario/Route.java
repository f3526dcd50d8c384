package dev.driftlab.scenario;

import dev.driftlab.geometry.Pose;
import java.util.List;

/**
 * The path the robot is told to drive.
 *
 * @param start start pose (metres, radians)
 * @param waypoints points to visit in order
 * @param settle seconds to keep the run going after the last waypoint is reached
 */
public record Route(Pose start, List<Waypoint> waypoints, double settle) {
    /** Copies the waypoint list. */
    public Route {
        Checks.present(start, "start");
        waypoints = List.copyOf(waypoints);
        Checks.finite(settle, "settle");
    }
}
