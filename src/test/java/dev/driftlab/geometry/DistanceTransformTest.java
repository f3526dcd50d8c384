package dev.driftlab.geometry;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

class DistanceTransformTest {

    @Test
    void squared2d_whenRandomGrids_thenEqualsBruteForceNearestOccupied() {
        // Source: Felzenszwalb & Huttenlocher, "Distance Transforms of Sampled Functions", Theory of
        // Computing 8 (2012): the transform is exact, so it must equal brute force everywhere.
        SplittableRandom rng = new SplittableRandom(99L);
        for (int trial = 0; trial < 30; trial++) {
            int w = 1 + rng.nextInt(60);
            int h = 1 + rng.nextInt(60);
            double density = rng.nextDouble() * 0.2;
            boolean[] marked = new boolean[w * h];
            for (int c = 0; c < marked.length; c++) {
                marked[c] = rng.nextDouble() < density;
            }
            double[] got = DistanceTransform.squared2d(marked, w, h);
            for (int j = 0; j < h; j++) {
                for (int i = 0; i < w; i++) {
                    double best = Double.POSITIVE_INFINITY;
                    for (int q = 0; q < h; q++) {
                        for (int p = 0; p < w; p++) {
                            if (marked[q * w + p]) {
                                best = Math.min(best, (double) (p - i) * (p - i) + (double) (q - j) * (q - j));
                            }
                        }
                    }
                    if (best == Double.POSITIVE_INFINITY) {
                        assertThat(got[j * w + i]).isGreaterThanOrEqualTo(DistanceTransform.FAR);
                    } else {
                        assertThat(got[j * w + i])
                                .as("trial %d cell %d,%d", trial, i, j)
                                .isEqualTo(best);
                    }
                }
            }
        }
    }

    @Test
    void distanceField_whenSingleOccupiedCell_thenHoldsEuclideanDistanceInMetres() {
        boolean[] cells = new boolean[10 * 10];
        cells[5 * 10 + 5] = true;
        DistanceField field = DistanceField.of(OccupancyGrid.of(0, 0, 0.05, 10, 10, cells));

        // 3-4-5 triangle in cells, times 5 cm
        assertThat(field.distance(8, 9)).isCloseTo(0.25, within(1e-6));
        assertThat(field.distance(5, 5)).isZero();
        assertThat(field.distanceAt(0.26, 0.26)).isZero();
        assertThat(field.distance(-1, 0)).isInfinite();
    }

    @Test
    void distanceField_whenNothingOccupied_thenInfiniteEverywhere() {
        DistanceField field = DistanceField.of(OccupancyGrid.of(0, 0, 0.1, 4, 3, new boolean[12]));

        assertThat(field.distance(2, 1)).isInfinite();
    }
}
