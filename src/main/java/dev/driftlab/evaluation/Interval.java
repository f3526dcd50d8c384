package dev.driftlab.evaluation;

/**
 * A two-sided confidence interval for a proportion.
 *
 * @param lower lower bound, 0 to 1
 * @param upper upper bound, 0 to 1
 * @param confidence confidence level, e.g. 0.95
 */
public record Interval(double lower, double upper, double confidence) {
    /** Checks the bounds are ordered and inside [0, 1]. */
    public Interval {
        if (!(lower >= 0 && upper <= 1 && lower <= upper) || !(confidence > 0 && confidence < 1)) {
            throw new IllegalArgumentException("bad interval [" + lower + ", " + upper + "] at " + confidence);
        }
    }
}
