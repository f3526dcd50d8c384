package dev.driftlab.scenario;

import dev.driftlab.geometry.Pose;

/**
 * A scanning rangefinder. Beams are spread evenly over the field of view, centred on the mount
 * heading, first beam at the right-hand edge.
 *
 * @param beams number of beams per scan
 * @param fieldOfView angular width in radians
 * @param maxRange longest measurable range in metres; misses report this value
 * @param rangeSigma standard deviation of range noise in metres
 * @param rate scans per second
 * @param mount sensor pose in the robot frame (forward, left, turn)
 * @param dropout probability that a beam returns nothing (reported as max range)
 */
public record Rangefinder(
        int beams, double fieldOfView, double maxRange, double rangeSigma, double rate, Pose mount, double dropout) {
    /** Checks finiteness; ranges are checked by the validator. */
    public Rangefinder {
        Checks.finite(fieldOfView, "fieldOfView");
        Checks.finite(maxRange, "maxRange");
        Checks.finite(rangeSigma, "rangeSigma");
        Checks.finite(rate, "rate");
        Checks.present(mount, "mount");
        Checks.finite(dropout, "dropout");
    }

    /** A common 2-D indoor scanner: 360 beams over 270 degrees, 12 m, 2 cm noise, 10 Hz. */
    public static Rangefinder typical() {
        return new Rangefinder(360, Math.toRadians(270), 12.0, 0.02, 10.0, Pose.of(0.1, 0, 0), 0.0);
    }
}
