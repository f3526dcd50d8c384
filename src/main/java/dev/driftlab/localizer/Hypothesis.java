package dev.driftlab.localizer;

import dev.driftlab.geometry.Pose;
import java.util.Objects;

/**
 * One place the robot may be: a cluster of particles summarised by its share of the weight, its
 * weighted mean pose (circular mean for heading) and its covariance.
 *
 * @param weight share of the total weight, in [0, 1]
 * @param mean weighted mean pose, site frame
 * @param covariance weighted covariance around the mean
 * @param particles number of particles in the cluster
 */
public record Hypothesis(double weight, Pose mean, Covariance covariance, int particles) {

    /** Checks the weight range and presence of the parts. */
    public Hypothesis {
        if (!(weight >= 0 && weight <= 1 + 1e-9)) {
            throw new IllegalArgumentException("hypothesis weight must be in [0, 1], got " + weight);
        }
        Objects.requireNonNull(mean, "mean");
        Objects.requireNonNull(covariance, "covariance");
        if (particles < 0) {
            throw new IllegalArgumentException("particle count must not be negative, got " + particles);
        }
        weight = Math.min(weight, 1.0);
    }
}
