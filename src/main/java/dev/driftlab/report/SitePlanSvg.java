package dev.driftlab.report;

import dev.driftlab.geometry.Bounds;
import dev.driftlab.geometry.Point;
import dev.driftlab.geometry.Polygon;
import dev.driftlab.geometry.Pose;
import dev.driftlab.geometry.Segment;
import dev.driftlab.scenario.Clutter;
import dev.driftlab.scenario.Door;
import dev.driftlab.scenario.DoorState;
import dev.driftlab.scenario.Fault;
import dev.driftlab.scenario.Fixture;
import dev.driftlab.scenario.FloorZone;
import dev.driftlab.scenario.Room;
import dev.driftlab.scenario.Scenario;
import dev.driftlab.scenario.Surface;
import dev.driftlab.scenario.Waypoint;
import dev.driftlab.site.WallPieces;
import java.util.List;
import java.util.Locale;

/**
 * Draws a scenario's site plan as a standalone SVG: rooms, walls with doors in their mapped state,
 * fixtures, floor zones, clutter (dashed: not on the map), the route and kidnap targets. North is
 * up. Every text from the scenario is XML-escaped, so the output is safe to inline in a page.
 */
public final class SitePlanSvg {

    /** Pixels per metre at the natural size; the SVG scales with its container. */
    private static final double SCALE = 40;
    /** Margin around the site, metres. */
    private static final double MARGIN = 0.6;

    private final StringBuilder sb = new StringBuilder(8192);
    private double minX;
    private double maxY;

    private SitePlanSvg() {}

    /**
     * Renders the site plan.
     *
     * @param scenario the scenario; any validation state is accepted, malformed outlines are skipped
     * @return an {@code <svg>} element as text
     */
    public static String render(Scenario scenario) {
        return plan(scenario).svg();
    }

    /**
     * The plan ready to draw, with the number of elements its drawing will have, known before any
     * markup is written: a caller with a size budget asks {@link Plan#elements()} first and draws
     * only what fits, so a site of ten thousand rooms costs its wall list, not megabytes of text.
     *
     * @param scenario the scenario; any validation state is accepted, malformed outlines are skipped
     */
    public static Plan plan(Scenario scenario) {
        List<Segment> walls = WallPieces.of(scenario.site(), d -> DoorState.OPEN);
        return new Plan(scenario, walls, count(scenario, walls));
    }

    /** A site plan whose drawing's size is known before it is drawn. */
    public static final class Plan {
        private final Scenario scenario;
        private final List<Segment> walls;
        private final int elements;

        private Plan(Scenario scenario, List<Segment> walls, int elements) {
            this.scenario = scenario;
            this.walls = walls;
            this.elements = elements;
        }

        /** Opening tags the drawing has, the outer {@code <svg>} included. */
        public int elements() {
            return elements;
        }

        /** The drawing as an {@code <svg>} element. */
        public String svg() {
            return new SitePlanSvg().draw(scenario, walls);
        }
    }

    /** Elements {@link #draw} writes, counted the way it writes them (kept beside it on purpose). */
    private static int count(Scenario s, List<Segment> walls) {
        int n = 1 + 1 + 6 + 1; // svg, title, defs (defs, pattern, rect, line, marker, path), style
        for (Room r : s.site().rooms()) {
            n += r.outline().corners().size() < 3 ? 0 : 2; // outline and label
        }
        for (FloorZone z : s.site().floorZones()) {
            n += z.outline().corners().size() < 3 ? 0 : 2; // polygon and title
        }
        for (Fixture f : s.site().fixtures()) {
            n += f.outline().corners().size() < 3 ? 0 : 2;
        }
        for (Clutter c : s.site().clutter()) {
            n += c.outline().corners().size() < 3 ? 0 : 2;
        }
        n += walls.size();
        for (Door d : s.site().doors()) {
            n += s.site().opening(d).isPresent() ? 1 : 0;
        }
        int waypoints = s.route().waypoints().size();
        n += waypoints == 0 ? 0 : 2 + waypoints; // polyline, its title, a dot per waypoint
        n += 2; // start pose and its title
        for (Fault f : s.faults()) {
            n += f instanceof Fault.Kidnap ? 3 : 0; // target pose, its title, ring
        }
        return n;
    }

    private String draw(Scenario s, List<Segment> wallPieces) {
        Bounds b = bounds(s).padded(MARGIN);
        minX = b.minX();
        maxY = b.maxY();
        double w = b.width() * SCALE;
        double h = b.height() * SCALE;
        sb.append(String.format(
                Locale.ROOT,
                "<svg xmlns=\"http://www.w3.org/2000/svg\" class=\"site-plan\" viewBox=\"0 0 %.1f %.1f\" "
                        + "width=\"%.0f\" height=\"%.0f\" role=\"img\" aria-label=\"Site plan of %s\">",
                w,
                h,
                w,
                h,
                esc(s.name())));
        sb.append("<title>Site plan: ").append(esc(s.name())).append("</title>");
        defs();
        for (Room r : s.site().rooms()) {
            polygon(r.outline(), "room", null);
        }
        for (FloorZone z : s.site().floorZones()) {
            polygon(
                    z.outline(),
                    "zone zone-" + cssName(z.surface()),
                    z.name() + " (" + surfaceLabel(z.surface()) + ")");
        }
        for (Fixture f : s.site().fixtures()) {
            polygon(f.outline(), "fixture", f.name());
        }
        for (Clutter c : s.site().clutter()) {
            polygon(c.outline(), "clutter", c.name() + " (not on the map)");
        }
        walls(s, wallPieces);
        for (Room r : s.site().rooms()) {
            label(r);
        }
        route(s);
        sb.append("</svg>");
        return sb.toString();
    }

    private void defs() {
        sb.append("<defs>")
                .append("<pattern id=\"hatch-carpet\" width=\"6\" height=\"6\" patternUnits=\"userSpaceOnUse\" "
                        + "patternTransform=\"rotate(45)\"><rect width=\"6\" height=\"6\" class=\"hatch-bg-carpet\"/>"
                        + "<line x1=\"0\" y1=\"0\" x2=\"0\" y2=\"6\" class=\"hatch-line\"/></pattern>")
                .append("<marker id=\"route-arrow\" viewBox=\"0 0 10 10\" refX=\"8\" refY=\"5\" markerWidth=\"6\" "
                        + "markerHeight=\"6\" orient=\"auto\"><path d=\"M0,0 L10,5 L0,10 z\" "
                        + "class=\"route-arrowhead\"/></marker>")
                .append("</defs>");
        sb.append("<style>")
                .append(".room{fill:#f6f5f0;stroke:none}")
                .append(".wall{stroke:#26303b;stroke-width:4;stroke-linecap:round}")
                .append(".door-open{stroke:#4c9f70;stroke-width:2;stroke-dasharray:4 3}")
                .append(".door-closed{stroke:#a34a28;stroke-width:5}")
                .append(".fixture{fill:#8d96a0;stroke:#4a525b;stroke-width:1}")
                .append(".clutter{fill:#e8b04b33;stroke:#b07a12;stroke-width:1.5;stroke-dasharray:5 3}")
                .append(".zone{stroke:none;opacity:.55}")
                .append(
                        ".zone-carpet{fill:url(#hatch-carpet)}.hatch-bg-carpet{fill:#d9c9f0}.hatch-line{stroke:#9b86c4;stroke-width:2}")
                .append(".zone-rug{fill:#c9b7e8}.zone-tile{fill:#e4e8ec}.zone-threshold-strip{fill:#6b4fa0;opacity:.8}")
                .append(".zone-rubber-mat{fill:#5a5a5a;opacity:.4}.zone-wet-floor{fill:#7fb8e0}")
                .append(".route{fill:none;stroke:#1f6fb2;stroke-width:2.5;marker-end:url(#route-arrow)}")
                .append(".route-arrowhead{fill:#1f6fb2}.waypoint{fill:#1f6fb2}")
                .append(".start{fill:#1f9e89;stroke:#0b4f44;stroke-width:1.5}")
                .append(".kidnap{fill:none;stroke:#c0392b;stroke-width:2;stroke-dasharray:3 2}")
                .append(".kidnap-to{fill:#c0392b}")
                .append(".room-label{font:12px system-ui,sans-serif;fill:#3b4651;text-anchor:middle}")
                .append("</style>");
    }

    private void polygon(Polygon p, String cls, String title) {
        if (p.corners().size() < 3) {
            return;
        }
        sb.append("<polygon class=\"").append(cls).append("\" points=\"");
        for (Point c : p.corners()) {
            sb.append(num(px(c.x()))).append(',').append(num(py(c.y()))).append(' ');
        }
        sb.append("\">");
        if (title != null) {
            sb.append("<title>").append(esc(title)).append("</title>");
        }
        sb.append("</polygon>");
    }

    /** Room edges with door openings cut out; each door drawn in its mapped state. */
    private void walls(Scenario s, List<Segment> pieces) {
        for (Segment piece : pieces) {
            line(piece, 0, 1, "wall");
        }
        for (Door d : s.site().doors()) {
            s.site()
                    .opening(d)
                    .ifPresent(o -> line(o, 0, 1, d.mapped() == DoorState.OPEN ? "door-open" : "door-closed"));
        }
    }

    private void line(Segment e, double t0, double t1, String cls) {
        double dx = e.b().x() - e.a().x();
        double dy = e.b().y() - e.a().y();
        sb.append("<line class=\"")
                .append(cls)
                .append("\" x1=\"")
                .append(num(px(e.a().x() + dx * t0)))
                .append("\" y1=\"")
                .append(num(py(e.a().y() + dy * t0)))
                .append("\" x2=\"")
                .append(num(px(e.a().x() + dx * t1)))
                .append("\" y2=\"")
                .append(num(py(e.a().y() + dy * t1)))
                .append("\"/>");
    }

    private void label(Room r) {
        if (r.outline().corners().size() < 3) {
            return;
        }
        Bounds b = r.outline().bounds();
        sb.append("<text class=\"room-label\" x=\"")
                .append(num(px((b.minX() + b.maxX()) / 2)))
                .append("\" y=\"")
                .append(num(py(b.maxY()) + 16))
                .append("\">")
                .append(esc(r.name()))
                .append("</text>");
    }

    private void route(Scenario s) {
        Pose start = s.route().start();
        if (!s.route().waypoints().isEmpty()) {
            sb.append("<polyline class=\"route\" points=\"")
                    .append(num(px(start.x())))
                    .append(',')
                    .append(num(py(start.y())));
            for (Waypoint w : s.route().waypoints()) {
                sb.append(' ').append(num(px(w.x()))).append(',').append(num(py(w.y())));
            }
            sb.append("\"><title>Route</title></polyline>");
            for (Waypoint w : s.route().waypoints()) {
                sb.append("<circle class=\"waypoint\" r=\"3\" cx=\"")
                        .append(num(px(w.x())))
                        .append("\" cy=\"")
                        .append(num(py(w.y())))
                        .append("\"/>");
            }
        }
        pose(start, "start", "Start");
        for (Fault f : s.faults()) {
            if (f instanceof Fault.Kidnap k) {
                pose(k.to(), "kidnap-to", "Kidnap target of " + k.id());
                sb.append("<circle class=\"kidnap\" r=\"12\" cx=\"")
                        .append(num(px(k.to().x())))
                        .append("\" cy=\"")
                        .append(num(py(k.to().y())))
                        .append("\"/>");
            }
        }
    }

    /** A pose as a triangle pointing along the heading. */
    private void pose(Pose p, String cls, String title) {
        double len = 0.45;
        double half = 0.22;
        double c = Math.cos(p.heading());
        double s = Math.sin(p.heading());
        double tipX = p.x() + c * len;
        double tipY = p.y() + s * len;
        double lx = p.x() - c * 0.15 - s * half;
        double ly = p.y() - s * 0.15 + c * half;
        double rx = p.x() - c * 0.15 + s * half;
        double ry = p.y() - s * 0.15 - c * half;
        sb.append("<polygon class=\"")
                .append(cls)
                .append("\" points=\"")
                .append(num(px(tipX)))
                .append(',')
                .append(num(py(tipY)))
                .append(' ')
                .append(num(px(lx)))
                .append(',')
                .append(num(py(ly)))
                .append(' ')
                .append(num(px(rx)))
                .append(',')
                .append(num(py(ry)))
                .append("\"><title>")
                .append(esc(title))
                .append("</title></polygon>");
    }

    private double px(double x) {
        return (x - minX) * SCALE;
    }

    private double py(double y) {
        return (maxY - y) * SCALE;
    }

    /** What a drawing shows: the plan's drawing bounds, clamped and at least 1 m a side. */
    static Bounds bounds(Scenario s) {
        Bounds b = s.drawingBounds();
        // keep drawings of absurd sites bounded; the validator reports the size itself
        double minX = clamp(b.minX());
        double minY = clamp(b.minY());
        return new Bounds(minX, minY, Math.max(clamp(b.maxX()), minX + 1), Math.max(clamp(b.maxY()), minY + 1));
    }

    private static double clamp(double v) {
        return Math.max(-5000, Math.min(5000, v));
    }

    private static String num(double v) {
        return String.format(Locale.ROOT, "%.1f", v);
    }

    private static String cssName(Surface s) {
        return s.name().toLowerCase(Locale.ROOT).replace('_', '-');
    }

    private static String surfaceLabel(Surface s) {
        return s.name().toLowerCase(Locale.ROOT).replace('_', ' ');
    }

    /** XML escape for text and attribute values. */
    static String esc(String s) {
        StringBuilder out = new StringBuilder(s.length() + 16);
        for (int i = 0; i < s.length(); i++) {
            char ch = s.charAt(i);
            switch (ch) {
                case '<' -> out.append("&lt;");
                case '>' -> out.append("&gt;");
                case '&' -> out.append("&amp;");
                case '"' -> out.append("&quot;");
                case '\'' -> out.append("&#39;");
                default -> {
                    if (ch < 0x20 && ch != '\n' && ch != '\t') {
                        out.append(' ');
                    } else {
                        out.append(ch);
                    }
                }
            }
        }
        return out.toString();
    }
}
