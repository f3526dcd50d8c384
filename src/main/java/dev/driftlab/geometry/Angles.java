package dev.driftlab.geometry;

/** Angle helpers. All angles are radians, counter-clockwise from +x. */
public final class Angles {

    private static final double TWO_PI = 2.0 * Math.PI;

    private Angles() {}

    /** Wraps an angle into (-pi, pi]. */
    public static double wrap(double angle) {
        if (angle > -Math.PI && angle <= Math.PI) {
            return angle;
        }
        double a = angle % TWO_PI;
        if (a <= -Math.PI) {
            a += TWO_PI;
        } else if (a > Math.PI) {
            a -= TWO_PI;
        }
        return a;
    }

    /** Smallest signed difference {@code a - b}, wrapped into (-pi, pi]. */
    public static double difference(double a, double b) {
        return wrap(a - b);
    }
}
