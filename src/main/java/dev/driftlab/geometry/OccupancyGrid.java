package dev.driftlab.geometry;

import java.util.List;

/**
 * A square-cell occupancy grid in the site frame. Cell (i, j) covers east from
 * {@code originX + i * cellSize} and north from {@code originY + j * cellSize}, one cell size
 * each way; cells are stored row by row, index {@code j * width + i}. A cell is occupied or free;
 * outside the grid counts as free.
 */
public final class OccupancyGrid {

    /** Default cell size in metres (5 cm). */
    public static final double DEFAULT_CELL_SIZE = 0.05;

    private static final long MAX_CELLS = 100_000_000L;

    private final double originX;
    private final double originY;
    private final double cellSize;
    private final int width;
    private final int height;
    private final boolean[] occupied;

    private OccupancyGrid(double originX, double originY, double cellSize, int width, int height, boolean[] occupied) {
        this.originX = originX;
        this.originY = originY;
        this.cellSize = cellSize;
        this.width = width;
        this.height = height;
        this.occupied = occupied;
    }

    /**
     * A grid from explicit cells (copied).
     *
     * @param originX east edge of column 0, metres
     * @param originY south edge of row 0, metres
     * @param cellSize cell side in metres, positive
     * @param width columns, positive
     * @param height rows, positive
     * @param occupied row-major occupancy, length width * height
     * @throws IllegalArgumentException on bad sizes
     */
    public static OccupancyGrid of(
            double originX, double originY, double cellSize, int width, int height, boolean[] occupied) {
        checkShape(originX, originY, cellSize, width, height);
        if (occupied.length != width * height) {
            throw new IllegalArgumentException(
                    "occupied has " + occupied.length + " cells, expected " + (long) width * height);
        }
        return new OccupancyGrid(originX, originY, cellSize, width, height, occupied.clone());
    }

    /**
     * Rasterises segments and solid polygons. Every cell a segment passes through is occupied;
     * every cell whose centre lies inside a solid polygon is occupied too. The grid covers the
     * bounding box of the segments and solids plus a margin.
     *
     * @param segments walls and edges, metres
     * @param solids filled shapes (fixtures), metres
     * @param cellSize cell side in metres, positive
     * @param margin free border around the content in metres, not negative
     * @throws IllegalArgumentException if the cell size is not positive or the grid would be too
     *     large (over 100 million cells)
     */
    public static OccupancyGrid rasterize(SegmentSet segments, List<Polygon> solids, double cellSize, double margin) {
        if (!(margin >= 0) || !Double.isFinite(margin)) {
            throw new IllegalArgumentException("margin must be finite and >= 0, got " + margin);
        }
        if (!(cellSize > 0) || !Double.isFinite(cellSize)) {
            throw new IllegalArgumentException("cellSize must be positive, got " + cellSize);
        }
        Bounds b = segments.size() > 0 ? segments.bounds() : null;
        for (Polygon p : solids) {
            if (p.corners().isEmpty()) {
                continue;
            }
            b = b == null ? p.bounds() : b.union(p.bounds());
        }
        if (b == null) {
            b = new Bounds(0, 0, 0, 0);
        }
        Bounds area = b.padded(margin);
        double ox = area.minX();
        double oy = area.minY();
        long w = Math.max(1, (long) Math.ceil((area.maxX() - ox) / cellSize));
        long h = Math.max(1, (long) Math.ceil((area.maxY() - oy) / cellSize));
        if (w * h > MAX_CELLS) {
            throw new IllegalArgumentException(
                    "grid of " + w + " x " + h + " cells at " + cellSize + " m is too large; use a larger cell size");
        }
        OccupancyGrid g = new OccupancyGrid(ox, oy, cellSize, (int) w, (int) h, new boolean[(int) (w * h)]);
        for (int s = 0; s < segments.size(); s++) {
            g.markSegment(segments.ax(s), segments.ay(s), segments.bx(s), segments.by(s));
        }
        for (Polygon p : solids) {
            g.fill(p);
        }
        return g;
    }

    private static void checkShape(double originX, double originY, double cellSize, int width, int height) {
        if (!Double.isFinite(originX) || !Double.isFinite(originY)) {
            throw new IllegalArgumentException("origin must be finite");
        }
        if (!(cellSize > 0) || !Double.isFinite(cellSize)) {
            throw new IllegalArgumentException("cellSize must be positive, got " + cellSize);
        }
        if (width < 1 || height < 1 || (long) width * height > MAX_CELLS) {
            throw new IllegalArgumentException("grid size " + width + " x " + height + " is out of range");
        }
    }

    /** Marks every cell the segment passes through (cell walk from end to end). */
    private void markSegment(double ax, double ay, double bx, double by) {
        double gx = (ax - originX) / cellSize;
        double gy = (ay - originY) / cellSize;
        double hx = (bx - originX) / cellSize;
        double hy = (by - originY) / cellSize;
        int ix = (int) Math.floor(gx);
        int iy = (int) Math.floor(gy);
        int ex = (int) Math.floor(hx);
        int ey = (int) Math.floor(hy);
        double dx = hx - gx;
        double dy = hy - gy;
        int stepX = dx > 0 ? 1 : -1;
        int stepY = dy > 0 ? 1 : -1;
        double tMaxX = dx != 0 ? ((ix + (dx > 0 ? 1 : 0)) - gx) / dx : Double.POSITIVE_INFINITY;
        double tMaxY = dy != 0 ? ((iy + (dy > 0 ? 1 : 0)) - gy) / dy : Double.POSITIVE_INFINITY;
        double tDeltaX = dx != 0 ? 1 / Math.abs(dx) : Double.POSITIVE_INFINITY;
        double tDeltaY = dy != 0 ? 1 / Math.abs(dy) : Double.POSITIVE_INFINITY;
        int guard = Math.abs(ex - ix) + Math.abs(ey - iy) + 2;
        mark(ix, iy);
        while (guard-- > 0 && (ix != ex || iy != ey)) {
            if (tMaxX < tMaxY) {
                if (tMaxX > 1) {
                    break;
                }
                ix += stepX;
                tMaxX += tDeltaX;
            } else {
                if (tMaxY > 1) {
                    break;
                }
                iy += stepY;
                tMaxY += tDeltaY;
            }
            mark(ix, iy);
        }
        mark(ex, ey);
    }

    private void mark(int i, int j) {
        if (i >= 0 && i < width && j >= 0 && j < height) {
            occupied[j * width + i] = true;
        }
    }

    private void fill(Polygon p) {
        if (p.corners().isEmpty()) {
            return;
        }
        Bounds b = p.bounds();
        int i0 = Math.max(0, (int) Math.floor((b.minX() - originX) / cellSize));
        int i1 = Math.min(width - 1, (int) Math.floor((b.maxX() - originX) / cellSize));
        int j0 = Math.max(0, (int) Math.floor((b.minY() - originY) / cellSize));
        int j1 = Math.min(height - 1, (int) Math.floor((b.maxY() - originY) / cellSize));
        for (int j = j0; j <= j1; j++) {
            double cy = originY + (j + 0.5) * cellSize;
            for (int i = i0; i <= i1; i++) {
                if (p.contains(originX + (i + 0.5) * cellSize, cy)) {
                    occupied[j * width + i] = true;
                }
            }
        }
    }

    /** East edge of column 0, metres. */
    public double originX() {
        return originX;
    }

    /** South edge of row 0, metres. */
    public double originY() {
        return originY;
    }

    /** Cell side, metres. */
    public double cellSize() {
        return cellSize;
    }

    /** Number of columns. */
    public int width() {
        return width;
    }

    /** Number of rows. */
    public int height() {
        return height;
    }

    /** Whether cell (i, j) is occupied; false outside the grid. */
    public boolean isOccupied(int i, int j) {
        return i >= 0 && i < width && j >= 0 && j < height && occupied[j * width + i];
    }

    /** Whether the cell holding the point (metres) is occupied; false outside the grid. */
    public boolean isOccupiedAt(double x, double y) {
        return isOccupied(column(x), row(y));
    }

    /** Column holding an east coordinate (may be outside 0..width-1). */
    public int column(double x) {
        return (int) Math.floor((x - originX) / cellSize);
    }

    /** Row holding a north coordinate (may be outside 0..height-1). */
    public int row(double y) {
        return (int) Math.floor((y - originY) / cellSize);
    }

    /** East coordinate of the centre of column i, metres. */
    public double centerX(int i) {
        return originX + (i + 0.5) * cellSize;
    }

    /** North coordinate of the centre of row j, metres. */
    public double centerY(int j) {
        return originY + (j + 0.5) * cellSize;
    }

    /** Number of occupied cells. */
    public int occupiedCount() {
        int n = 0;
        for (boolean b : occupied) {
            if (b) {
                n++;
            }
        }
        return n;
    }

    /** Row-major copy of the cells. */
    public boolean[] copyCells() {
        return occupied.clone();
    }

    boolean[] cells() {
        return occupied;
    }
}
