package dev.driftlab.geometry;

/**
 * An occupancy grid with its distance field and grid ray caster, built together because the
 * localizer needs all three.
 *
 * @param grid the occupancy grid
 * @param field Euclidean distance field of the grid
 * @param caster ray caster on the grid
 */
public record GridMap(OccupancyGrid grid, DistanceField field, GridCaster caster) {

    /** Checks presence and that the field belongs to the grid. */
    public GridMap {
        if (grid == null || field == null || caster == null) {
            throw new IllegalArgumentException("grid, field and caster must be given");
        }
        if (field.grid() != grid) {
            throw new IllegalArgumentException("field must be computed from the given grid");
        }
    }

    /** Computes the distance field and caster of a grid. */
    public static GridMap of(OccupancyGrid grid) {
        DistanceField field = DistanceField.of(grid);
        return new GridMap(grid, field, new GridCaster(field));
    }

    /**
     * Reachable free space from a seed point, e.g. the route start.
     *
     * @param seedX east, metres
     * @param seedY north, metres
     * @param clearance least distance in metres to the nearest occupied cell centre
     * @see FreeSpace#reachable
     */
    public FreeSpace freeSpace(double seedX, double seedY, double clearance) {
        return FreeSpace.reachable(field, seedX, seedY, clearance);
    }
}
