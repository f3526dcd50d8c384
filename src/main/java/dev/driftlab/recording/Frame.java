package dev.driftlab.recording;

import dev.driftlab.geometry.Pose;
import java.util.List;

/**
 * One recorded step of a run: the truth, what odometry and the filter believed, the filter's
 * figures, the scan and the particles. Arrays are owned by the frame (do not change them).
 *
 * @param index frame number from 0
 * @param time seconds from the run start
 * @param truth true pose
 * @param odometry pose integrated from the wheel encoders
 * @param estimate the filter's pose estimate
 * @param hypotheses clusters of particles, heaviest first
 * @param effectiveSize effective sample size
 * @param meanLikelihood mean beam likelihood of the update
 * @param slowAverage w_slow
 * @param fastAverage w_fast
 * @param injected particles injected in this update
 * @param ranges scan ranges in metres, one per beam (max range for a miss)
 * @param particleX particle x, metres
 * @param particleY particle y, metres
 * @param particleHeading particle heading, radians
 * @param particleWeight particle weight, normalised to sum 1
 * @param events what happened in this step (e.g. "kidnap carried-off", "collision")
 */
public record Frame(
        int index,
        double time,
        Pose truth,
        Pose odometry,
        Pose estimate,
        List<FrameHypothesis> hypotheses,
        double effectiveSize,
        double meanLikelihood,
        double slowAverage,
        double fastAverage,
        int injected,
        float[] ranges,
        float[] particleX,
        float[] particleY,
        float[] particleHeading,
        float[] particleWeight,
        List<String> events) {

    /** Checks that particle columns line up and copies the lists. */
    public Frame {
        hypotheses = List.copyOf(hypotheses);
        events = List.copyOf(events);
        int n = particleX.length;
        if (particleY.length != n || particleHeading.length != n || particleWeight.length != n) {
            throw new IllegalArgumentException("particle columns must have the same length");
        }
    }

    /** Number of particles. */
    public int particleCount() {
        return particleX.length;
    }
}
