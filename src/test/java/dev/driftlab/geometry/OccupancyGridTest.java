package dev.driftlab.geometry;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.util.List;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

class OccupancyGridTest {

    @Test
    void rasterize_whenDiagonalSegment_thenEveryCellTheSegmentCrossesIsOccupied() {
        // Check by dense sampling along the segment: every sampled point's cell must be occupied.
        SplittableRandom rng = new SplittableRandom(5L);
        SegmentSet walls = TestSites.randomWalls(rng, 50, 10, 5);
        OccupancyGrid grid = OccupancyGrid.rasterize(walls, List.of(), 0.05, 0.2);
        for (int s = 0; s < walls.size(); s++) {
            for (int k = 0; k <= 2000; k++) {
                double f = k / 2000.0;
                double x = walls.ax(s) + f * (walls.bx(s) - walls.ax(s));
                double y = walls.ay(s) + f * (walls.by(s) - walls.ay(s));
                assertThat(grid.isOccupiedAt(x, y)).as("segment %d at %f", s, f).isTrue();
            }
        }
    }

    @Test
    void rasterize_whenStraightSegment_thenMarksOneCellThick() {
        SegmentSet walls = SegmentSet.builder().add(0.01, 0.02, 0.99, 0.02).build();
        OccupancyGrid grid = OccupancyGrid.rasterize(walls, List.of(), 0.1, 0.0);

        assertThat(grid.occupiedCount()).isEqualTo(10);
    }

    @Test
    void rasterize_whenSolidPolygon_thenFillsInterior() {
        Polygon box = Polygon.rectangle(1, 1, 1, 0.5);
        OccupancyGrid grid = OccupancyGrid.rasterize(SegmentSet.empty(), List.of(box), 0.1, 0.5);

        assertThat(grid.isOccupiedAt(1.5, 1.25)).isTrue();
        assertThat(grid.isOccupiedAt(0.8, 1.25)).isFalse();
        assertThat(grid.occupiedCount()).isEqualTo(50);
    }

    @Test
    void of_whenCellCountDoesNotMatch_thenRefuses() {
        assertThatThrownBy(() -> OccupancyGrid.of(0, 0, 0.05, 3, 3, new boolean[8]))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessageContaining("expected 9");
    }

    @Test
    void rasterize_whenCellSizeNotPositive_thenRefuses() {
        assertThatThrownBy(() -> OccupancyGrid.rasterize(SegmentSet.empty(), List.of(), 0, 0))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessageContaining("cellSize");
    }
}
