package dev.driftlab.geometry;

import java.util.Arrays;
import java.util.SplittableRandom;

/**
 * The free cells of an occupancy grid that can be reached from a seed point without crossing an
 * occupied cell or a cell closer to one than a clearance, found by a 4-connected flood fill. Draws
 * positions uniformly over that area, e.g. to spread particles for global localization. Immutable.
 */
public final class FreeSpace {

    private final OccupancyGrid grid;
    private final int[] cells;

    private FreeSpace(OccupancyGrid grid, int[] cells) {
        this.grid = grid;
        this.cells = cells;
    }

    /**
     * The reachable free space from a seed.
     *
     * @param field distance field of the believed map's grid
     * @param seedX east coordinate of the seed in metres (e.g. the route start)
     * @param seedY north coordinate of the seed in metres
     * @param clearance least distance in metres from a cell centre to the nearest occupied cell
     *     centre for the cell to count as free; 0 admits every unoccupied cell
     * @throws IllegalArgumentException if the seed lies outside the grid or not in free space
     */
    public static FreeSpace reachable(DistanceField field, double seedX, double seedY, double clearance) {
        if (!(clearance >= 0) || !Double.isFinite(clearance)) {
            throw new IllegalArgumentException("clearance must be finite and >= 0, got " + clearance);
        }
        OccupancyGrid g = field.grid();
        int w = g.width();
        int h = g.height();
        int si = g.column(seedX);
        int sj = g.row(seedY);
        if (si < 0 || si >= w || sj < 0 || sj >= h) {
            throw new IllegalArgumentException("seed (" + seedX + ", " + seedY + ") lies outside the grid");
        }
        float[] dist = field.cellUnits();
        float need = (float) (clearance / g.cellSize());
        if (!isFree(dist, sj * w + si, need)) {
            throw new IllegalArgumentException("seed (" + seedX + ", " + seedY + ") is not in free space");
        }
        boolean[] seen = new boolean[w * h];
        int[] queue = new int[64];
        int head = 0;
        int tail = 0;
        queue[tail++] = sj * w + si;
        seen[sj * w + si] = true;
        while (head < tail) {
            int c = queue[head++];
            int i = c % w;
            int j = c / w;
            int[] next = {i > 0 ? c - 1 : -1, i < w - 1 ? c + 1 : -1, j > 0 ? c - w : -1, j < h - 1 ? c + w : -1};
            for (int n : next) {
                if (n >= 0 && !seen[n] && isFree(dist, n, need)) {
                    seen[n] = true;
                    if (tail == queue.length) {
                        queue = Arrays.copyOf(queue, queue.length * 2);
                    }
                    queue[tail++] = n;
                }
            }
        }
        int[] cells = Arrays.copyOf(queue, tail);
        Arrays.sort(cells);
        return new FreeSpace(g, cells);
    }

    private static boolean isFree(float[] dist, int c, float need) {
        return dist[c] > 0f && dist[c] >= need;
    }

    /** Number of reachable free cells. */
    public int cellCount() {
        return cells.length;
    }

    /** Reachable free area in square metres. */
    public double area() {
        return cells.length * grid.cellSize() * grid.cellSize();
    }

    /** Whether the cell holding the point (metres) is in this free space. */
    public boolean contains(double x, double y) {
        int i = grid.column(x);
        int j = grid.row(y);
        if (i < 0 || i >= grid.width() || j < 0 || j >= grid.height()) {
            return false;
        }
        return Arrays.binarySearch(cells, j * grid.width() + i) >= 0;
    }

    /**
     * Draws positions uniformly over the free area: a cell uniformly, then a point uniformly inside
     * it. Poses get headings uniform in (-pi, pi].
     *
     * @param rng random source, advanced by three draws per pose
     * @param xs east coordinates out, metres
     * @param ys north coordinates out, metres
     * @param headings headings out, radians
     * @param from first index to fill
     * @param count number of poses to draw
     */
    public void samplePoses(SplittableRandom rng, double[] xs, double[] ys, double[] headings, int from, int count) {
        double cs = grid.cellSize();
        int w = grid.width();
        for (int k = from; k < from + count; k++) {
            int c = cells[rng.nextInt(cells.length)];
            xs[k] = grid.originX() + (c % w + rng.nextDouble()) * cs;
            ys[k] = grid.originY() + (c / w + rng.nextDouble()) * cs;
            headings[k] = Math.PI - rng.nextDouble() * 2 * Math.PI;
        }
    }
}
