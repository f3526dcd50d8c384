package dev.driftlab.sim;

import dev.driftlab.geometry.Pose;

/**
 * One rangefinder scan. Ranges are metres along each beam of {@link #geometry()}; a beam that
 * returned nothing holds exactly the max range. The poses are those of the robot (not the sensor)
 * at the scan time; the localizer should use {@link #odometry()}, the true pose is for evaluation.
 * Immutable: ranges are copied out.
 */
public final class RangeScan {

    private final double time;
    private final Pose truth;
    private final Pose odometry;
    private final ScanGeometry geometry;
    private final float[] ranges;

    /**
     * A scan; the ranges array is copied.
     *
     * @param time seconds from the run start
     * @param truth true robot pose, site frame
     * @param odometry odometry robot pose, odometry frame (starts at the route start)
     * @param geometry beam angles, mount and max range
     * @param ranges metres, one per beam
     */
    public RangeScan(double time, Pose truth, Pose odometry, ScanGeometry geometry, float[] ranges) {
        if (truth == null || odometry == null || geometry == null) {
            throw new IllegalArgumentException("truth, odometry and geometry must be given");
        }
        if (ranges.length != geometry.beamCount()) {
            throw new IllegalArgumentException(
                    "ranges has " + ranges.length + " values for " + geometry.beamCount() + " beams");
        }
        this.time = time;
        this.truth = truth;
        this.odometry = odometry;
        this.geometry = geometry;
        this.ranges = ranges.clone();
    }

    /** Seconds from the run start. */
    public double time() {
        return time;
    }

    /** True robot pose at the scan time, site frame. */
    public Pose truth() {
        return truth;
    }

    /** Robot pose from wheel odometry at the scan time. */
    public Pose odometry() {
        return odometry;
    }

    /** Beam angles, mount and max range. */
    public ScanGeometry geometry() {
        return geometry;
    }

    /** Number of beams. */
    public int beamCount() {
        return ranges.length;
    }

    /** Range of beam i in metres. */
    public float range(int i) {
        return ranges[i];
    }

    /** Copies the ranges into {@code out} (length at least the beam count); no allocation. */
    public void copyRangesInto(float[] out) {
        System.arraycopy(ranges, 0, out, 0, ranges.length);
    }

    /** A copy of the ranges, metres. */
    public float[] copyRanges() {
        return ranges.clone();
    }
}
