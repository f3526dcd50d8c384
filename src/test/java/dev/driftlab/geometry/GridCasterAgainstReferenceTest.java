package dev.driftlab.geometry;

import static org.assertj.core.api.Assertions.assertThat;

import dev.driftlab.scenario.ScenarioFiles;
import dev.driftlab.site.SiteCompiler;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;

/**
 * The grid caster leaps farther than it did (by the gap from each cell to the nearest occupied
 * cell, and whenever a leap beats the next walk step), yet must give the very ranges of the exact
 * cell-by-cell march it replaced, bit for bit: {@link ReferenceGridCaster} is that march, copied
 * unchanged. The oracle for exactness itself (no ray crosses an occupied cell) is JTS, in {@link
 * GridCasterTest}; here the rays are aimed where a leap could go wrong: past the corners of
 * occupied cells by less than the march's rounding, from far off so that they arrive by leaps,
 * along walls, along the axes and diagonals, from starts on cell edges and from outside the grid.
 */
class GridCasterAgainstReferenceTest {

    static Stream<String> sampleSites() throws IOException {
        try (Stream<Path> files = Files.list(Path.of("sample-projects"))) {
            return files.map(Path::toString).filter(f -> f.endsWith(".json")).sorted().toList().stream();
        }
    }

    @ParameterizedTest
    @MethodSource("sampleSites")
    void castRays_onASampleSite_giveTheReferenceRangesBitForBit(String file) throws IOException {
        var scenario = ScenarioFiles.load(Files.readString(Path.of(file)));
        GridMap map = SiteCompiler.compile(scenario.site()).believedMap().gridMap(OccupancyGrid.DEFAULT_CELL_SIZE);
        int hits = compare(map.field(), new SplittableRandom(file.hashCode()), 60_000);
        // most rays end on a wall, so the ranges compared are not mostly max range
        assertThat(hits).as("hits on %s", file).isGreaterThan(90_000);
    }

    @Test
    void castRays_onRandomWallsAtSeveralCellSizes_giveTheReferenceRangesBitForBit() {
        SplittableRandom rng = new SplittableRandom(41L);
        for (double cellSize : new double[] {0.02, 0.05, 0.1, 0.3}) {
            SegmentSet walls = TestSites.randomWalls(rng, 25, 6, 3);
            OccupancyGrid grid =
                    OccupancyGrid.rasterize(walls, List.of(Polygon.rectangle(2, 2, 0.7, 0.4)), cellSize, 0.4);
            compare(DistanceField.of(grid), rng, 20_000);
        }
    }

    @Test
    void castRays_onGridsWithOddShapes_giveTheReferenceRangesBitForBit() {
        // a grid with no occupied cell (infinite reach), a single occupied cell, a one-row grid,
        // and a checkerboard (every free cell next to an occupied one: no leap at all)
        SplittableRandom rng = new SplittableRandom(43L);
        compare(DistanceField.of(OccupancyGrid.of(-1, 2, 0.05, 120, 90, new boolean[120 * 90])), rng, 5_000);
        boolean[] one = new boolean[200 * 150];
        one[77 * 200 + 131] = true;
        compare(DistanceField.of(OccupancyGrid.of(0.3, -4, 0.05, 200, 150, one)), rng, 20_000);
        boolean[] row = new boolean[300];
        row[150] = true;
        compare(DistanceField.of(OccupancyGrid.of(0, 0, 0.05, 300, 1, row)), rng, 5_000);
        boolean[] board = new boolean[64 * 64];
        for (int k = 0; k < board.length; k++) {
            board[k] = ((k % 64) + (k / 64)) % 2 == 0 && rng.nextInt(3) > 0;
        }
        compare(DistanceField.of(OccupancyGrid.of(1, 1, 0.05, 64, 64, board)), rng, 20_000);
    }

    @Test
    void castRays_leavingTheGridThroughItsEdgesAndCorners_giveTheReferenceRangesBitForBit() {
        // The lanes look the reach table up with no clamp, trusting its border of edge-cell copies
        // (GridCaster.BORDER) to cover a traversal that rounding takes a cell past the edge just
        // before the ray's end. Rays that leave the grid, at every angle to the edge down to 1e-7,
        // from up to 5 cells inside and from the corners themselves, on a grid whose edge cells
        // are free in some stretches and occupied in others.
        SplittableRandom rng = new SplittableRandom(47L);
        int w = 97;
        int h = 61;
        boolean[] cells = new boolean[w * h];
        for (int i = 0; i < w; i++) {
            cells[i] = (i / 7) % 3 == 0;
            cells[(h - 1) * w + i] = (i / 5) % 4 == 1;
        }
        for (int j = 0; j < h; j++) {
            cells[j * w] |= (j / 6) % 3 == 2;
            cells[j * w + w - 1] |= (j / 4) % 5 == 0;
        }
        for (int k = 0; k < 40; k++) {
            cells[rng.nextInt(2, h - 2) * w + rng.nextInt(2, w - 2)] = true;
        }
        double cs = 0.05;
        DistanceField field = DistanceField.of(OccupancyGrid.of(-1.3, 0.7, cs, w, h, cells));
        Rays rays = new Rays();
        for (int k = 0; k < 40_000; k++) {
            // a point on the boundary, at a corner one time in eight
            // (sides: 0 south, 1 north, 2 west, 3 east)
            int side = rng.nextInt(4);
            double along = k % 8 == 0 ? rng.nextInt(2) : rng.nextDouble();
            double ex = side < 2 ? along * w : (side == 2 ? 0 : w);
            double ey = side < 2 ? (side == 0 ? 0 : h) : along * h;
            // outward normal of that side, turned by an angle from 1e-7 to almost 90 degrees
            double nx = side < 2 ? 0 : (side == 2 ? -1 : 1);
            double ny = side < 2 ? (side == 0 ? -1 : 1) : 0;
            double graze = switch (k % 5) {
                case 0 -> 1e-7;
                case 1 -> 1e-4;
                case 2 -> 1e-2;
                default -> rng.nextDouble() * Math.PI / 2;
            };
            double turn = (Math.PI / 2 - graze) * (rng.nextBoolean() ? 1 : -1);
            double dx = nx * Math.cos(turn) - ny * Math.sin(turn);
            double dy = nx * Math.sin(turn) + ny * Math.cos(turn);
            double back = k % 3 == 0 ? 0 : rng.nextDouble() * 5;
            rays.add(-1.3 + (ex - back * dx) * cs, 0.7 + (ey - back * dy) * cs, dx, dy);
        }
        check(field, rays);
    }

    @Test
    void cast_whenARayAllButParallelToAColumnEdgeStartsOnIt_thenFinishesWithTheWalkRange() {
        // Straight down from x = 20 cells exactly, along cos(3 pi / 2) = -1.8e-16: the traversal
        // crosses column edge 20 at t = 0, but every leap lands (rounded) back in column 20. The
        // march before this change then walked back to t = 0 and leapt from there, round and
        // round for ever (the reference gives up: NaN); now it goes on from where it is and meets
        // the floor (row 2, top edge at y = 3 cells) 32.5 cells down, as the plain walk does.
        int w = 40;
        boolean[] cells = new boolean[w * w];
        for (int j = 10; j < 15; j++) {
            cells[j * w + 22] = true;
        }
        for (int i = 0; i < w; i++) {
            cells[2 * w + i] = true;
        }
        DistanceField field = DistanceField.of(OccupancyGrid.of(0, 0, 0.05, w, w, cells));
        double dx = Math.cos(1.5 * Math.PI);
        double dy = Math.sin(1.5 * Math.PI);
        double[] x = {1.0, 1.0, 1.0, 1.0, 1.0, 1.0, 1.0, 1.0};
        double[] y = {1.775, 1.775, 1.775, 1.775, 1.775, 1.775, 1.775, 1.775};
        double[] ux = {dx, dx, dx, dx, dx, dx, dx, dx};
        double[] uy = {dy, dy, dy, dy, dy, dy, dy, dy};
        double[] lanes = new double[8];
        new GridCaster(field, true).castRays(x, y, ux, uy, 0, 8, 12, lanes);
        ReferenceGridCaster before = new ReferenceGridCaster(field);

        assertThat(before.castAlong(1.0, 1.775, dx, dy, 12)).isNaN();
        assertThat(before.walkAlong(1.0, 1.775, dx, dy, 12)).isEqualTo(1.625);
        assertThat(new GridCaster(field, false).castAlong(1.0, 1.775, dx, dy, 12))
                .isEqualTo(1.625);
        assertThat(lanes).containsOnly(1.625);
    }

    /**
     * Casts {@code each} rays of every kind below with the new caster (vector lanes and ray by ray)
     * and the reference, asserts all three equal bit for bit, and returns how many rays hit.
     */
    private static int compare(DistanceField field, SplittableRandom rng, int each) {
        OccupancyGrid grid = field.grid();
        double cs = grid.cellSize();
        double ox = grid.originX();
        double oy = grid.originY();
        int w = grid.width();
        int h = grid.height();
        List<int[]> occupied = new ArrayList<>();
        for (int j = 0; j < h; j++) {
            for (int i = 0; i < w; i++) {
                if (grid.isOccupied(i, j)) {
                    occupied.add(new int[] {i, j});
                }
            }
        }
        Rays rays = new Rays();
        // anywhere over the grid and a margin around it, any direction
        for (int k = 0; k < each; k++) {
            double a = rng.nextDouble() * 2 * Math.PI;
            rays.add(
                    ox + (rng.nextDouble() * 1.2 - 0.1) * w * cs,
                    oy + (rng.nextDouble() * 1.2 - 0.1) * h * cs,
                    Math.cos(a),
                    Math.sin(a));
        }
        if (!occupied.isEmpty()) {
            // past a random corner of a random occupied cell, off by up to 10^-2 cell (and by 0,
            // and by a few floats), arriving from up to 300 cells back
            for (int k = 0; k < each; k++) {
                int[] c = occupied.get(rng.nextInt(occupied.size()));
                double kx = c[0] + rng.nextInt(2);
                double ky = c[1] + rng.nextInt(2);
                double a = rng.nextDouble() * 2 * Math.PI;
                double dx = Math.cos(a);
                double dy = Math.sin(a);
                double off = switch (k % 4) {
                    case 0 -> 0;
                    case 1 -> (rng.nextDouble() * 2 - 1) * 1e-6;
                    case 2 -> (rng.nextDouble() * 2 - 1) * 1e-4;
                    default -> (rng.nextDouble() * 2 - 1) * 1e-2;
                };
                double back = k % 3 == 0 ? rng.nextDouble() * 4 : rng.nextDouble() * 300;
                rays.add(ox + (kx - dy * off - back * dx) * cs, oy + (ky + dx * off - back * dy) * cs, dx, dy);
            }
            // along the axes and diagonals, from cell centres, edges and corners near walls, and
            // from a few cells off a wall in directions just off the axes (rays along walls)
            for (int k = 0; k < each; k++) {
                int[] c = occupied.get(rng.nextInt(occupied.size()));
                double px = c[0] + rng.nextInt(-4, 5) + rng.nextInt(3) * 0.5;
                double py = c[1] + rng.nextInt(-4, 5) + rng.nextInt(3) * 0.5;
                double a = rng.nextInt(8) * Math.PI / 4;
                if (k % 2 == 0) {
                    a += (rng.nextDouble() * 2 - 1) * (k % 4 == 0 ? 1e-3 : 1e-6);
                }
                if (k % 8 == 1) {
                    // exactly along an axis: a zero direction component
                    int q = rng.nextInt(4);
                    rays.add(ox + px * cs, oy + py * cs, (q & 1) == 0 ? 1 - q : 0, (q & 1) == 1 ? 2 - q : 0);
                } else {
                    rays.add(ox + px * cs, oy + py * cs, Math.cos(a), Math.sin(a));
                }
            }
        }
        return check(field, rays);
    }

    /**
     * Casts the rays with the new caster (vector lanes and ray by ray) and the reference, at
     * several max ranges, asserts all three equal bit for bit, and returns how many hit at 12 m.
     */
    private static int check(DistanceField field, Rays rays) {
        GridCaster fast = new GridCaster(field, true);
        GridCaster slow = new GridCaster(field, false);
        ReferenceGridCaster before = new ReferenceGridCaster(field);
        assertThat(fast.usesVectorLanes()).isTrue();
        int hits = 0;
        int departures = 0;
        // 12 m as in a run; short and odd max ranges end rays inside the grid, mid-leap or mid-walk
        for (double maxRange : new double[] {12, 0, 0.013, 0.7, 3.3}) {
            double[] lanes = new double[rays.size];
            fast.castRays(rays.x, rays.y, rays.dx, rays.dy, 0, rays.size, maxRange, lanes);
            for (int k = 0; k < rays.size; k++) {
                double x = rays.x[k];
                double y = rays.y[k];
                double dx = rays.dx[k];
                double dy = rays.dy[k];
                double now = slow.castAlong(x, y, dx, dy, maxRange);
                double old = before.castAlong(x, y, dx, dy, maxRange);
                double walked = before.walkAlong(x, y, dx, dy, maxRange);
                if (bits(now) != bits(lanes[k]) || bits(now) != bits(walked)) {
                    assertThat(new double[] {lanes[k], now})
                            .as(
                                    "ray %d from (%s, %s) along (%s, %s), max range %s: lanes and ray by ray,"
                                            + " against the plain traversal (before: %s)",
                                    k, x, y, dx, dy, maxRange, old)
                            .containsOnly(walked);
                }
                if (bits(old) != bits(walked)) {
                    // the former march departed from the traversal (or went round for ever) only on
                    // rays all but parallel to a cell edge, where its landings could fall either side
                    assertThat(Math.min(Math.abs(dx), Math.abs(dy)))
                            .as(
                                    "ray %d along (%s, %s): the former march gave %s, the traversal %s",
                                    k, dx, dy, old, walked)
                            .isLessThan(0.01);
                    departures++;
                }
                if (maxRange == 12 && now < maxRange) {
                    hits++;
                }
            }
        }
        // rare even among these rays aimed along cell edges: about 3 in 10,000 casts
        assertThat(departures).as("departures of the former march").isLessThan(rays.size * 5 / 1_000);
        return hits;
    }

    private static long bits(double d) {
        return Double.doubleToRawLongBits(d);
    }

    /** Rays in metres, as castRays takes them. */
    private static final class Rays {
        double[] x = new double[64];
        double[] y = new double[64];
        double[] dx = new double[64];
        double[] dy = new double[64];
        int size;

        void add(double px, double py, double ux, double uy) {
            if (size == x.length) {
                x = java.util.Arrays.copyOf(x, size * 2);
                y = java.util.Arrays.copyOf(y, size * 2);
                dx = java.util.Arrays.copyOf(dx, size * 2);
                dy = java.util.Arrays.copyOf(dy, size * 2);
            }
            x[size] = px;
            y[size] = py;
            dx[size] = ux;
            dy[size] = uy;
            size++;
        }
    }
}
