package dev.driftlab.geometry;

/**
 * Casts rays in the site frame and reports the distance to the first obstacle.
 *
 * <p>Implementations are safe to call from many threads once built and allocate nothing per ray.
 */
public interface RayCaster {

    /**
     * Distance from the origin along the ray to the first obstacle, in metres.
     *
     * @param x ray origin, east, metres
     * @param y ray origin, north, metres
     * @param angle ray direction in radians, counter-clockwise from +x (any value; not wrapped)
     * @param maxRange longest distance of interest in metres, positive
     * @return the hit distance in [0, maxRange]; exactly {@code maxRange} when nothing is hit within
     *     it (a miss). An origin on or inside an obstacle may report 0.
     */
    double cast(double x, double y, double angle, double maxRange);

    /**
     * Casts along a unit direction instead of an angle, so callers that already hold the cosine and
     * sine (rotated beam directions) skip the trigonometry. Same frame, units and miss value as
     * {@link #cast}.
     *
     * @param x ray origin east, metres
     * @param y ray origin north, metres
     * @param dirX east component of the unit direction
     * @param dirY north component of the unit direction
     * @param maxRange longest range reported, metres
     * @return distance to the first hit, or exactly {@code maxRange} on a miss
     */
    default double castAlong(double x, double y, double dirX, double dirY, double maxRange) {
        return cast(x, y, Math.atan2(dirY, dirX), maxRange);
    }
}
