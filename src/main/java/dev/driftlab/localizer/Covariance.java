package dev.driftlab.localizer;

/**
 * Symmetric 3 x 3 covariance of a pose (x, y, heading), site frame. Units: m^2 for the position
 * block, m rad for the cross terms, rad^2 for heading; heading deviations are wrapped to (-pi, pi]
 * around the circular mean before they enter.
 *
 * @param xx variance of x
 * @param xy covariance of x and y
 * @param xh covariance of x and heading
 * @param yy variance of y
 * @param yh covariance of y and heading
 * @param hh variance of heading
 */
public record Covariance(double xx, double xy, double xh, double yy, double yh, double hh) {

    /** A covariance the localizer did not report: every entry NaN (see {@link #known()}). */
    public static final Covariance UNKNOWN =
            new Covariance(Double.NaN, Double.NaN, Double.NaN, Double.NaN, Double.NaN, Double.NaN);

    /**
     * Checks that every entry is finite and the variances are not negative, or that every entry is
     * NaN (not reported).
     */
    public Covariance {
        boolean allNaN = Double.isNaN(xx)
                && Double.isNaN(xy)
                && Double.isNaN(xh)
                && Double.isNaN(yy)
                && Double.isNaN(yh)
                && Double.isNaN(hh);
        if (!allNaN && !Double.isFinite(xx + xy + xh + yy + yh + hh)) {
            throw new IllegalArgumentException("covariance entries must be finite");
        }
        if (xx < 0 || yy < 0 || hh < 0) {
            throw new IllegalArgumentException("variances must not be negative");
        }
    }

    /** Whether the localizer reported this covariance (false for {@link #UNKNOWN}). */
    public boolean known() {
        return !Double.isNaN(xx);
    }

    /** Root-mean-square position spread {@code sqrt(xx + yy)}, metres. */
    public double positionSpread() {
        return Math.sqrt(xx + yy);
    }
}
