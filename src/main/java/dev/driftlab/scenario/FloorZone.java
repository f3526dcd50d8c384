package dev.driftlab.scenario;

import dev.driftlab.geometry.Polygon;

/**
 * An area of floor whose surface changes how the wheels grip.
 *
 * @param id unique id within the site plan
 * @param name display name
 * @param surface kind of surface
 * @param outline corners in metres
 * @param slip fraction of wheel motion lost on this surface, 0 to 1
 * @param noiseFactor multiplier on the robot's random wheel noise while on this surface, at least 0
 */
public record FloorZone(String id, String name, Surface surface, Polygon outline, double slip, double noiseFactor) {
    /** Checks presence and finiteness. */
    public FloorZone {
        Checks.present(id, "id");
        Checks.present(name, "name");
        Checks.present(surface, "surface");
        Checks.present(outline, "outline");
        Checks.finite(slip, "slip");
        Checks.finite(noiseFactor, "noiseFactor");
    }
}
