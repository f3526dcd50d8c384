package dev.driftlab.localizer.protocol;

import dev.driftlab.geometry.OccupancyGrid;

/**
 * The occupancy grid's run-length rows: row 0 is the southmost row (its south edge at the grid's
 * origin y), each row a list of run lengths from west to east that alternate free, occupied,
 * free, ..., starting with free (a row that starts occupied starts with a 0). The runs of a row
 * add up to the grid's width.
 */
public final class OccupancyRows {

    private OccupancyRows() {}

    /** The runs of each row of the grid. */
    public static int[][] encode(OccupancyGrid grid) {
        int w = grid.width();
        int[][] rows = new int[grid.height()][];
        int[] runs = new int[w + 1];
        for (int j = 0; j < grid.height(); j++) {
            int n = 0;
            boolean occupied = false;
            int run = 0;
            for (int i = 0; i < w; i++) {
                boolean o = grid.isOccupied(i, j);
                if (o != occupied) {
                    runs[n++] = run;
                    run = 0;
                    occupied = o;
                }
                run++;
            }
            runs[n++] = run;
            rows[j] = java.util.Arrays.copyOf(runs, n);
        }
        return rows;
    }

    /**
     * Row-major cells (row 0 first) from runs.
     *
     * @throws IllegalArgumentException naming the row whose runs are negative or do not add up to
     *     the width
     */
    public static boolean[] decode(int[][] rows, int width) {
        boolean[] cells = new boolean[Math.multiplyExact(rows.length, width)];
        for (int j = 0; j < rows.length; j++) {
            int at = 0;
            boolean occupied = false;
            for (int run : rows[j]) {
                if (run < 0 || at + run > width) {
                    throw new IllegalArgumentException(
                            "map.rows[" + j + "]: runs must be >= 0 and add up to the width " + width);
                }
                if (occupied) {
                    java.util.Arrays.fill(cells, j * width + at, j * width + at + run, true);
                }
                at += run;
                occupied = !occupied;
            }
            if (at != width) {
                throw new IllegalArgumentException(
                        "map.rows[" + j + "]: runs add up to " + at + ", not the width " + width);
            }
        }
        return cells;
    }
}
