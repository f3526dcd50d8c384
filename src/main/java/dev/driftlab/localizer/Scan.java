package dev.driftlab.localizer;

import dev.driftlab.geometry.Pose;
import java.util.Arrays;
import java.util.Objects;

/**
 * One range scan as the filter sees it: a range per beam, each beam's direction relative to the
 * sensor, the sensor's mount pose on the robot and the longest measurable range. Immutable; the
 * arrays are copied in.
 *
 * <p>A range that is not finite, negative or at least {@code maxRange} is a "no return" reading
 * and is stored as exactly {@code maxRange}.
 */
public final class Scan {

    final double[] ranges;
    final double[] angles;
    final Pose mount;
    final double maxRange;

    private Scan(double[] ranges, double[] angles, Pose mount, double maxRange) {
        this.ranges = ranges;
        this.angles = angles;
        this.mount = mount;
        this.maxRange = maxRange;
    }

    /**
     * A scan with explicit beam directions.
     *
     * @param ranges measured ranges in metres, one per beam
     * @param angles beam directions in radians relative to the sensor heading, counter-clockwise
     * @param mount sensor pose in the robot frame (forward metres, left metres, turn radians)
     * @param maxRange longest measurable range in metres, greater than 0
     * @return the scan
     */
    public static Scan of(double[] ranges, double[] angles, Pose mount, double maxRange) {
        Objects.requireNonNull(ranges, "ranges");
        Objects.requireNonNull(angles, "angles");
        Objects.requireNonNull(mount, "mount");
        if (ranges.length != angles.length) {
            throw new IllegalArgumentException(
                    "scan has " + ranges.length + " ranges but " + angles.length + " beam angles");
        }
        if (!(maxRange > 0) || !Double.isFinite(maxRange)) {
            throw new IllegalArgumentException("scan max range must be > 0, got " + maxRange);
        }
        double[] r = new double[ranges.length];
        double[] a = Arrays.copyOf(angles, angles.length);
        for (int i = 0; i < r.length; i++) {
            if (!Double.isFinite(a[i])) {
                throw new IllegalArgumentException("scan beam angle " + i + " must be finite, got " + a[i]);
            }
            double v = ranges[i];
            r[i] = (Double.isFinite(v) && v >= 0 && v < maxRange) ? v : maxRange;
        }
        return new Scan(r, a, mount, maxRange);
    }

    /**
     * A scan whose beams are spread evenly over the field of view, centred on the sensor heading,
     * first beam at the right-hand edge (the rangefinder convention of the scenario format).
     *
     * @param ranges measured ranges in metres, one per beam
     * @param fieldOfView angular width in radians
     * @param mount sensor pose in the robot frame
     * @param maxRange longest measurable range in metres
     * @return the scan
     */
    public static Scan evenlySpread(double[] ranges, double fieldOfView, Pose mount, double maxRange) {
        return of(ranges, evenAngles(ranges.length, fieldOfView), mount, maxRange);
    }

    /**
     * Beam directions spread evenly over a field of view, centred on 0, first beam at -fov/2 (or 0
     * for a single beam).
     *
     * @param beams number of beams
     * @param fieldOfView angular width in radians
     * @return a new array of angles in radians
     */
    public static double[] evenAngles(int beams, double fieldOfView) {
        double[] a = new double[beams];
        for (int i = 0; i < beams; i++) {
            a[i] = beams == 1 ? 0.0 : -fieldOfView / 2 + fieldOfView * i / (beams - 1);
        }
        return a;
    }

    /** Number of beams. */
    public int beams() {
        return ranges.length;
    }

    /** Range of beam {@code i} in metres; {@code maxRange()} for no return. */
    public double range(int i) {
        return ranges[i];
    }

    /** Direction of beam {@code i} in radians relative to the sensor heading. */
    public double angle(int i) {
        return angles[i];
    }

    /** Sensor pose in the robot frame (forward, left, turn). */
    public Pose mount() {
        return mount;
    }

    /** Longest measurable range in metres. */
    public double maxRange() {
        return maxRange;
    }
}
