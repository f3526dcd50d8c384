package dev.driftlab.scenario;

import static dev.driftlab.scenario.Findings.fmt;

import dev.driftlab.geometry.Point;
import dev.driftlab.geometry.Polygon;
import dev.driftlab.geometry.Pose;
import dev.driftlab.geometry.Segment;
import java.util.List;

/**
 * The validator's checks of the route: the start and every waypoint lie in a room where the robot
 * fits, speeds and dwells are in range, legs that cross walls or fixtures are named, and the whole run
 * fits in the longest supported run.
 */
final class RouteChecks {

    private final Scenario s;
    private final SiteChecks site;
    private final Findings out;

    private RouteChecks(Scenario s, SiteChecks site, Findings out) {
        this.s = s;
        this.site = site;
        this.out = out;
    }

    /** Checks the route of {@code s} against its site, whose checks have run. */
    static void check(Scenario s, SiteChecks site, Findings out) {
        new RouteChecks(s, site, out).route();
    }

    private void route() {
        Route route = s.route();
        Pose start = route.start();
        site.place(start.position(), "route.start", true);
        List<Waypoint> w = route.waypoints();
        if (w.isEmpty()) {
            out.warning("route.waypoints", "is empty; the robot will stand still");
        }
        if (w.size() > Limits.MAX_WAYPOINTS) {
            out.error(
                    "route.waypoints",
                    "has " + w.size() + " waypoints; at most " + Limits.MAX_WAYPOINTS + " are allowed");
            return;
        }
        Point prev = start.position();
        for (int i = 0; i < w.size(); i++) {
            Waypoint wp = w.get(i);
            String p = "route.waypoints[" + i + "]";
            if (wp.speed() <= 0) {
                out.error(p + ".speed", "must be more than 0 m/s");
            } else if (wp.speed() > s.robot().maxSpeed()) {
                out.warning(
                        p + ".speed",
                        fmt(wp.speed()) + " m/s is above the robot's top speed; it will drive at "
                                + fmt(s.robot().maxSpeed()) + " m/s");
            }
            out.range(wp.dwell(), 0, 3600, p + ".dwell", "s");
            Point here = new Point(wp.x(), wp.y());
            if (site.place(here, p, false)) {
                legThroughWall(prev, here, p);
            }
            prev = here;
        }
        out.range(route.settle(), 0, 600, "route.settle", "s");
        double seconds = RouteTiming.runSeconds(route, s.robot());
        if (seconds > Limits.MAX_RUN_SECONDS) {
            out.error(
                    "route",
                    "takes about " + fmt(seconds) + " s; runs up to " + fmt(Limits.MAX_RUN_SECONDS)
                            + " s are supported");
        }
    }

    private void legThroughWall(Point from, Point to, String p) {
        Segment leg = new Segment(from, to);
        for (Segment wall : site.actualWalls()) {
            if (leg.intersects(wall)) {
                out.warning(
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
                    out.warning(p, "the leg to this waypoint runs through fixture \"" + f.name() + "\"");
                    return;
                }
            }
        }
    }
}
