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

    /**
     * Relative pose error, translational part, as the root mean square over every pair of frames
     * {@code delta} seconds apart (Sturm et al. 2012, section on the relative pose error): for a
     * pair (i, j) the error is E = (Q_i^-1 Q_j)^-1 (P_i^-1 P_j) with Q the true and P the estimated
     * poses, and its translation is taken. Frame j is the first at or after t_i + delta. Pairs that
     * span a break (a kidnap or a shove, when the true pose jumps) are left out, since the figure
     * measures drift over travel, not the jump. Allocates nothing.
     *
     * @param t frame times, seconds, not decreasing
     * @param breaks times of jumps of the true pose, seconds
     * @return metres; NaN when no pair fits
     */
    public static double relativePoseError(
            double[] t,
            double[] tx,
            double[] ty,
            double[] th,
            double[] ex,
            double[] ey,
            double[] eh,
            int n,
            double delta,
            double[] breaks) {
        if (!(delta > 0)) {
            throw new IllegalArgumentException("the interval must be positive, got " + delta);
        }
        double sum = 0;
        int pairs = 0;
        int j = 0;
        for (int i = 0; i < n; i++) {
            double target = t[i] + delta - 1e-9;
            if (j < i) {
                j = i;
            }
            while (j < n && t[j] < target) {
                j++;
            }
            if (j >= n) {
                break;
            }
            if (spansBreak(breaks, t[i], t[j])) {
                continue;
            }
            // truth and estimate motions, each expressed in its own frame i
            double qx = localX(tx[j] - tx[i], ty[j] - ty[i], th[i]);
            double qy = localY(tx[j] - tx[i], ty[j] - ty[i], th[i]);
            double px = localX(ex[j] - ex[i], ey[j] - ey[i], eh[i]);
            double py = localY(ex[j] - ex[i], ey[j] - ey[i], eh[i]);
            // trans(Q^-1 P) = R(-q_theta) (p - q): a rotation keeps the length
            double dx = px - qx;
            double dy = py - qy;
            sum += dx * dx + dy * dy;
            pairs++;
        }
        return pairs == 0 ? Double.NaN : Math.sqrt(sum / pairs);
    }

    private static boolean spansBreak(double[] breaks, double from, double to) {
        for (double b : breaks) {
            if (b > from && b <= to) {
                return true;
            }
        }
        return false;
    }

    private static double localX(double dx, double dy, double heading) {
        return Math.cos(heading) * dx + Math.sin(heading) * dy;
    }

    private static double localY(double dx, double dy, double heading) {
        return -Math.sin(heading) * dx + Math.cos(heading) * dy;
    }
}
