package dev.driftlab.scenario;

import dev.driftlab.geometry.Bounds;
import dev.driftlab.geometry.Point;
import dev.driftlab.geometry.Polygon;
import dev.driftlab.geometry.Pose;
import dev.driftlab.geometry.Segment;
import dev.driftlab.geometry.Walls;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.HashSet;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;
import java.util.Set;

/**
 * Checks a scenario's meaning: ranges, geometry, references between items and sizes. Returns every
 * problem at once, each with the path of the field in the file and a plain message; errors refuse
 * the scenario, warnings allow it (a door narrower than the robot may be the point of the test).
 */
public final class ScenarioValidator {

    /** Door clear width below which a warning names the accessibility minimum (ADA 2010 404.2.3). */
    static final double ACCESSIBLE_DOOR_WIDTH = 0.815;

    private final List<Problem> problems = new ArrayList<>();
    private final Scenario s;
    private final Map<String, Room> rooms = new HashMap<>();
    private final Map<String, FloorZone> zones = new HashMap<>();
    private final Set<String> doors = new HashSet<>();
    private final Set<String> clutter = new HashSet<>();
    private final Set<Problem> baseProblems = new HashSet<>();

    private ScenarioValidator(Scenario s) {
        this.s = s;
    }

    /** Validates a scenario read from a file. */
    public static ValidationReport validate(Scenario scenario) {
        ScenarioValidator v = new ScenarioValidator(scenario);
        v.run();
        return new ValidationReport(v.problems);
    }

    /** Validates one set of localizer settings on its own, with paths under {@code prefix}. */
    public static List<Problem> validateSettings(LocalizerSettings settings, int beams, String prefix) {
        ScenarioValidator v = new ScenarioValidator(null);
        v.settings(settings, beams, prefix);
        return v.problems;
    }

    private void run() {
        site();
        robot();
        rangefinder();
        route();
        faults();
        int before = problems.size();
        settings(s.localizer(), s.rangefinder().beams(), "localizer");
        gridSize(s.localizer(), "localizer");
        baseProblems.addAll(problems.subList(before, problems.size()));
        variants();
        gates();
    }

    // ----- site

    private void site() {
        SitePlan site = s.site();
        if (site.rooms().isEmpty()) {
            error("site.rooms", "needs at least one room");
        }
        Map<String, String> ids = new HashMap<>();
        for (int i = 0; i < site.rooms().size(); i++) {
            Room r = site.rooms().get(i);
            String p = "site.rooms[" + i + "]";
            uniqueId(ids, r.id(), p);
            outline(r.outline(), p + ".outline");
            rooms.put(r.id(), r);
        }
        for (int i = 0; i < site.fixtures().size(); i++) {
            Fixture f = site.fixtures().get(i);
            String p = "site.fixtures[" + i + "]";
            uniqueId(ids, f.id(), p);
            if (outline(f.outline(), p + ".outline") && insideNoRoom(f.outline())) {
                warning(p + ".outline", "fixture \"" + f.name() + "\" lies outside every room");
            }
        }
        for (int i = 0; i < site.floorZones().size(); i++) {
            FloorZone z = site.floorZones().get(i);
            String p = "site.floorZones[" + i + "]";
            uniqueId(ids, z.id(), p);
            outline(z.outline(), p + ".outline");
            range(z.slip(), 0, 1, p + ".slip", "");
            range(z.noiseFactor(), 0, 20, p + ".noiseFactor", "");
            zones.put(z.id(), z);
        }
        for (int i = 0; i < site.clutter().size(); i++) {
            Clutter c = site.clutter().get(i);
            String p = "site.clutter[" + i + "]";
            uniqueId(ids, c.id(), p);
            outline(c.outline(), p + ".outline");
            range(c.appearAt(), 0, Limits.MAX_RUN_SECONDS, p + ".appearAt", "s");
            if (c.vanishAt() <= c.appearAt()) {
                error(p + ".vanishAt", fmt(c.vanishAt()) + " s is not after appearAt (" + fmt(c.appearAt()) + " s)");
            }
            clutter.add(c.id());
        }
        for (int i = 0; i < site.doors().size(); i++) {
            Door d = site.doors().get(i);
            String p = "site.doors[" + i + "]";
            uniqueId(ids, d.id(), p);
            door(d, p);
            doors.add(d.id());
        }
        overlappingDoors();
        extent();
    }

    private boolean outline(Polygon poly, String p) {
        int n = poly.corners().size();
        if (n < 3) {
            error(p, "needs at least 3 corners, has " + n);
            return false;
        }
        if (n > Limits.MAX_CORNERS) {
            error(p, "has " + n + " corners; at most " + Limits.MAX_CORNERS + " are allowed");
            return false;
        }
        for (int i = 0; i < n; i++) {
            if (poly.corners().get(i).equals(poly.corners().get((i + 1) % n))) {
                error(p + "[" + ((i + 1) % n) + "]", "repeats the corner before it");
                return false;
            }
        }
        Optional<int[]> crossing = poly.selfCrossing();
        if (crossing.isPresent()) {
            int[] c = crossing.get();
            error(p, "crosses itself: edge " + c[0] + " meets edge " + c[1]);
            return false;
        }
        if (poly.area() < 1e-6) {
            error(p, "encloses no area");
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
            error(p + ".room", "no room with id \"" + d.room() + "\"");
            return;
        }
        int walls = room.outline().edgeCount();
        if (walls < 3) {
            return;
        }
        if (d.wall() < 0 || d.wall() >= walls) {
            error(p + ".wall", "room \"" + room.name() + "\" has walls 0 to " + (walls - 1) + ", not " + d.wall());
            return;
        }
        if (d.width() <= 0) {
            error(p + ".width", "must be more than 0 m");
            return;
        }
        double length = room.outline().edge(d.wall()).length();
        if (d.width() > length) {
            error(
                    p + ".width",
                    fmt(d.width()) + " m is wider than wall " + d.wall() + " of room \"" + room.name() + "\" ("
                            + fmt(length) + " m)");
            return;
        }
        double from = d.along() - d.width() / 2;
        double to = d.along() + d.width() / 2;
        if (from < -1e-9 || to > length + 1e-9) {
            error(
                    p + ".along",
                    "door spans " + fmt(from) + " to " + fmt(to) + " m along wall " + d.wall() + " of room \""
                            + room.name() + "\", which is " + fmt(length) + " m long");
            return;
        }
        if (!sharedWithAnotherRoom(d)) {
            warning(p + ".wall", "the door opens to the outside of the site; no other room lies behind it");
        }
        double across = 2 * s.robot().footprintRadius();
        if (d.width() < across) {
            warning(
                    p + ".width",
                    fmt(d.width()) + " m is narrower than the robot (" + fmt(across)
                            + " m across); it cannot pass this door");
        } else if (d.width() < ACCESSIBLE_DOOR_WIDTH) {
            warning(
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
                    error("site.doors[" + i + "].along", "overlaps door \"" + b.id() + "\" on the same wall");
                }
            }
        }
    }

    private void extent() {
        Bounds b = siteBounds();
        if (b == null) {
            return;
        }
        double w = b.width();
        double h = b.height();
        if (w > Limits.MAX_SITE_EXTENT || h > Limits.MAX_SITE_EXTENT) {
            error(
                    "site",
                    "spans " + fmt(w) + " m by " + fmt(h) + " m; sites up to " + fmt(Limits.MAX_SITE_EXTENT)
                            + " m across are supported (are the corners in metres?)");
        }
    }

    private Bounds siteBounds() {
        return s.site().bounds().orElse(null);
    }

    private void gridSize(LocalizerSettings settings, String prefix) {
        Bounds b = siteBounds();
        double cell = settings.rangeModel().cellSize();
        if (b == null || !(cell > 0)) {
            return;
        }
        double cells = Math.ceil(b.width() / cell + 1) * Math.ceil(b.height() / cell + 1);
        if (cells > Limits.MAX_GRID_CELLS) {
            double needed = Math.sqrt(b.width() * b.height() / Limits.MAX_GRID_CELLS);
            error(
                    prefix + ".rangeModel.cellSize",
                    fmt(cell) + " m cells give " + String.format(Locale.ROOT, "%.0f", cells)
                            + " grid cells for this site; use at least " + fmt(Math.ceil(needed * 100) / 100) + " m");
        }
    }

    // ----- robot and sensor

    private void robot() {
        SettingsChecks.robot(s.robot(), problems);
    }

    private void rangefinder() {
        SettingsChecks.rangefinder(s.rangefinder(), problems);
    }

    // ----- route

    private void route() {
        Route route = s.route();
        Pose start = route.start();
        place(start.position(), "route.start", true);
        List<Waypoint> w = route.waypoints();
        if (w.isEmpty()) {
            warning("route.waypoints", "is empty; the robot will stand still");
        }
        if (w.size() > Limits.MAX_WAYPOINTS) {
            error(
                    "route.waypoints",
                    "has " + w.size() + " waypoints; at most " + Limits.MAX_WAYPOINTS + " are allowed");
            return;
        }
        Point prev = start.position();
        for (int i = 0; i < w.size(); i++) {
            Waypoint wp = w.get(i);
            String p = "route.waypoints[" + i + "]";
            if (wp.speed() <= 0) {
                error(p + ".speed", "must be more than 0 m/s");
            } else if (wp.speed() > s.robot().maxSpeed()) {
                warning(
                        p + ".speed",
                        fmt(wp.speed()) + " m/s is above the robot's top speed; it will drive at "
                                + fmt(s.robot().maxSpeed()) + " m/s");
            }
            range(wp.dwell(), 0, 3600, p + ".dwell", "s");
            Point here = new Point(wp.x(), wp.y());
            if (place(here, p, false)) {
                legThroughWall(prev, here, p);
            }
            prev = here;
        }
        range(route.settle(), 0, 600, "route.settle", "s");
        double seconds = RouteTiming.runSeconds(route, s.robot());
        if (seconds > Limits.MAX_RUN_SECONDS) {
            error(
                    "route",
                    "takes about " + fmt(seconds) + " s; runs up to " + fmt(Limits.MAX_RUN_SECONDS)
                            + " s are supported");
        }
    }

    /** Checks a point is inside a room and clear of fixtures and walls; returns whether it is usable. */
    private boolean place(Point pt, String p, boolean isStart) {
        Optional<Room> room = roomAt(pt);
        if (room.isEmpty()) {
            error(p, "(" + fmt(pt.x()) + ", " + fmt(pt.y()) + ") is outside every room");
            return false;
        }
        for (Fixture f : s.site().fixtures()) {
            if (f.outline().corners().size() >= 3 && f.outline().contains(pt)) {
                error(p, "inside fixture \"" + f.name() + "\"");
                return false;
            }
        }
        double r = s.robot().footprintRadius();
        double clearance = wallClearance(pt);
        if (clearance < r) {
            String what = isStart ? "the robot's footprint" : "the robot's footprint at this waypoint";
            if (isStart) {
                error(
                        p,
                        "is inside a wall: " + what + " (radius " + fmt(r) + " m) reaches a wall " + fmt(clearance)
                                + " m away");
            } else {
                warning(p, what + " (radius " + fmt(r) + " m) touches a wall " + fmt(clearance) + " m away");
            }
            return isStart ? false : true;
        }
        return true;
    }

    private Optional<Room> roomAt(Point pt) {
        for (Room r : s.site().rooms()) {
            if (r.outline().corners().size() >= 3 && r.outline().contains(pt)) {
                return Optional.of(r);
            }
        }
        return Optional.empty();
    }

    /** Distance from a point to the nearest wall piece in the actual world at the start. */
    private double wallClearance(Point pt) {
        double best = Double.POSITIVE_INFINITY;
        for (Segment seg : actualWalls()) {
            best = Math.min(best, seg.distanceTo(pt));
        }
        return best;
    }

    private List<Segment> actualWallsCache;

    /**
     * Wall pieces of the real world at the start (actual door states), cut by the same rule as the
     * site compiler's ({@link Walls}); {@code site.WallPieces} is the same two steps, out of reach
     * here because the site stage comes after this one.
     */
    private List<Segment> actualWalls() {
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

    private void legThroughWall(Point from, Point to, String p) {
        Segment leg = new Segment(from, to);
        for (Segment wall : actualWalls()) {
            if (leg.intersects(wall)) {
                warning(
                        p,
                        "the leg from (" + fmt(from.x()) + ", " + fmt(from.y()) + ") crosses a wall; "
                                + "the robot will stop there");
                return;
            }
        }
        for (Fixture f : s.site().fixtures()) {
            Polygon o = f.outline();
            for (int e = 0; e < o.edgeCount() && o.corners().size() >= 3; e++) {
                if (leg.intersects(o.edge(e))) {
                    warning(p, "the leg to this waypoint runs through fixture \"" + f.name() + "\"");
                    return;
                }
            }
        }
    }

    // ----- faults

    private void faults() {
        List<Fault> faults = s.faults();
        if (faults.size() > Limits.MAX_FAULTS) {
            error("faults", "has " + faults.size() + " faults; at most " + Limits.MAX_FAULTS + " are allowed");
            return;
        }
        double end = RouteTiming.runSeconds(s.route(), s.robot());
        Map<String, String> ids = new HashMap<>();
        for (int i = 0; i < faults.size(); i++) {
            Fault f = faults.get(i);
            String p = "faults[" + i + "]";
            uniqueId(ids, f.id(), p);
            trigger(f.trigger(), p, end);
            if (f instanceof Fault.Slip slip) {
                range(slip.fraction(), 0, 1, p + ".fraction", "");
                duration(slip.duration(), p);
            } else if (f instanceof Fault.Stall stall) {
                duration(stall.duration(), p);
            } else if (f instanceof Fault.Kidnap k) {
                place(k.to().position(), p + ".to", true);
            } else if (f instanceof Fault.Bump b) {
                range(b.forward(), -1, 1, p + ".forward", "m");
                range(b.left(), -1, 1, p + ".left", "m");
                range(b.turn(), -Math.PI / 2, Math.PI / 2, p + ".turn", "rad");
            } else if (f instanceof Fault.DoorChange d) {
                if (!doors.contains(d.door())) {
                    error(p + ".door", "no door with id \"" + d.door() + "\"");
                }
            } else if (f instanceof Fault.ClutterChange c) {
                if (!clutter.contains(c.clutter())) {
                    error(p + ".clutter", "no clutter with id \"" + c.clutter() + "\"");
                }
            } else if (f instanceof Fault.Blackout b) {
                duration(b.duration(), p);
            } else if (f instanceof Fault.NoiseBurst n) {
                duration(n.duration(), p);
                range(n.factor(), 1, 100, p + ".factor", "");
            } else if (f instanceof Fault.SpuriousMaxRange m) {
                duration(m.duration(), p);
                range(m.share(), 0, 1, p + ".share", "");
            }
        }
    }

    private void trigger(Trigger t, String p, double end) {
        if (t instanceof Trigger.AtTime at) {
            if (at.time() < 0) {
                error(p + ".at", "must be 0 s or later");
            } else if (at.time() > end) {
                error(p + ".at", fmt(at.time()) + " s is after the route ends (about " + fmt(end) + " s)");
            }
        } else if (t instanceof Trigger.OnEntering on) {
            if (!rooms.containsKey(on.place()) && !zones.containsKey(on.place())) {
                error(p + ".enters", "no room or floor zone with id \"" + on.place() + "\"");
            }
        } else if (t instanceof Trigger.NearPoint near) {
            positive(near.radius(), 100, p + ".near.radius", "m");
            if (roomAt(near.point()).isEmpty()) {
                error(
                        p + ".near",
                        "(" + fmt(near.point().x()) + ", " + fmt(near.point().y()) + ") is outside every room");
            }
        }
    }

    private void duration(double d, String p) {
        if (d <= 0) {
            error(p + ".duration", "must be more than 0 s");
        } else if (d > Limits.MAX_RUN_SECONDS) {
            error(
                    p + ".duration",
                    fmt(d) + " s is longer than the longest run (" + fmt(Limits.MAX_RUN_SECONDS) + " s)");
        }
    }

    // ----- localizer settings

    private void settings(LocalizerSettings ls, int beams, String prefix) {
        SettingsChecks.localizer(ls, beams, prefix, problems);
    }

    private void variants() {
        List<SettingsVariant> vs = s.variants();
        if (vs.size() > Limits.MAX_VARIANTS) {
            error("variants", "has " + vs.size() + " variants; at most " + Limits.MAX_VARIANTS + " are allowed");
            return;
        }
        Set<String> names = new HashSet<>();
        names.add("base");
        for (int i = 0; i < vs.size(); i++) {
            SettingsVariant v = vs.get(i);
            String p = "variants[" + i + "]";
            if (v.name().isBlank()) {
                error(p + ".name", "must not be empty");
            } else if (!names.add(v.name())) {
                error(p + ".name", "\"" + v.name() + "\" is used twice (\"base\" is the scenario's own settings)");
            }
            // report only what the variant gets wrong itself; problems it inherits are reported on the base
            int before = problems.size();
            settings(v.settings(), s.rangefinder().beams(), p + ".localizer");
            gridSize(v.settings(), p + ".localizer");
            List<Problem> own = new ArrayList<>(problems.subList(before, problems.size()));
            problems.subList(before, problems.size()).clear();
            String prefix = p + ".localizer";
            for (Problem q : own) {
                Problem asBase =
                        new Problem(q.severity(), "localizer" + q.path().substring(prefix.length()), q.message());
                if (!baseProblems.contains(asBase)) {
                    problems.add(q);
                }
            }
        }
    }

    private void gates() {
        GateChecks.check(s, problems);
    }

    // ----- helpers

    private void uniqueId(Map<String, String> ids, String id, String p) {
        if (id.isBlank()) {
            error(p + ".id", "must not be empty");
            return;
        }
        String previous = ids.putIfAbsent(id, p);
        if (previous != null) {
            error(p + ".id", "\"" + id + "\" is already the id of " + previous);
        }
    }

    private boolean range(double v, double min, double max, String p, String unit) {
        if (v < min || v > max) {
            error(
                    p,
                    fmt(v) + unitText(unit) + " is out of range; allowed " + fmt(min) + " to " + fmt(max)
                            + unitText(unit));
            return false;
        }
        return true;
    }

    private void positive(double v, double max, String p, String unit) {
        if (v <= 0) {
            error(p, "must be more than 0" + unitText(unit) + ", got " + fmt(v));
        } else if (v > max) {
            error(p, fmt(v) + unitText(unit) + " is more than the maximum of " + fmt(max) + unitText(unit));
        }
    }

    private static String unitText(String unit) {
        return unit.isEmpty() ? "" : " " + unit;
    }

    private void error(String path, String message) {
        problems.add(Problem.error(path, message));
    }

    private void warning(String path, String message) {
        problems.add(Problem.warning(path, message));
    }

    /** Short number text: up to 3 decimals, no trailing zeros. */
    static String fmt(double v) {
        if (v == Math.rint(v) && Math.abs(v) < 1e15) {
            return String.format(Locale.ROOT, "%.0f", v);
        }
        String t = String.format(Locale.ROOT, "%.3f", v);
        t = t.replaceAll("0+$", "");
        return t.endsWith(".") ? t.substring(0, t.length() - 1) : t;
    }
}
