package dev.driftlab.localizer;

import java.util.SplittableRandom;

/**
 * Small maps built in the tests, with nothing from the geometry package: an axis-aligned
 * rectangular room with a brute-force distance grid, an exact ray caster and a uniform free-space
 * sampler. Public so the benchmarks can use it too.
 */
public final class TestRooms {

    private TestRooms() {}

    /**
     * An empty rectangular room with walls on x = 0, x = width, y = 0, y = height.
     *
     * @param width inner width in metres, a multiple of cell
     * @param height inner height in metres, a multiple of cell
     * @param cell grid cell size in metres
     * @return the room
     */
    public static Room rectangle(double width, double height, double cell) {
        return new Room(width, height, cell);
    }

    /** A rectangular room and its three map views. */
    public static final class Room {
        final double width;
        final double height;
        final double cell;
        final int cols;
        final int rows;
        final double originX;
        final double originY;
        final boolean[] occupied;
        final float[] distances;

        Room(double width, double height, double cell) {
            this.width = width;
            this.height = height;
            this.cell = cell;
            // Cell i has its centre at x = (i - 1) * cell, so wall cells sit centred on the walls.
            this.originX = -1.5 * cell;
            this.originY = -1.5 * cell;
            this.cols = (int) Math.round(width / cell) + 3;
            this.rows = (int) Math.round(height / cell) + 3;
            this.occupied = new boolean[cols * rows];
            int occ = 0;
            for (int j = 0; j < rows; j++) {
                for (int i = 0; i < cols; i++) {
                    double cx = centreX(i);
                    double cy = centreY(j);
                    boolean wall = cx <= 1e-9 || cy <= 1e-9 || cx >= width - 1e-9 || cy >= height - 1e-9;
                    occupied[j * cols + i] = wall;
                    if (wall) {
                        occ++;
                    }
                }
            }
            int[] occIdx = new int[occ];
            int k = 0;
            for (int c = 0; c < occupied.length; c++) {
                if (occupied[c]) {
                    occIdx[k++] = c;
                }
            }
            this.distances = new float[cols * rows];
            for (int c = 0; c < distances.length; c++) {
                distances[c] = (float) bruteForceDistance(centreX(c % cols), centreY(c / cols), occIdx);
            }
        }

        double centreX(int i) {
            return originX + (i + 0.5) * cell;
        }

        double centreY(int j) {
            return originY + (j + 0.5) * cell;
        }

        private double bruteForceDistance(double x, double y, int[] occIdx) {
            double best = Double.POSITIVE_INFINITY;
            for (int c : occIdx) {
                double d = Math.hypot(centreX(c % cols) - x, centreY(c / cols) - y);
                if (d < best) {
                    best = d;
                }
            }
            return best;
        }

        /** Brute-force distance in metres from the centre of the cell holding (x, y) to the nearest wall cell centre. */
        public double bruteForceDistanceAt(double x, double y) {
            int i = (int) Math.floor((x - originX) / cell);
            int j = (int) Math.floor((y - originY) / cell);
            double best = Double.POSITIVE_INFINITY;
            for (int c = 0; c < occupied.length; c++) {
                if (occupied[c]) {
                    best = Math.min(best, Math.hypot(centreX(c % cols) - centreX(i), centreY(c / cols) - centreY(j)));
                }
            }
            return best;
        }

        /** The distance grid view. */
        public DistanceGrid grid() {
            float[] d = distances;
            return new ArrayDistanceGrid(cols, rows, originX, originY, cell, d);
        }

        /** Exact ray cast to the room walls from a point inside; max range on a miss. */
        public double cast(double x, double y, double angle, double maxRange) {
            double dx = Math.cos(angle);
            double dy = Math.sin(angle);
            double t = maxRange;
            if (dx > 1e-12) {
                t = Math.min(t, (width - x) / dx);
            } else if (dx < -1e-12) {
                t = Math.min(t, -x / dx);
            }
            if (dy > 1e-12) {
                t = Math.min(t, (height - y) / dy);
            } else if (dy < -1e-12) {
                t = Math.min(t, -y / dy);
            }
            return Math.max(0, t);
        }

        /** Uniform positions at least {@code margin} from every wall. */
        public FreeSpaceSampler freeSpace(double margin) {
            return (rng, xs, ys, from, count) -> {
                for (int i = from; i < from + count; i++) {
                    xs[i] = margin + rng.nextDouble() * (width - 2 * margin);
                    ys[i] = margin + rng.nextDouble() * (height - 2 * margin);
                }
            };
        }

        /** All three views. */
        public MapViews views() {
            return new MapViews(grid(), this::cast, freeSpace(0.2));
        }

        /** A noiseless scan from a robot pose, with no extra noise. */
        public double[] scan(double x, double y, double heading, Scan layout) {
            double sx = x
                    + Math.cos(heading) * layout.mount().x()
                    - Math.sin(heading) * layout.mount().y();
            double sy = y
                    + Math.sin(heading) * layout.mount().x()
                    + Math.cos(heading) * layout.mount().y();
            double[] r = new double[layout.beams()];
            for (int k = 0; k < r.length; k++) {
                r[k] = cast(sx, sy, heading + layout.mount().heading() + layout.angle(k), layout.maxRange());
            }
            return r;
        }

        /** A scan with Gaussian range noise of standard deviation sigma. */
        public double[] noisyScan(double x, double y, double heading, Scan layout, double sigma, SplittableRandom rng) {
            double[] r = scan(x, y, heading, layout);
            for (int k = 0; k < r.length; k++) {
                r[k] = Math.max(0, r[k] + sigma * rng.nextGaussian());
            }
            return r;
        }
    }
}
