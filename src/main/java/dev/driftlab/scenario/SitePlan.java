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
}
