package dev.driftlab.report;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import dev.driftlab.geometry.Point;
import dev.driftlab.geometry.Polygon;
import dev.driftlab.geometry.Pose;
import dev.driftlab.geometry.Segment;
import dev.driftlab.scenario.Door;
import dev.driftlab.scenario.DoorState;
import dev.driftlab.scenario.Problem;
import dev.driftlab.scenario.Room;
import dev.driftlab.scenario.Route;
import dev.driftlab.scenario.Scenario;
import dev.driftlab.scenario.ScenarioValidator;
import dev.driftlab.scenario.Scenarios;
import dev.driftlab.scenario.SitePlan;
import dev.driftlab.scenario.ValidationReport;
import dev.driftlab.scenario.Waypoint;
import dev.driftlab.site.CompiledSite;
import dev.driftlab.site.SiteCompiler;
import java.io.ByteArrayInputStream;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import javax.xml.parsers.DocumentBuilderFactory;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;
import org.w3c.dom.Document;
import org.w3c.dom.Element;
import org.w3c.dom.NodeList;

/**
 * The validator, the site-plan drawing and the simulated world must agree whether a door drawn a
 * little off its neighbour's wall is a passage. Two 4 m rooms side by side, the second drawn
 * {@code offset} to the east of the first; a 0.9 m door in the first room's east wall. Up to the
 * 1 cm rule of {@code geometry.Walls} the door opens both walls; beyond it the neighbour's wall
 * stands. The expected ranges are worked by hand from the rectangle corners.
 */
class DoorOffsetAgreementTest {

    /** Wall lines shorter than this (pixels) would be rounding, not walls. */
    private static final double MIN_LINE = 1e-9;

    private static Scenario twoRooms(double offset) {
        Scenario base = Scenarios.corridor().build();
        return new Scenario(
                base.name(),
                base.description(),
                new SitePlan(
                        List.of(
                                new Room("west", "West room", Polygon.rectangle(0, 0, 4, 4)),
                                new Room("east", "East room", Polygon.rectangle(4 + offset, 0, 4, 4))),
                        // wall 1 of the west room runs from (4, 0) to (4, 4)
                        List.of(new Door("door", "west", 1, 2, 0.9, DoorState.OPEN, DoorState.OPEN)),
                        List.of(),
                        List.of(),
                        List.of()),
                base.robot(),
                base.rangefinder(),
                new Route(Pose.of(1, 2, 0), List.of(new Waypoint(7, 2, 0.5, 0)), 5, false),
                List.of(),
                base.localizer(),
                List.of(),
                List.of());
    }

    @ParameterizedTest(name = "neighbour wall {0} mm off")
    @ValueSource(doubles = {0, 2, 5, 9.9, 10.1, 15, 20})
    void validatorDrawingAndSimulator_agreeOnPassageOrWall(double offsetMm) throws Exception {
        double offset = offsetMm / 1000;
        boolean passage = offsetMm <= 10;
        Scenario s = twoRooms(offset);

        ValidationReport report = ScenarioValidator.validate(s);
        assertThat(report.hasErrors()).as("errors: %s", report.problems()).isFalse();
        List<String> warnings = new ArrayList<>();
        for (Problem p : report.problems()) {
            warnings.add(p.path() + ": " + p.message());
        }
        boolean validatorSeesWall = warnings.stream()
                .anyMatch(w -> w.startsWith("site.doors[0].wall: the door opens to the outside")
                        || (w.startsWith("route.waypoints[0]:") && w.contains("crosses a wall")));

        boolean drawingShowsWall = routeCrossesAWallLine(SitePlanSvg.render(s));

        CompiledSite site = SiteCompiler.compile(s.site());
        double actual = site.actualWorld().cast(1, 2, 0, 20);
        double believed = site.believedMap().exactCaster().cast(1, 2, 0, 20);

        assertThat(validatorSeesWall).as("validator, warnings %s", warnings).isEqualTo(!passage);
        assertThat(drawingShowsWall).as("site-plan drawing").isEqualTo(!passage);
        // through the door to the east room's far wall at x = 8 + offset, else to its near wall
        double expected = passage ? 7 + offset : 3 + offset;
        assertThat(actual).as("actual world").isCloseTo(expected, within(1e-9));
        assertThat(believed).as("believed map").isCloseTo(expected, within(1e-9));
    }

    /** Whether any wall line of the drawing crosses the route polyline, in the drawing's pixels. */
    private static boolean routeCrossesAWallLine(String svg) throws Exception {
        var f = DocumentBuilderFactory.newInstance();
        f.setNamespaceAware(true);
        Document doc = f.newDocumentBuilder().parse(new ByteArrayInputStream(svg.getBytes(StandardCharsets.UTF_8)));
        NodeList polylines = doc.getElementsByTagNameNS("http://www.w3.org/2000/svg", "polyline");
        List<Point> route = new ArrayList<>();
        for (int i = 0; i < polylines.getLength(); i++) {
            Element e = (Element) polylines.item(i);
            if (e.getAttribute("class").equals("route")) {
                for (String xy : e.getAttribute("points").trim().split("\\s+")) {
                    String[] c = xy.split(",");
                    route.add(new Point(Double.parseDouble(c[0]), Double.parseDouble(c[1])));
                }
            }
        }
        assertThat(route).hasSize(2);
        Segment leg = new Segment(route.get(0), route.get(1));
        NodeList lines = doc.getElementsByTagNameNS("http://www.w3.org/2000/svg", "line");
        int walls = 0;
        boolean crossed = false;
        for (int i = 0; i < lines.getLength(); i++) {
            Element e = (Element) lines.item(i);
            if (!e.getAttribute("class").equals("wall")) {
                continue;
            }
            walls++;
            Segment w = new Segment(new Point(num(e, "x1"), num(e, "y1")), new Point(num(e, "x2"), num(e, "y2")));
            crossed |= w.length() > MIN_LINE && leg.intersects(w);
        }
        assertThat(walls).as("wall lines drawn").isGreaterThanOrEqualTo(8);
        return crossed;
    }

    private static double num(Element e, String attr) {
        return Double.parseDouble(e.getAttribute(attr));
    }
}
