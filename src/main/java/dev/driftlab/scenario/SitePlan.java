package dev.driftlab.scenario;

import java.util.List;

/**
 * The floor plan: rooms, doors, fixtures, floor zones and clutter.
 *
 * @param rooms closed wall outlines
 * @param doors openings on room walls
 * @param fixtures solid objects the map knows about
 * @param floorZones surfaces with their own grip
 * @param clutter objects that are not on the map
 */
public record SitePlan(
        List<Room> rooms, List<Door> doors, List<Fixture> fixtures, List<FloorZone> floorZones, List<Clutter> clutter) {
    /** Copies all lists. */
    public SitePlan {
        rooms = List.copyOf(rooms);
        doors = List.copyOf(doors);
        fixtures = List.copyOf(fixtures);
        floorZones = List.copyOf(floorZones);
        clutter = List.copyOf(clutter);
    }

    /**
     * Bounding box of all room corners as {minX, minY, maxX, maxY} in metres, or empty when no room
     * has a corner.
     */
    public java.util.Optional<double[]> bounds() {
        double[] b = {
            Double.POSITIVE_INFINITY, Double.POSITIVE_INFINITY, Double.NEGATIVE_INFINITY, Double.NEGATIVE_INFINITY
        };
        boolean any = false;
        for (Room r : rooms) {
            for (dev.driftlab.geometry.Point c : r.outline().corners()) {
                b[0] = Math.min(b[0], c.x());
                b[1] = Math.min(b[1], c.y());
                b[2] = Math.max(b[2], c.x());
                b[3] = Math.max(b[3], c.y());
                any = true;
            }
        }
        return any ? java.util.Optional.of(b) : java.util.Optional.empty();
    }
}
