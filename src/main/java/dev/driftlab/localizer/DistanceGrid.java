package dev.driftlab.localizer;

/**
 * The believed map as a distance field: for every grid cell, the Euclidean distance in metres from
 * the cell centre to the nearest occupied cell. The likelihood-field model reads it once when it is
 * built and keeps its own table, so the view may be backed by any storage.
 *
 * <p>Cells are square and stored row-major: cell (column {@code i}, row {@code j}) sits at index
 * {@code j * width() + i} and covers x in [originX + i * cellSize, originX + (i + 1) * cellSize),
 * y in [originY + j * cellSize, originY + (j + 1) * cellSize), site frame, metres. Row 0 is the
 * southern edge.
 */
public interface DistanceGrid {

    /** Number of columns (cells along x), at least 1. */
    int width();

    /** Number of rows (cells along y), at least 1. */
    int height();

    /** x of the western edge of column 0, metres, site frame. */
    double originX();

    /** y of the southern edge of row 0, metres, site frame. */
    double originY();

    /** Side length of one cell, metres, greater than 0. */
    double cellSize();

    /**
     * Distance from each cell centre to the nearest occupied cell, metres, row-major, length {@code
     * width() * height()}. Occupied cells hold 0. Callers only read the array.
     */
    float[] distances();
}
