package dev.driftlab.scenario;

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
