package dev.driftlab.localizer;

/**
 * A distance grid held in a plain array, the usual way to hand a map to the likelihood field.
 *
 * @param width columns
 * @param height rows
 * @param originX west edge of column 0, metres
 * @param originY south edge of row 0, metres
 * @param cellSize cell side, metres
 * @param distances row-major distances in metres from each cell centre to the nearest obstacle
 */
public record ArrayDistanceGrid(
        int width, int height, double originX, double originY, double cellSize, float[] distances)
        implements DistanceGrid {

    /** Checks the array matches the grid size. */
    public ArrayDistanceGrid {
        if (width < 1 || height < 1 || distances.length != width * height || !(cellSize > 0)) {
            throw new IllegalArgumentException("distance grid of " + width + " x " + height + " needs "
                    + (long) width * height + " values and a positive cell size");
        }
    }
}
