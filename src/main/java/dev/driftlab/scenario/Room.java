package dev.driftlab.scenario;

import dev.driftlab.geometry.Polygon;

/**
 * A closed outline of walls. Its edges are walls except where a door sits on them.
 *
 * @param id unique id within the site plan
 * @param name display name, e.g. "Ward corridor"
 * @param outline corners in metres; edge i runs from corner i to corner i+1
 */
public record Room(String id, String name, Polygon outline) {
    /** Checks presence of all parts. */
    public Room {
        Checks.present(id, "id");
        Checks.present(name, "name");
        Checks.present(outline, "outline");
    }
}
