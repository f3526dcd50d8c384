package dev.driftlab.sim;

import dev.driftlab.geometry.Pose;
import java.util.List;

/**
 * The robot's state at one internal step.
 *
 * @param time seconds from the run start
 * @param truth true pose in the site frame
 * @param odometry pose integrated from the wheel encoder ticks, starting at the route start
 * @param activeFaults ids of faults with a duration that are in force now
 */
public record SimStep(double time, Pose truth, Pose odometry, List<String> activeFaults) {
    /** Checks presence and copies the list. */
    public SimStep {
        if (truth == null || odometry == null) {
            throw new IllegalArgumentException("truth and odometry must be given");
        }
        activeFaults = List.copyOf(activeFaults);
    }
}
