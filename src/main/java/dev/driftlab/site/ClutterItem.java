package dev.driftlab.site;

import dev.driftlab.geometry.Polygon;

/**
 * A clutter object as compiled: a solid outline with the time window it stands in.
 *
 * @param id clutter id from the site plan
 * @param outline solid outline, metres
 * @param appearAt seconds from the run start when it appears
 * @param vanishAt seconds when it vanishes; positive infinity for never
 */
public record ClutterItem(String id, Polygon outline, double appearAt, double vanishAt) {
    /** Checks presence. */
    public ClutterItem {
        if (id == null || outline == null) {
            throw new IllegalArgumentException("clutter id and outline must be given");
        }
    }

    /** Whether the schedule has it standing at time t (seconds). */
    public boolean scheduledAt(double t) {
        return t >= appearAt && t < vanishAt;
    }
}
