package dev.driftlab.localizer;

/**
 * Casts a ray through the believed map and reports how far it travels before it meets an
 * obstacle. The beam model calls it once per particle and beam, so implementations should not
 * allocate.
 */
@FunctionalInterface
public interface BeamCaster {

    /**
     * Distance to the first obstacle along a ray.
     *
     * @param x start x in metres, site frame
     * @param y start y in metres, site frame
     * @param angle ray direction in radians, counter-clockwise from +x, site frame
     * @param maxRange longest distance of interest in metres
     * @return distance in metres in [0, maxRange]; exactly {@code maxRange} when nothing is hit
     */
    double cast(double x, double y, double angle, double maxRange);

    /**
     * Casts along a unit direction (cosine and sine of the beam angle in the site frame); lets the
     * beam model rotate beam directions without trigonometry per ray.
     */
    default double castAlong(double x, double y, double dirX, double dirY, double maxRange) {
        return cast(x, y, Math.atan2(dirY, dirX), maxRange);
    }

    /**
     * Casts a batch of rays, each from its own origin: ray k from (x[k], y[k]) along the unit
     * direction (dirX[k], dirY[k]), range into out[k]. The beam model hands over the beams of many
     * particles at once so a fast caster can keep many rays in flight.
     */
    default void castRays(
            double[] x, double[] y, double[] dirX, double[] dirY, int from, int count, double maxRange, double[] out) {
        for (int k = from; k < from + count; k++) {
            out[k] = castAlong(x[k], y[k], dirX[k], dirY[k], maxRange);
        }
    }
}
