package dev.driftlab.site;

import dev.driftlab.geometry.GridMap;
import dev.driftlab.geometry.OccupancyGrid;
import dev.driftlab.geometry.Polygon;
import dev.driftlab.geometry.SegmentCaster;
import dev.driftlab.geometry.SegmentSet;
import java.util.List;

/**
 * The map the robot was given: walls, doors in their mapped state and fixtures, without clutter.
 * Immutable.
 */
public final class BelievedMap {

    /** Free border in metres around the site when rasterising, so rays and fields have room. */
    public static final double GRID_MARGIN = 0.5;

    private final SegmentSet segments;
    private final List<Polygon> solids;
    private final SegmentCaster caster;

    BelievedMap(SegmentSet segments, List<Polygon> solids) {
        this.segments = segments;
        this.solids = List.copyOf(solids);
        this.caster = SegmentCaster.of(segments);
    }

    /** Every blocking segment: wall pieces, mapped-closed doors, fixture edges. */
    public SegmentSet segments() {
        return segments;
    }

    /** Filled shapes (fixtures). */
    public List<Polygon> solids() {
        return solids;
    }

    /** Exact ray caster on the map's segments. */
    public SegmentCaster exactCaster() {
        return caster;
    }

    /**
     * Rasterises the map: segments occupy every cell they cross, fixtures fill their interior.
     *
     * @param cellSize cell side in metres, e.g. {@link OccupancyGrid#DEFAULT_CELL_SIZE}
     */
    public OccupancyGrid occupancyGrid(double cellSize) {
        return OccupancyGrid.rasterize(segments, solids, cellSize, GRID_MARGIN);
    }

    /** The occupancy grid with its distance field and grid caster. */
    public GridMap gridMap(double cellSize) {
        return GridMap.of(occupancyGrid(cellSize));
    }
}
