package dev.driftlab.evaluation;

/**
 * Trajectory error figures. The absolute trajectory error (ATE) follows Sturm et al., "A Benchmark
 * for the Evaluation of RGB-D SLAM Systems", IROS 2012: the root mean square of the position
 * differences between estimate and truth after the rigid alignment that minimises it. Because a
 * localizer works in the map's own frame, {@link #rmse} (no alignment) is the figure gates use;
 * {@link #alignedAte} separates shape error from a constant offset.
 */
public final class TrajectoryError {

    private TrajectoryError() {}

    /** Root mean square of the given errors; NaN for none. */
    public static double rmse(double[] errors) {
        if (errors.length == 0) {
            return Double.NaN;
        }
        double s = 0;
        for (double e : errors) {
            s += e * e;
        }
        return Math.sqrt(s / errors.length);
    }

    /**
     * ATE after the best 2-D rigid alignment (rotation and translation, no scale) of the estimate
     * onto the truth, by the closed-form least-squares solution (Horn 1987; Umeyama 1991 without
     * scale).
     */
    public static double alignedAte(double[] trueX, double[] trueY, double[] estX, double[] estY) {
        int n = trueX.length;
        if (n == 0 || trueY.length != n || estX.length != n || estY.length != n) {
            throw new IllegalArgumentException("trajectories must have the same, non-zero length");
        }
        double mtx = 0;
        double mty = 0;
        double mex = 0;
        double mey = 0;
        for (int i = 0; i < n; i++) {
            mtx += trueX[i];
            mty += trueY[i];
            mex += estX[i];
            mey += estY[i];
        }
        mtx /= n;
        mty /= n;
        mex /= n;
        mey /= n;
        double sxx = 0;
        double sxy = 0;
        for (int i = 0; i < n; i++) {
            double ax = estX[i] - mex;
            double ay = estY[i] - mey;
            double bx = trueX[i] - mtx;
            double by = trueY[i] - mty;
            sxx += ax * bx + ay * by;
            sxy += ax * by - ay * bx;
        }
        double angle = Math.atan2(sxy, sxx);
        double c = Math.cos(angle);
        double s = Math.sin(angle);
        double sum = 0;
        for (int i = 0; i < n; i++) {
            double ax = estX[i] - mex;
            double ay = estY[i] - mey;
            double rx = c * ax - s * ay + mtx;
            double ry = s * ax + c * ay + mty;
            double dx = rx - trueX[i];
            double dy = ry - trueY[i];
            sum += dx * dx + dy * dy;
        }
        return Math.sqrt(sum / n);
    }
}
