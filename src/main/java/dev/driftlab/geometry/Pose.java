package dev.driftlab.geometry;

/**
 * A planar pose in the site frame: position in metres and heading in radians, counter-clockwise
 * from +x, always wrapped to (-pi, pi].
 *
 * @param x east coordinate in metres
 * @param y north coordinate in metres
 * @param heading heading in radians, wrapped to (-pi, pi]
 */
public record Pose(double x, double y, double heading) {

    /** Checks finiteness and wraps the heading. */
    public Pose {
        if (!Double.isFinite(x) || !Double.isFinite(y) || !Double.isFinite(heading)) {
            throw new IllegalArgumentException(
                    "pose values must be finite, got (" + x + ", " + y + ", " + heading + ")");
        }
        heading = Angles.wrap(heading);
    }

    /** Pose from metres and radians. */
    public static Pose of(double x, double y, double heading) {
        return new Pose(x, y, heading);
    }

    /** The position part of this pose. */
    public Point position() {
        return new Point(x, y);
    }

    /**
     * Composes this pose with an offset given in this pose's own frame (forward, left, turn), e.g. a
     * sensor mount.
     */
    public Pose compose(Pose local) {
        double c = Math.cos(heading);
        double s = Math.sin(heading);
        return new Pose(x + c * local.x - s * local.y, y + s * local.x + c * local.y, heading + local.heading);
    }
}
