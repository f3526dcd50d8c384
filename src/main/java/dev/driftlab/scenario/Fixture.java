package dev.driftlab.scenario;

import dev.driftlab.geometry.Polygon;

/**
 * Furniture, shelving or a pillar that the map knows about: a solid polygon.
 *
 * @param id unique id within the site plan
 * @param name display name, e.g. "Shelf 2"
 * @param outline corners in metres
 */
public record Fixture(String id, String name, Polygon outline) {
    /** Checks presence of all parts. */
    public Fixture {
        Checks.present(id, "id");
        Checks.present(name, "name");
        Checks.present(outline, "outline");
    }
}
