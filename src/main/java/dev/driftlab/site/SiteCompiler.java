package dev.driftlab.site;

import dev.driftlab.geometry.Polygon;
import dev.driftlab.geometry.Segment;
import dev.driftlab.geometry.SegmentSet;
import dev.driftlab.geometry.Walls;
import dev.driftlab.scenario.Clutter;
import dev.driftlab.scenario.Door;
import dev.driftlab.scenario.DoorState;
import dev.driftlab.scenario.Fixture;
import dev.driftlab.scenario.Room;
import dev.driftlab.scenario.SitePlan;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

/**
 * Compiles a site plan into wall segments, door slots, fixtures and clutter.
 *
 * <p>Every door's gap is cut out of the walls by {@link WallPieces} (the one rule: a door opens
 * every wall lying within 1 cm along its opening, because neighbouring rooms are usually drawn with
 * a wall each and the door must open through both); a closed door is a slot segment that blocks
 * the gap on its own wall.
 */
public final class SiteCompiler {

    private SiteCompiler() {}

    /**
     * Compiles a site plan.
     *
     * @throws IllegalArgumentException naming the field when a door refers to a missing room or a
     *     wall index out of range
     */
    public static CompiledSite compile(SitePlan plan) {
        Map<String, Room> rooms = new HashMap<>();
        for (Room r : plan.rooms()) {
            rooms.put(r.id(), r);
        }
        List<DoorSlot> doors = new ArrayList<>();
        for (int k = 0; k < plan.doors().size(); k++) {
            Door d = plan.doors().get(k);
            Room room = rooms.get(d.room());
            if (room == null) {
                throw new IllegalArgumentException("site.doors[" + k + "].room: no room \"" + d.room() + "\"");
            }
            if (d.wall() < 0 || d.wall() >= room.outline().edgeCount()) {
                throw new IllegalArgumentException("site.doors[" + k + "].wall: room \"" + d.room() + "\" has walls 0.."
                        + (room.outline().edgeCount() - 1) + ", got " + d.wall());
            }
            if (d.width() < 0) {
                throw new IllegalArgumentException("site.doors[" + k + "].width: must not be negative");
            }
            Segment span = Walls.gap(room.outline(), d.wall(), d.along(), d.width());
            doors.add(new DoorSlot(d.id(), span, d.mapped() == DoorState.CLOSED, d.actual() == DoorState.CLOSED));
        }
        SegmentSet.Builder walls = SegmentSet.builder();
        for (Segment s : WallPieces.of(plan, d -> DoorState.OPEN)) {
            walls.add(s);
        }
        List<Polygon> fixtures = new ArrayList<>();
        List<String> fixtureNames = new ArrayList<>();
        for (Fixture f : plan.fixtures()) {
            fixtures.add(f.outline());
            fixtureNames.add(f.name());
        }
        List<ClutterItem> clutter = new ArrayList<>();
        for (Clutter c : plan.clutter()) {
            clutter.add(new ClutterItem(c.id(), c.outline(), c.appearAt(), c.vanishAt()));
        }
        return new CompiledSite(walls.build(), doors, fixtures, clutter);
    }
}
