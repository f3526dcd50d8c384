package dev.driftlab.geometry;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.List;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

class GridCasterTest {

    @Test
    void cast_whenComparedWithExactCaster_thenStopsWithinOneCellOfTheWalls() {
        // Bound: every cell a wall crosses is occupied, so the grid range is never longer than the
        // exact one; and every point of an occupied cell lies within one cell diagonal (cs * sqrt 2)
        // of a wall, so the grid cannot stop before the ray first comes that close to a wall. The
        // exact caster and its clearance are themselves checked against JTS and brute force
        // (SegmentCasterTest). The grid caster marches in single precision, so both bounds hold to
        // its rounding: a float position on this 800-cell grid is off by up to one ulp of 800
        // (6e-5 cells), which moves a cell-edge crossing along the ray by that over the ray's
        // direction component across the edge (IEEE 754 single precision).
        double cs = 0.05;
        double ulp = Math.ulp(800f) * cs;
        double diagonal = cs * Math.sqrt(2);
        SegmentSet walls = TestSites.office(40, 24);
        SegmentCaster exact = SegmentCaster.of(walls);
        GridMap map = GridMap.of(OccupancyGrid.rasterize(walls, List.of(), cs, 0.5));
        SplittableRandom rng = new SplittableRandom(31L);
        int hits = 0;
        int withinOneCellAlongRay = 0;
        for (int k = 0; k < 20000; k++) {
            double x = 0.2 + rng.nextDouble() * 39.6;
            double y = 0.2 + rng.nextDouble() * 23.6;
            if (walls.distanceTo(x, y) < 2 * cs) {
                continue;
            }
            double a = -Math.PI + rng.nextDouble() * 2 * Math.PI;
            double e = exact.cast(x, y, a, 12);
            double g = map.caster().cast(x, y, a, 12);
            double near = firstApproach(exact, x, y, a, diagonal, e);
            double across = Math.max(Math.min(Math.abs(Math.cos(a)), Math.abs(Math.sin(a))), 1e-3);
            double rounding = 4 * ulp / across;
            assertThat(g).as("ray %d", k).isLessThanOrEqualTo(e + rounding).isGreaterThanOrEqualTo(near - rounding);
            if (g < 12) {
                double hx = x + g * Math.cos(a);
                double hy = y + g * Math.sin(a);
                assertThat(walls.distanceTo(hx, hy)).isLessThanOrEqualTo(diagonal + rounding);
                hits++;
                if (e - g <= diagonal) {
                    withinOneCellAlongRay++;
                }
            }
        }
        assertThat(hits).isGreaterThan(15000);
        // most rays meet walls steeply, where the gap along the ray is below one cell diagonal
        assertThat(withinOneCellAlongRay).isGreaterThan(hits * 8 / 10);
    }

    /** Distance along the ray at which it first comes within {@code radius} of a wall (exact marching). */
    private static double firstApproach(SegmentCaster exact, double x, double y, double a, double radius, double end) {
        double t = 0;
        for (int guard = 0; guard < 100000 && t < end; guard++) {
            double c = exact.clearance(x + t * Math.cos(a), y + t * Math.sin(a), 1.0);
            if (c <= radius + 1e-12) {
                return t;
            }
            t += c - radius;
        }
        return Math.min(t, end);
    }

    @Test
    void cast_whenHeadOnToWall_thenWithinOneCell() {
        double cs = 0.05;
        SegmentSet walls =
                SegmentSet.builder().addOutline(Polygon.rectangle(0, 0, 10, 5)).build();
        GridMap map = GridMap.of(OccupancyGrid.rasterize(walls, List.of(), cs, 0.5));

        assertThat(map.caster().cast(2.02, 2.51, 0, 12)).isCloseTo(7.98, within(cs));
        assertThat(map.caster().cast(2.02, 2.51, Math.PI / 2, 12)).isCloseTo(2.49, within(cs));
    }

    @Test
    void cast_whenRayLeavesGrid_thenReturnsMaxRange() {
        SegmentSet walls = SegmentSet.builder().add(0, 0, 1, 0).build();
        GridMap map = GridMap.of(OccupancyGrid.rasterize(walls, List.of(), 0.05, 0.5));

        assertThat(map.caster().cast(0.5, 0.3, Math.PI / 2, 12)).isEqualTo(12.0);
        assertThat(map.caster().cast(-50, -50, 0.3, 8)).isEqualTo(8.0);
    }

    @Test
    void cast_whenOriginInOccupiedCell_thenZero() {
        SegmentSet walls = SegmentSet.builder().add(0, 0, 1, 0).build();
        GridMap map = GridMap.of(OccupancyGrid.rasterize(walls, List.of(), 0.05, 0.5));

        assertThat(map.caster().cast(0.5, 0.001, 1.0, 12)).isZero();
    }

    @Test
    void castRays_onVectorLanes_giveWhatTheScalarMarchGivesBitForBit() {
        // The build starts every test JVM with the vector API module, so the lanes must be in use
        // here; a caster told not to use them marches ray by ray (the fallback of a JVM without it).
        assertThat(GridCaster.LANES_AVAILABLE)
                .as("test JVM has --add-modules jdk.incubator.vector")
                .isTrue();
        SegmentSet walls = TestSites.office(40, 24);
        DistanceField field = DistanceField.of(OccupancyGrid.rasterize(walls, List.of(), 0.05, 0.5));
        GridCaster lanes = new GridCaster(field, true);
        GridCaster scalar = new GridCaster(field, false);
        assertThat(lanes.usesVectorLanes()).isTrue();
        assertThat(scalar.usesVectorLanes()).isFalse();
        SplittableRandom rng = new SplittableRandom(5L);
        for (int trial = 0; trial < 200; trial++) {
            int n = 1 + rng.nextInt(trial % 10 == 0 ? 3000 : 200);
            int from = rng.nextInt(3);
            double[] x = new double[from + n];
            double[] y = new double[from + n];
            double[] dx = new double[from + n];
            double[] dy = new double[from + n];
            for (int k = from; k < from + n; k++) {
                // mostly inside; some far outside (the march starts where they enter), some
                // along the axes, a few NaN origins (a miss, never an exception)
                boolean outside = rng.nextInt(10) == 0;
                x[k] = outside ? -300 + rng.nextDouble() * 640 : rng.nextDouble() * 40;
                y[k] = outside ? -300 + rng.nextDouble() * 624 : rng.nextDouble() * 24;
                if (rng.nextInt(200) == 0) {
                    x[k] = Double.NaN;
                }
                double a = rng.nextInt(8) == 0 ? rng.nextInt(4) * Math.PI / 2 : rng.nextDouble() * 2 * Math.PI;
                dx[k] = Math.cos(a);
                dy[k] = Math.sin(a);
            }
            double maxRange = rng.nextInt(20) == 0 ? 0 : 1 + rng.nextDouble() * 30;
            double[] fast = new double[from + n];
            double[] slow = new double[from + n];
            lanes.castRays(x, y, dx, dy, from, n, maxRange, fast);
            scalar.castRays(x, y, dx, dy, from, n, maxRange, slow);
            for (int k = from; k < from + n; k++) {
                assertThat(fast[k]).as("trial %d ray %d", trial, k).isEqualTo(slow[k]);
                assertThat(slow[k]).isEqualTo(scalar.castAlong(x[k], y[k], dx[k], dy[k], maxRange));
                assertThat(fast[k]).isBetween(0.0, maxRange);
            }
        }
    }

    @Test
    void cast_onAGridTooLargeForSinglePrecision_thenMarchesInDoubleWithinOneCell() {
        // 820 m of corridor at 5 cm: 16,400 cells long, past the single-precision limit
        double cs = 0.05;
        SegmentSet walls = SegmentSet.builder()
                .addOutline(Polygon.rectangle(0, 0, 820, 2))
                .add(400, 0.5, 400, 1.5)
                .build();
        DistanceField field = DistanceField.of(OccupancyGrid.rasterize(walls, List.of(), cs, 0.5));
        assertThat(field.grid().width()).isGreaterThan(GridCaster.COMPACT_SIDE);
        GridCaster caster = new GridCaster(field);
        SegmentCaster exact = SegmentCaster.of(walls);
        assertThat(caster.usesVectorLanes()).isFalse();
        SplittableRandom rng = new SplittableRandom(9L);
        double[] x = new double[500];
        double[] y = new double[500];
        double[] dx = new double[500];
        double[] dy = new double[500];
        double[] out = new double[500];
        for (int k = 0; k < 500; k++) {
            x[k] = 380 + rng.nextDouble() * 40;
            y[k] = 0.2 + rng.nextDouble() * 1.6;
            double a = rng.nextDouble() * 2 * Math.PI;
            dx[k] = Math.cos(a);
            dy[k] = Math.sin(a);
        }
        caster.castRays(x, y, dx, dy, 0, 500, 30, out);
        for (int k = 0; k < 500; k++) {
            double e = exact.castAlong(x[k], y[k], dx[k], dy[k], 30);
            // the same bounds as in the first test, at double precision
            double near = firstApproach(exact, x[k], y[k], Math.atan2(dy[k], dx[k]), cs * Math.sqrt(2), e);
            assertThat(out[k]).as("ray %d", k).isLessThanOrEqualTo(e + 1e-9).isGreaterThanOrEqualTo(near - 1e-9);
            assertThat(out[k]).isEqualTo(caster.castAlong(x[k], y[k], dx[k], dy[k], 30));
        }
    }
}
