package dev.driftlab.scenario;

import dev.driftlab.geometry.Bounds;
import dev.driftlab.geometry.Segment;
import dev.driftlab.geometry.Walls;
import java.util.List;
import java.util.Optional;

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

    /** Bounding box of all room corners in metres, or empty when no room has a corner. */
    public Optional<Bounds> bounds() {
        Bounds b = null;
        for (Room r : rooms) {
            if (!r.outline().corners().isEmpty()) {
                b = b == null ? r.outline().bounds() : b.union(r.outline().bounds());
            }
        }
        return Optional.ofNullable(b);
    }

    /**
     * The segment across a door's opening on its own wall, or empty when the door does not fit a
     * wall (no such room, an outline of fewer than three corners, a wall index out of range, a wall
     * of zero length, no width; the validator reports each). Which walls the opening cuts is
     * {@link Walls}' rule, applied to a whole plan by {@code site.WallPieces}.
     */
    public Optional<Segment> opening(Door d) {
        for (Room r : rooms) {
            if (!r.id().equals(d.room())) {
                continue;
            }
            if (r.outline().corners().size() < 3
                    || d.wall() < 0
                    || d.wall() >= r.outline().edgeCount()
                    || r.outline().edge(d.wall()).length() == 0
                    || !(d.width() > 0)) {
                return Optional.empty();
            }
            Segment g = Walls.gap(r.outline(), d.wall(), d.along(), d.width());
            return g.length() > 0 ? Optional.of(g) : Optional.empty();
        }
        return Optional.empty();
    }
}
