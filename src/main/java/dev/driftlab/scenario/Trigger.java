package dev.driftlab.scenario;

import dev.driftlab.geometry.Point;

/** When a fault fires: at a time on the run clock, or when the robot first enters a place. */
public sealed interface Trigger {

    /**
     * Fires at a fixed time.
     *
     * @param time seconds from the start of the run
     */
    record AtTime(double time) implements Trigger {
        /** Checks finiteness. */
        public AtTime {
            Checks.finite(time, "time");
        }
    }

    /**
     * Fires the first time the robot's true centre enters a room or floor zone.
     *
     * @param place id of a room or floor zone
     */
    record OnEntering(String place) implements Trigger {
        /** Checks presence. */
        public OnEntering {
            Checks.present(place, "place");
        }
    }

    /**
     * Fires the first time the robot's true centre comes within a radius of a point.
     *
     * @param point centre in metres
     * @param radius radius in metres
     */
    record NearPoint(Point point, double radius) implements Trigger {
        /** Checks presence and finiteness. */
        public NearPoint {
            Checks.present(point, "point");
            Checks.finite(radius, "radius");
        }
    }
}
