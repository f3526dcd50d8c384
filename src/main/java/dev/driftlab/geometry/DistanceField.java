package dev.driftlab.geometry;

/**
 * Euclidean distance from each cell centre of an occupancy grid to the nearest occupied cell
 * centre, computed exactly in linear time with {@link DistanceTransform}. Occupied cells hold 0;
 * a grid without occupied cells holds positive infinity everywhere. Immutable.
 */
public final class DistanceField {

    private final OccupancyGrid grid;
    /** Distances in cell units, row-major; 0 exactly on occupied cells. */
    private final float[] cells;

    private DistanceField(OccupancyGrid grid, float[] cells) {
        this.grid = grid;
        this.cells = cells;
    }

    /** Computes the distance field of a grid. */
    public static DistanceField of(OccupancyGrid grid) {
        double[] sq = DistanceTransform.squared2d(grid.cells(), grid.width(), grid.height());
        float[] cells = new float[sq.length];
        for (int k = 0; k < sq.length; k++) {
            cells[k] = sq[k] >= DistanceTransform.FAR ? Float.POSITIVE_INFINITY : (float) Math.sqrt(sq[k]);
        }
        return new DistanceField(grid, cells);
    }

    /** The grid this field was computed from. */
    public OccupancyGrid grid() {
        return grid;
    }

    /**
     * Distance in metres from the centre of cell (i, j) to the nearest occupied cell centre;
     * positive infinity outside the grid or when nothing is occupied.
     */
    public double distance(int i, int j) {
        if (i < 0 || i >= grid.width() || j < 0 || j >= grid.height()) {
            return Double.POSITIVE_INFINITY;
        }
        return cells[j * grid.width() + i] * grid.cellSize();
    }

    /**
     * Distance in metres looked up at the cell holding the point (nearest-cell lookup, so accurate
     * to about one cell); positive infinity outside the grid.
     */
    public double distanceAt(double x, double y) {
        return distance(grid.column(x), grid.row(y));
    }

    float[] cellUnits() {
        return cells;
    }
}
