package dev.driftlab.trial;

import dev.driftlab.geometry.DistanceField;
import dev.driftlab.geometry.FreeSpace;
import dev.driftlab.geometry.GridMap;
import dev.driftlab.geometry.OccupancyGrid;
import dev.driftlab.localizer.DistanceGrid;
import dev.driftlab.localizer.MapViews;

/**
 * Hands the believed map to the localizer through its own small interfaces: the distance field in
 * metres, the grid ray caster and uniform sampling of reachable free space.
 */
public final class MapAdapters {

    private MapAdapters() {}

    /**
     * Views of one rasterised believed map.
     *
     * @param map grid, distance field and grid caster of the believed map
     * @param free reachable free space of that map
     */
    public static MapViews views(GridMap map, FreeSpace free) {
        DistanceGrid distances = distanceGrid(map.field());
        dev.driftlab.localizer.FreeSpaceSampler sampler = new dev.driftlab.localizer.FreeSpaceSampler() {
            // one scratch per thread: trials on several threads share these views, so a shared
            // array would need a lock that every injection waits on
            private final ThreadLocal<double[][]> headings =
                    ThreadLocal.withInitial(() -> new double[][] {new double[0]});

            @Override
            public void sample(java.util.SplittableRandom rng, double[] xOut, double[] yOut, int from, int count) {
                double[][] h = headings.get();
                if (h[0].length < from + count) {
                    h[0] = new double[Math.max(from + count, h[0].length * 2)];
                }
                free.samplePoses(rng, xOut, yOut, h[0], from, count);
            }
        };
        dev.driftlab.geometry.GridCaster grid = map.caster();
        dev.driftlab.localizer.BeamCaster caster = new dev.driftlab.localizer.BeamCaster() {
            @Override
            public double cast(double x, double y, double angle, double maxRange) {
                return grid.cast(x, y, angle, maxRange);
            }

            @Override
            public double castAlong(double x, double y, double dirX, double dirY, double maxRange) {
                return grid.castAlong(x, y, dirX, dirY, maxRange);
            }

            @Override
            public void castRays(
                    double[] x,
                    double[] y,
                    double[] dirX,
                    double[] dirY,
                    int from,
                    int count,
                    double maxRange,
                    double[] out) {
                grid.castRays(x, y, dirX, dirY, from, count, maxRange, out);
            }
        };
        return new MapViews(distances, caster, sampler);
    }

    /** The distance field as a row-major float array in metres (copied once per map). */
    static DistanceGrid distanceGrid(DistanceField field) {
        OccupancyGrid g = field.grid();
        int w = g.width();
        int h = g.height();
        float[] metres = new float[w * h];
        for (int j = 0; j < h; j++) {
            for (int i = 0; i < w; i++) {
                double d = field.distance(i, j);
                metres[j * w + i] = (float) (Double.isFinite(d) ? d : Math.max(w, h) * g.cellSize());
            }
        }
        return new dev.driftlab.localizer.ArrayDistanceGrid(w, h, g.originX(), g.originY(), g.cellSize(), metres);
    }
}
