package dev.driftlab.geometry;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;
import org.locationtech.jts.algorithm.LineIntersector;
import org.locationtech.jts.algorithm.RobustLineIntersector;
import org.locationtech.jts.geom.Coordinate;
import org.locationtech.jts.geom.GeometryFactory;
import org.locationtech.jts.geom.LineString;
import org.locationtech.jts.geom.MultiLineString;

class SegmentCasterTest {

    /** Nearest intersection of the ray's segment with any wall, by JTS, the outside oracle. */
    private static double jtsRange(SegmentSet walls, double ox, double oy, double angle, double maxRange) {
        LineIntersector li = new RobustLineIntersector();
        Coordinate p1 = new Coordinate(ox, oy);
        Coordinate p2 = new Coordinate(ox + maxRange * Math.cos(angle), oy + maxRange * Math.sin(angle));
        double best = maxRange;
        for (int s = 0; s < walls.size(); s++) {
            li.computeIntersection(
                    p1, p2, new Coordinate(walls.ax(s), walls.ay(s)), new Coordinate(walls.bx(s), walls.by(s)));
            for (int k = 0; k < li.getIntersectionNum(); k++) {
                best = Math.min(best, li.getIntersection(k).distance(p1));
            }
        }
        return best;
    }

    @Test
    void cast_whenRandomRaysOnRandomWalls_thenMatchesJtsWithin1e9() {
        // Oracle: JTS Topology Suite (org.locationtech.jts), RobustLineIntersector: the nearest intersection of the ray
        // with the wall LineStrings, a general-purpose library the project did not write.
        SplittableRandom rng = new SplittableRandom(20240611L);
        int rays = 0;
        for (int set = 0; set < 40; set++) {
            SegmentSet walls = TestSites.randomWalls(rng, 5 + rng.nextInt(120), 20, 6);
            SegmentCaster caster = set % 2 == 0 ? SegmentCaster.of(walls) : SegmentCaster.of(walls, 0.3);
            for (int k = 0; k < 150; k++) {
                double ox = -2 + rng.nextDouble() * 24;
                double oy = -2 + rng.nextDouble() * 24;
                double angle = -Math.PI + rng.nextDouble() * 2 * Math.PI;
                double maxRange = 1 + rng.nextDouble() * 30;
                double expected = jtsRange(walls, ox, oy, angle, maxRange);
                assertThat(caster.cast(ox, oy, angle, maxRange))
                        .as("set %d ray %d", set, k)
                        .isCloseTo(expected, within(1e-9));
                rays++;
            }
        }
        assertThat(rays).isEqualTo(6000);
    }

    @Test
    void cast_whenInsideRectangularRoom_thenMatchesAnalyticDistances() {
        // Plane geometry: from (x, y) in [0, W] x [0, H] the ray at angle a meets the walls at
        // min over the positive of (W - x)/cos a, -x/cos a, (H - y)/sin a, -y/sin a.
        double w = 6;
        double h = 4;
        SegmentCaster caster = SegmentCaster.of(
                SegmentSet.builder().addOutline(Polygon.rectangle(0, 0, w, h)).build());
        double x = 1.7;
        double y = 2.9;
        for (int k = 0; k < 360; k++) {
            double a = Math.toRadians(k + 0.5);
            double c = Math.cos(a);
            double s = Math.sin(a);
            double tx = c > 0 ? (w - x) / c : -x / c;
            double ty = s > 0 ? (h - y) / s : -y / s;
            assertThat(caster.cast(x, y, a, 20)).isCloseTo(Math.min(tx, ty), within(1e-12));
        }
    }

    @Test
    void cast_whenNothingWithinMaxRange_thenReturnsMaxRange() {
        SegmentCaster caster =
                SegmentCaster.of(SegmentSet.builder().add(10, -1, 10, 1).build());

        assertThat(caster.cast(0, 0, 0, 5.0)).isEqualTo(5.0);
        assertThat(caster.cast(0, 0, Math.PI, 50.0)).isEqualTo(50.0);
        assertThat(caster.cast(0, 0, 0, 50.0)).isCloseTo(10.0, within(1e-12));
    }

    @Test
    void cast_whenSetIsEmpty_thenAlwaysMisses() {
        SegmentCaster caster = SegmentCaster.of(SegmentSet.empty());

        assertThat(caster.cast(3, 4, 1.0, 7.5)).isEqualTo(7.5);
    }

    @Test
    void clearance_whenRandomPoints_thenEqualsBruteForceWithinLimit() {
        // Oracle: JTS (org.locationtech.jts) Geometry.distance from the point to all walls as one
        // MultiLineString, independent of the production distance code.
        SplittableRandom rng = new SplittableRandom(7L);
        SegmentSet walls = TestSites.randomWalls(rng, 200, 30, 4);
        SegmentCaster caster = SegmentCaster.of(walls);
        GeometryFactory gf = new GeometryFactory();
        LineString[] lines = new LineString[walls.size()];
        for (int s = 0; s < walls.size(); s++) {
            lines[s] = gf.createLineString(
                    new Coordinate[] {new Coordinate(walls.ax(s), walls.ay(s)), new Coordinate(walls.bx(s), walls.by(s))
                    });
        }
        MultiLineString all = gf.createMultiLineString(lines);
        for (int k = 0; k < 2000; k++) {
            double x = rng.nextDouble() * 30;
            double y = rng.nextDouble() * 30;
            double limit = rng.nextDouble() * 3;
            double expected = Math.min(limit, all.distance(gf.createPoint(new Coordinate(x, y))));
            assertThat(caster.clearance(x, y, limit)).isCloseTo(expected, within(1e-12));
        }
    }
}
