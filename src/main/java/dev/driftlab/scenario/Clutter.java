package dev.driftlab.scenario;

import dev.driftlab.geometry.Polygon;

/**
 * Something that is really there but not on the map: a person, a cart, a box.
 *
 * @param id unique id within the site plan
 * @param name display name
 * @param outline corners in metres
 * @param appearAt time in seconds from the run start when it appears (0 = present from the start)
 * @param vanishAt time in seconds when it vanishes; {@link Double#POSITIVE_INFINITY} for never
 */
public record Clutter(String id, String name, Polygon outline, double appearAt, double vanishAt) {
    /** Checks presence; {@code vanishAt} may be positive infinity. */
    public Clutter {
        Checks.present(id, "id");
        Checks.present(name, "name");
        Checks.present(outline, "outline");
        Checks.finite(appearAt, "appearAt");
        if (Double.isNaN(vanishAt) || vanishAt == Double.NEGATIVE_INFINITY) {
            throw new IllegalArgumentException("vanishAt must be a time or positive infinity");
        }
    }

    /** Whether the clutter stands in the world at time t (seconds). */
    public boolean presentAt(double t) {
        return t >= appearAt && t < vanishAt;
    }
}
