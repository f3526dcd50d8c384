package dev.driftlab.scenario;

import static dev.driftlab.scenario.Findings.fmt;

import dev.driftlab.geometry.Bounds;
import dev.driftlab.geometry.Point;
import dev.driftlab.geometry.Polygon;
import dev.driftlab.geometry.Segment;
import dev.driftlab.geometry.Walls;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.HashSet;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;

/**
 * The validator's checks of the site plan: outlines, ids, doors on their walls, clutter times and the
 * site's extent. After {@link #check()} it also answers the questions the route and fault checks ask
 * of the site: which ids exist, which room holds a point, and whether the robot fits at a point.
 */
final class SiteChecks {

    /** Door clear width below which a warning names the accessibility minimum (ADA 2010 404.2.3). */
    static final double ACCESSIBLE_DOOR_WIDTH = 0.815;

    private final Scenario s;
    private final Findings out;
    private final Map<String, Room> rooms = new HashMap<>();
    private final Set<String> zones = new HashSet<>();
    private final Set<String> doors = new HashSet<>();
    private final Set<String> clutter = new HashSet<>();
    private List<Segment> actualWallsCache;

    SiteChecks(Scenario s, Findings out) {
        this.s = s;
        this.out = out;
    }

    void check() {
        SitePlan site = s.site();
        if (site.rooms().isEmpty()) {
            out.error("site.rooms", "needs at least one room");
        }
        Map<String, String> ids = new HashMap<>();
        for (int i = 0; i < site.rooms().size(); i++) {
            Room r = site.rooms().get(i);
            String p = "site.rooms[" + i + "]";
            out.uniqueId(ids, r.id(), p);
            outline(r.outline(), p + ".outline");
            rooms.put(r.id(), r);
        }
        for (int i = 0; i < site.fixtures().size(); i++) {
            Fixture f = site.fixtures().get(i);
            String p = "site.fixtures[" + i + "]";
            out.uniqueId(ids, f.id(), p);
            if (outline(f.outline(), p + ".outline") && insideNoRoom(f.outline())) {
                out.warning(p + ".outline", "fixture \"" + f.name() + "\" lies outside every room");
            }
        }
        for (int i = 0; i < site.floorZones().size(); i++) {
            FloorZone z = site.floorZones().get(i);
            String p = "site.floorZones[" + i + "]";
            out.uniqueId(ids, z.id(), p);
            outline(z.outline(), p + ".outline");
            out.range(z.slip(), 0, 1, p + ".slip", "");
            out.range(z.noiseFactor(), 0, 20, p + ".noiseFactor", "");
            zones.add(z.id());
        }
        for (int i = 0; i < site.clutter().size(); i++) {
            Clutter c = site.clutter().get(i);
            String p = "site.clutter[" + i + "]";
            out.uniqueId(ids, c.id(), p);
            outline(c.outline(), p + ".outline");
            out.range(c.appearAt(), 0, Limits.MAX_RUN_SECONDS, p + ".appearAt", "s");
            if (c.vanishAt() <= c.appearAt()) {
                out.error(
                        p + ".vanishAt", fmt(c.vanishAt()) + " s is not after appearAt (" + fmt(c.appearAt()) + " s)");
            }
            clutter.add(c.id());
        }
        for (int i = 0; i < site.doors().size(); i++) {
            Door d = site.doors().get(i);
            String p = "site.doors[" + i + "]";
            out.uniqueId(ids, d.id(), p);
            door(d, p);
            doors.add(d.id());
        }
        overlappingDoors();
        extent();
    }

    // ----- what the other checks ask of the site

    /** Whether a room or floor zone has this id. */
    boolean hasPlace(String id) {
        return rooms.containsKey(id) || zones.contains(id);
    }

    boolean hasDoor(String id) {
        return doors.contains(id);
    }

    boolean hasClutter(String id) {
        return clutter.contains(id);
    }

    /** The first room (with a usable outline) that contains the point. */
    Optional<Room> roomAt(Point pt) {
        for (Room r : s.site().rooms()) {
            if (r.outline().corners().size() >= 3 && r.outline().contains(pt)) {
                return Optional.of(r);
            }
        }
        return Optional.empty();
    }

    /**
     * Checks a point is inside a room and clear of fixtures and walls; returns whether it is usable.
     * The robot's footprint reaching a wall is an error at a start ({@code isStart}: the route's start
     * or where a kidnap sets the robot down) and a warning at a waypoint.
     */
    boolean place(Point pt, String p, boolean isStart) {
        Optional<Room> room = roomAt(pt);
        if (room.isEmpty()) {
            out.error(p, "(" + fmt(pt.x()) + ", " + fmt(pt.y()) + ") is outside every room");
            return false;
        }
        for (Fixture f : s.site().fixtures()) {
            if (f.outline().corners().size() >= 3 && f.outline().contains(pt)) {
                out.error(p, "inside fixture \"" + f.name() + "\"");
                return false;
            }
        }
        double r = s.robot().footprintRadius();
        double clearance = wallClearance(pt);
        if (clearance < r) {
            String what = isStart ? "the robot's footprint" : "the robot's footprint at this waypoint";
            if (isStart) {
                out.error(
                        p,
                        "is inside a wall: " + what + " (radius " + fmt(r) + " m) reaches a wall " + fmt(clearance)
                                + " m away");
            } else {
                out.warning(p, what + " (radius " + fmt(r) + " m) touches a wall " + fmt(clearance) + " m away");
            }
            return !isStart;
        }
        return true;
    }

    /**
     * Wall pieces of the real world at the start (actual door states), cut by the same rule as the
     * site compiler's ({@link Walls}); {@code site.WallPieces} is the same two steps, out of reach
     * here because the site stage comes after this one.
     */
    List<Segment> actualWalls() {
        if (actualWallsCache == null) {
            List<Polygon> outlines = new ArrayList<>();
            for (Room r : s.site().rooms()) {
                outlines.add(r.outline());
            }
            List<Segment> openings = new ArrayList<>();
            for (Door d : s.site().doors()) {
                if (d.actual() == DoorState.OPEN) {
                    s.site().opening(d).ifPresent(openings::add);
                }
            }
            actualWallsCache = Walls.pieces(outlines, openings);
        }
        return actualWallsCache;
    }

    /** Distance from a point to the nearest wall piece in the actual world at the start. */
    private double wallClearance(Point pt) {
        double best = Double.POSITIVE_INFINITY;
        for (Segment seg : actualWalls()) {
            best = Math.min(best, seg.distanceTo(pt));
        }
        return best;
    }

    // ----- outlines and doors

    private boolean outline(Polygon poly, String p) {
        int n = poly.corners().size();
        if (n < 3) {
            out.error(p, "needs at least 3 corners, has " + n);
            return false;
        }
        if (n > Limits.MAX_CORNERS) {
            out.error(p, "has " + n + " corners; at most " + Limits.MAX_CORNERS + " are allowed");
            return false;
        }
        for (int i = 0; i < n; i++) {
            if (poly.corners().get(i).equals(poly.corners().get((i + 1) % n))) {
                out.error(p + "[" + ((i + 1) % n) + "]", "repeats the corner before it");
                return false;
            }
        }
        Optional<int[]> crossing = poly.selfCrossing();
        if (crossing.isPresent()) {
            int[] c = crossing.get();
            out.error(p, "crosses itself: edge " + c[0] + " meets edge " + c[1]);
            return false;
        }
        if (poly.area() < 1e-6) {
            out.error(p, "encloses no area");
            return false;
        }
        return true;
    }

    private boolean insideNoRoom(Polygon poly) {
        for (Point c : poly.corners()) {
            if (roomAt(c).isPresent()) {
                return false;
            }
        }
        return true;
    }

    private void door(Door d, String p) {
        Room room = rooms.get(d.room());
        if (room == null) {
            out.error(p + ".room", "no room with id \"" + d.room() + "\"");
            return;
        }
        int walls = room.outline().edgeCount();
        if (walls < 3) {
            return;
        }
        if (d.wall() < 0 || d.wall() >= walls) {
            out.error(p + ".wall", "room \"" + room.name() + "\" has walls 0 to " + (walls - 1) + ", not " + d.wall());
            return;
        }
        if (d.width() <= 0) {
            out.error(p + ".width", "must be more than 0 m");
            return;
        }
        double length = room.outline().edge(d.wall()).length();
        if (d.width() > length) {
            out.error(
                    p + ".width",
                    fmt(d.width()) + " m is wider than wall " + d.wall() + " of room \"" + room.name() + "\" ("
                            + fmt(length) + " m)");
            return;
        }
        double from = d.along() - d.width() / 2;
        double to = d.along() + d.width() / 2;
        if (from < -1e-9 || to > length + 1e-9) {
            out.error(
                    p + ".along",
                    "door spans " + fmt(from) + " to " + fmt(to) + " m along wall " + d.wall() + " of room \""
                            + room.name() + "\", which is " + fmt(length) + " m long");
            return;
        }
        if (!sharedWithAnotherRoom(d)) {
            out.warning(p + ".wall", "the door opens to the outside of the site; no other room lies behind it");
        }
        double across = 2 * s.robot().footprintRadius();
        if (d.width() < across) {
            out.warning(
                    p + ".width",
                    fmt(d.width()) + " m is narrower than the robot (" + fmt(across)
                            + " m across); it cannot pass this door");
        } else if (d.width() < ACCESSIBLE_DOOR_WIDTH) {
            out.warning(
                    p + ".width",
                    fmt(d.width()) + " m is under the 0.815 m accessible clear width (ADA 2010 Standards 404.2.3)");
        }
    }

    private boolean sharedWithAnotherRoom(Door d) {
        Optional<Segment> opening = s.site().opening(d);
        if (opening.isEmpty()) {
            return false;
        }
        for (Room other : s.site().rooms()) {
            if (other.id().equals(d.room()) || other.outline().corners().size() < 3) {
                continue;
            }
            for (int e = 0; e < other.outline().edgeCount(); e++) {
                if (Walls.spanOn(other.outline().edge(e), opening.get()).isPresent()) {
                    return true;
                }
            }
        }
        return false;
    }

    private void overlappingDoors() {
        List<Door> all = s.site().doors();
        for (int i = 0; i < all.size(); i++) {
            for (int j = 0; j < i; j++) {
                Door a = all.get(i);
                Door b = all.get(j);
                if (a.room().equals(b.room())
                        && a.wall() == b.wall()
                        && Math.abs(a.along() - b.along()) < (a.width() + b.width()) / 2) {
                    out.error("site.doors[" + i + "].along", "overlaps door \"" + b.id() + "\" on the same wall");
                }
            }
        }
    }

    private void extent() {
        Bounds b = s.site().bounds().orElse(null);
        if (b == null) {
            return;
        }
        double w = b.width();
        double h = b.height();
        if (w > Limits.MAX_SITE_EXTENT || h > Limits.MAX_SITE_EXTENT) {
            out.error(
                    "site",
                    "spans " + fmt(w) + " m by " + fmt(h) + " m; sites up to " + fmt(Limits.MAX_SITE_EXTENT)
                            + " m across are supported (are the corners in metres?)");
        }
    }
}
