package dev.driftlab.scenario;

import dev.driftlab.geometry.Point;
import dev.driftlab.geometry.Segment;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import java.util.function.Function;

/**
 * Wall pieces of a site plan. A door opens every wall that lies along its opening (within 1 cm),
 * so a door on the shared wall of two rooms is one passage, not two walls with one hole. The
 * cutting itself is {@link dev.driftlab.geometry.Walls#cutSpans}, shared with the site compiler.
 */
public final class Walls {

    /** How far (metres) a wall may lie from a door's opening and still count as the same wall. */
    public static final double SAME_WALL = 0.01;

    private Walls() {}

    /**
     * The ends of a door's opening on its own wall, or empty when the door does not fit its wall
     * (the validator reports that).
     */
    public static Optional<Segment> opening(SitePlan site, Door d) {
        Room r = room(site, d.room());
        if (r == null
                || r.outline().corners().size() < 3
                || d.wall() < 0
                || d.wall() >= r.outline().edgeCount()) {
            return Optional.empty();
        }
        if (r.outline().edge(d.wall()).length() == 0 || !(d.width() > 0)) {
            return Optional.empty();
        }
        Segment g = dev.driftlab.geometry.Walls.gap(r.outline(), d.wall(), d.along(), d.width());
        return g.length() > 0 ? Optional.of(g) : Optional.empty();
    }

    /**
     * The span of a door's opening along an edge, in metres from the edge's first corner, when the
     * edge lies along the opening.
     */
    public static Optional<double[]> spanOn(SitePlan site, Door d, Segment edge) {
        Optional<Segment> open = opening(site, d);
        double el = edge.length();
        if (open.isEmpty() || el == 0) {
            return Optional.empty();
        }
        Point p0 = open.get().a();
        Point p1 = open.get().b();
        if (edge.distanceTo(p0) > SAME_WALL || edge.distanceTo(p1) > SAME_WALL) {
            return Optional.empty();
        }
        double ex = (edge.b().x() - edge.a().x()) / el;
        double ey = (edge.b().y() - edge.a().y()) / el;
        double a = (p0.x() - edge.a().x()) * ex + (p0.y() - edge.a().y()) * ey;
        double b = (p1.x() - edge.a().x()) * ex + (p1.y() - edge.a().y()) * ey;
        return Optional.of(new double[] {Math.max(0, Math.min(a, b)), Math.min(el, Math.max(a, b))});
    }

    /**
     * All wall pieces: room edges with the openings of open doors cut out. A closed door leaves its
     * wall whole (the door leaf stands in the opening).
     *
     * @param site the plan
     * @param state which state of each door to use: {@code Door::mapped} for the believed map,
     *     {@code Door::actual} for the real world at the start
     */
    public static List<Segment> pieces(SitePlan site, Function<Door, DoorState> state) {
        List<Segment> out = new ArrayList<>();
        for (Room r : site.rooms()) {
            if (r.outline().corners().size() < 3) {
                continue;
            }
            for (int e = 0; e < r.outline().edgeCount(); e++) {
                Segment edge = r.outline().edge(e);
                List<double[]> gaps = new ArrayList<>();
                for (Door d : site.doors()) {
                    if (state.apply(d) == DoorState.OPEN) {
                        spanOn(site, d, edge).ifPresent(gaps::add);
                    }
                }
                out.addAll(dev.driftlab.geometry.Walls.cutSpans(edge, gaps));
            }
        }
        return out;
    }

    private static Room room(SitePlan site, String id) {
        for (Room r : site.rooms()) {
            if (r.id().equals(id)) {
                return r;
            }
        }
        return null;
    }
}
