package dev.driftlab.geometry;

/**
 * Exact squared Euclidean distance transform of sampled functions in linear time, after
 * Felzenszwalb and Huttenlocher, "Distance Transforms of Sampled Functions", Theory of Computing 8
 * (2012): the lower envelope of parabolas rooted at each sample, first along columns, then along
 * rows. Distances are in cell units.
 */
public final class DistanceTransform {

    /**
     * Stand-in for "no obstacle": large enough to exceed any squared distance on a grid of at most
     * 10^5 cells a side, small enough that adding a squared index stays exact in a double.
     */
    static final double FAR = 1e12;

    private DistanceTransform() {}

    /**
     * One-dimensional transform: {@code d[q] = min over p of ((q - p)^2 + f[p])}.
     *
     * @param f sampled function, length at least n; use a large finite value (1e12) for "none"
     * @param n number of samples
     * @param d output, length at least n
     * @param v scratch, length at least n
     * @param z scratch, length at least n + 1
     */
    public static void squared1d(double[] f, int n, double[] d, int[] v, double[] z) {
        if (n == 0) {
            return;
        }
        int k = 0;
        v[0] = 0;
        z[0] = Double.NEGATIVE_INFINITY;
        z[1] = Double.POSITIVE_INFINITY;
        for (int q = 1; q < n; q++) {
            double s = intersection(f, q, v[k]);
            while (s <= z[k]) {
                k--;
                s = intersection(f, q, v[k]);
            }
            k++;
            v[k] = q;
            z[k] = s;
            z[k + 1] = Double.POSITIVE_INFINITY;
        }
        k = 0;
        for (int q = 0; q < n; q++) {
            while (z[k + 1] < q) {
                k++;
            }
            double dq = q - v[k];
            d[q] = dq * dq + f[v[k]];
        }
    }

    private static double intersection(double[] f, int q, int p) {
        return ((f[q] + (double) q * q) - (f[p] + (double) p * p)) / (2.0 * q - 2.0 * p);
    }

    /**
     * Two-dimensional squared distance, in cells squared, from each cell centre to the nearest
     * marked cell centre; {@code FAR} or more where no cell is marked.
     *
     * @param marked row-major marks, length width * height
     * @param width columns
     * @param height rows
     * @return row-major squared distances in cell units
     */
    public static double[] squared2d(boolean[] marked, int width, int height) {
        if (marked.length != width * height) {
            throw new IllegalArgumentException("marked has " + marked.length + " cells, expected " + width * height);
        }
        int n = Math.max(width, height);
        double[] f = new double[n];
        double[] d = new double[n];
        int[] v = new int[n];
        double[] z = new double[n + 1];
        double[] out = new double[width * height];
        for (int i = 0; i < width; i++) {
            for (int j = 0; j < height; j++) {
                f[j] = marked[j * width + i] ? 0 : FAR;
            }
            squared1d(f, height, d, v, z);
            for (int j = 0; j < height; j++) {
                out[j * width + i] = d[j];
            }
        }
        for (int j = 0; j < height; j++) {
            System.arraycopy(out, j * width, f, 0, width);
            squared1d(f, width, d, v, z);
            System.arraycopy(d, 0, out, j * width, width);
        }
        return out;
    }
}
