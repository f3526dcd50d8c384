package dev.driftlab.sim;

import dev.driftlab.geometry.Pose;
import dev.driftlab.scenario.Rangefinder;

/**
 * Where the beams of a scan point. Beam angles are in the sensor frame (0 = along the mount
 * heading, counter-clockwise positive), spread evenly over the field of view from its right-hand
 * edge; over a full circle the last beam stops one step short of the first. The mount pose is in
 * the robot frame (x forward, y left). Immutable.
 */
public final class ScanGeometry {

    private final double[] angles;
    private final Pose mount;
    private final double maxRange;
    private final double fieldOfView;

    private ScanGeometry(double[] angles, Pose mount, double maxRange, double fieldOfView) {
        this.angles = angles;
        this.mount = mount;
        this.maxRange = maxRange;
        this.fieldOfView = fieldOfView;
    }

    /**
     * The geometry of a rangefinder.
     *
     * @throws IllegalArgumentException naming the field when beams, field of view or max range are
     *     out of range
     */
    public static ScanGeometry of(Rangefinder rf) {
        if (rf.beams() < 1 || rf.beams() > 100_000) {
            throw new IllegalArgumentException("rangefinder.beams: must be 1 to 100000, got " + rf.beams());
        }
        if (!(rf.fieldOfView() > 0) || rf.fieldOfView() > 2 * Math.PI + 1e-9) {
            throw new IllegalArgumentException(
                    "rangefinder.fieldOfView: must be in (0, 2 pi] radians, got " + rf.fieldOfView());
        }
        if (!(rf.maxRange() > 0)) {
            throw new IllegalArgumentException("rangefinder.maxRange: must be positive, got " + rf.maxRange());
        }
        int n = rf.beams();
        double fov = rf.fieldOfView();
        boolean fullCircle = fov >= 2 * Math.PI - 1e-9;
        double step = n == 1 ? 0 : (fullCircle ? fov / n : fov / (n - 1));
        double first = n == 1 ? 0 : -fov / 2;
        double[] angles = new double[n];
        for (int i = 0; i < n; i++) {
            angles[i] = first + i * step;
        }
        return new ScanGeometry(angles, rf.mount(), rf.maxRange(), fov);
    }

    /** Number of beams. */
    public int beamCount() {
        return angles.length;
    }

    /** Angle of beam i in the sensor frame, radians. */
    public double angle(int i) {
        return angles[i];
    }

    /** Copy of all beam angles in the sensor frame, radians. */
    public double[] copyAngles() {
        return angles.clone();
    }

    /** Sensor pose in the robot frame (forward, left metres; turn radians). */
    public Pose mount() {
        return mount;
    }

    /** Longest range in metres; a beam that returns nothing reports exactly this. */
    public double maxRange() {
        return maxRange;
    }

    /** Angular width in radians. */
    public double fieldOfView() {
        return fieldOfView;
    }
}
