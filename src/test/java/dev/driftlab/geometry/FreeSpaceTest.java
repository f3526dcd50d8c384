package dev.driftlab.geometry;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import java.util.List;
import java.util.SplittableRandom;
import org.apache.commons.math3.stat.inference.ChiSquareTest;
import org.junit.jupiter.api.Test;

class FreeSpaceTest {

    /** Two 4 x 3 rooms side by side; the middle wall has a gap when {@code door} is true. */
    private static GridMap twoRooms(boolean door) {
        SegmentSet.Builder b = SegmentSet.builder().addOutline(Polygon.rectangle(0, 0, 8, 3));
        if (door) {
            b.add(4, 0, 4, 1).add(4, 2, 4, 3);
        } else {
            b.add(4, 0, 4, 3);
        }
        return GridMap.of(OccupancyGrid.rasterize(b.build(), List.of(), 0.05, 0.5));
    }

    @Test
    void reachable_whenWallClosed_thenOnlyTheSeedRoom() {
        FreeSpace space = twoRooms(false).freeSpace(1, 1, 0);

        assertThat(space.contains(2, 2)).isTrue();
        assertThat(space.contains(6, 2)).isFalse();
        assertThat(space.contains(-0.3, 1)).isFalse();
        // interior of a 4 x 3 room less about one wall cell on each side
        assertThat(space.area()).isCloseTo(3.9 * 2.9, within(0.4));
    }

    @Test
    void reachable_whenDoorOpen_thenBothRooms() {
        FreeSpace space = twoRooms(true).freeSpace(1, 1, 0);

        assertThat(space.contains(6, 2)).isTrue();
    }

    @Test
    void reachable_whenClearanceWiderThanDoor_thenDoorBlocks() {
        FreeSpace space = twoRooms(true).freeSpace(1, 1.5, 0.6);

        assertThat(space.contains(2, 1.5)).isTrue();
        assertThat(space.contains(6, 1.5)).isFalse();
    }

    @Test
    void reachable_whenSeedInWall_thenRefuses() {
        assertThatThrownBy(() -> twoRooms(false).freeSpace(4.0, 1.0, 0))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessageContaining("not in free space");
    }

    @Test
    void samplePoses_whenManyDraws_thenUniformOverBothRooms() {
        // Source: Pearson chi-square goodness of fit (Apache Commons Math ChiSquareTest). The two
        // rooms hold equal free area, so draws split evenly; with a fixed seed the p-value must not
        // fall below 0.001.
        GridMap map = twoRooms(true);
        FreeSpace space = map.freeSpace(1, 1, 0);
        int n = 20000;
        double[] xs = new double[n];
        double[] ys = new double[n];
        double[] hs = new double[n];
        space.samplePoses(new SplittableRandom(3L), xs, ys, hs, 0, n);
        long[] counts = new long[4];
        for (int k = 0; k < n; k++) {
            assertThat(space.contains(xs[k], ys[k])).isTrue();
            assertThat(hs[k]).isGreaterThan(-Math.PI).isLessThanOrEqualTo(Math.PI);
            counts[(xs[k] < 4 ? 0 : 2) + (hs[k] < 0 ? 0 : 1)]++;
        }
        double[] expected = {0.25, 0.25, 0.25, 0.25};
        assertThat(new ChiSquareTest().chiSquareTest(expected, counts)).isGreaterThan(0.001);
    }
}
