package dev.driftlab.site;

import dev.driftlab.geometry.Point;
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
 * <p>A door's gap is cut out of its own wall and out of every other room's wall that lies on the
 * same line over the gap, because neighbouring rooms are usually drawn with a shared wall each and
 * the door must open through both.
 */
public final class SiteCompiler {

    /** Distance in metres within which another room's wall counts as the same wall as a door's. */
    private static final double SHARED_WALL_TOLERANCE = 1e-6;

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
        for (Room r : plan.rooms()) {
            for (Segment s : cutRoom(r.outline(), doors)) {
                walls.add(s);
            }
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

    /** The wall pieces of one outline with every door gap that lies on one of its edges cut out. */
    static List<Segment> cutRoom(Polygon outline, List<DoorSlot> doors) {
        int n = outline.edgeCount();
        List<int[]> wallIdx = new ArrayList<>();
        List<double[]> spans = new ArrayList<>();
        for (int i = 0; i < n; i++) {
            Segment edge = outline.edge(i);
            double len = edge.length();
            if (len == 0) {
                continue;
            }
            for (DoorSlot d : doors) {
                double[] s = onEdge(edge, len, d.span());
                if (s != null) {
                    wallIdx.add(new int[] {i});
                    spans.add(s);
                }
            }
        }
        int m = spans.size();
        int[] gapWall = new int[m];
        double[] along = new double[m];
        double[] width = new double[m];
        for (int k = 0; k < m; k++) {
            gapWall[k] = wallIdx.get(k)[0];
            along[k] = (spans.get(k)[0] + spans.get(k)[1]) / 2;
            width[k] = spans.get(k)[1] - spans.get(k)[0];
        }
        return Walls.cut(outline, gapWall, along, width);
    }

    /** Distances along the edge of the span's ends, sorted, if the span lies on the edge's line. */
    private static double[] onEdge(Segment edge, double len, Segment span) {
        Point a = edge.a();
        double ux = (edge.b().x() - a.x()) / len;
        double uy = (edge.b().y() - a.y()) / len;
        double[] along = new double[2];
        Point[] ends = {span.a(), span.b()};
        for (int e = 0; e < 2; e++) {
            double rx = ends[e].x() - a.x();
            double ry = ends[e].y() - a.y();
            double off = rx * uy - ry * ux;
            if (Math.abs(off) > SHARED_WALL_TOLERANCE) {
                return null;
            }
            along[e] = rx * ux + ry * uy;
        }
        double s = Math.max(0, Math.min(along[0], along[1]));
        double t = Math.min(len, Math.max(along[0], along[1]));
        return t > s ? new double[] {s, t} : null;
    }
}
