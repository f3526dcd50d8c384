package dev.driftlab.geometry;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;
import org.locationtech.jts.geom.Coordinate;
import org.locationtech.jts.geom.GeometryFactory;
import org.locationtech.jts.geom.LinearRing;

/** Polygon predicates checked against JTS Topology Suite as an independent oracle. */
class PolygonTest {

    private static final GeometryFactory JTS = new GeometryFactory();

    private static LinearRing ring(Polygon p) {
        Coordinate[] cs = new Coordinate[p.corners().size() + 1];
        for (int i = 0; i < p.corners().size(); i++) {
            cs[i] = new Coordinate(p.corners().get(i).x(), p.corners().get(i).y());
        }
        cs[cs.length - 1] = cs[0];
        return JTS.createLinearRing(cs);
    }

    @Test
    void selfCrossing_agreesWithJtsIsSimple_onRandomPolygons() {
        SplittableRandom rng = new SplittableRandom(7);
        int crossing = 0;
        for (int trial = 0; trial < 3000; trial++) {
            int n = 3 + rng.nextInt(6);
            List<Point> corners = new ArrayList<>();
            for (int i = 0; i < n; i++) {
                corners.add(new Point(rng.nextInt(6), rng.nextInt(6)));
            }
            Polygon p = Polygon.of(corners);
            if (hasRepeatedCorner(corners)) {
                // documented: a repeated corner counts as a crossing (JTS silently drops it)
                assertThat(p.selfCrossing()).isPresent();
                continue;
            }
            boolean jtsSimple = ring(p).isSimple() && JTS.createPolygon(ring(p)).getArea() > 0;
            boolean ours = p.selfCrossing().isEmpty() && p.area() > 0;
            assertThat(ours).as("polygon %s", corners).isEqualTo(jtsSimple);
            crossing += jtsSimple ? 0 : 1;
        }
        assertThat(crossing).as("the sample must contain both kinds").isBetween(300, 2700);
    }

    private static boolean hasRepeatedCorner(List<Point> c) {
        for (int i = 0; i < c.size(); i++) {
            if (c.get(i).equals(c.get((i + 1) % c.size()))) {
                return true;
            }
        }
        return false;
    }

    @Test
    void contains_agreesWithJtsCovers_onRandomPoints() {
        Polygon p = Polygon.of(List.of(
                new Point(0, 0),
                new Point(14, 0),
                new Point(14, 6),
                new Point(8, 6),
                new Point(8, 10),
                new Point(0, 10)));
        var jts = JTS.createPolygon(ring(p));
        SplittableRandom rng = new SplittableRandom(11);
        for (int i = 0; i < 5000; i++) {
            double x = -1 + 16 * rng.nextDouble();
            double y = -1 + 12 * rng.nextDouble();
            assertThat(p.contains(x, y)).isEqualTo(jts.covers(JTS.createPoint(new Coordinate(x, y))));
        }
    }

    @Test
    void area_matchesJts() {
        Polygon p = Polygon.of(List.of(new Point(0, 0), new Point(4, 0), new Point(4, 3), new Point(1, 5)));

        assertThat(p.area()).isEqualTo(JTS.createPolygon(ring(p)).getArea());
        assertThat(p.signedArea()).isPositive();
    }
}
