package dev.driftlab.evaluation;

import dev.driftlab.geometry.NormalMath;
import java.util.Arrays;

/** Summary statistics for batch results. */
public final class Stats {

    private Stats() {}

    /**
     * Wilson score interval for a binomial proportion (Wilson 1927). Behaves well at 0 and n
     * successes, where the textbook normal interval collapses.
     *
     * @param successes number of successes, 0 to trials
     * @param trials number of trials, at least 1
     * @param confidence two-sided level, e.g. 0.95
     */
    public static Interval wilson(int successes, int trials, double confidence) {
        if (trials < 1 || successes < 0 || successes > trials) {
            throw new IllegalArgumentException(successes + " of " + trials + " is not a proportion");
        }
        double z = NormalMath.quantile(1 - (1 - confidence) / 2);
        double n = trials;
        double p = successes / n;
        double z2 = z * z;
        double centre = (p + z2 / (2 * n)) / (1 + z2 / n);
        double half = z / (1 + z2 / n) * Math.sqrt(p * (1 - p) / n + z2 / (4 * n * n));
        double lower = successes == 0 ? 0 : Math.max(0, centre - half);
        double upper = successes == trials ? 1 : Math.min(1, centre + half);
        return new Interval(lower, upper, confidence);
    }

    /**
     * Percentile by linear interpolation between closest ranks (the "type 7" rule used by common
     * spreadsheet and statistics software).
     *
     * @param values sample, any order, not modified
     * @param p percentile in [0, 100]
     * @return the percentile, NaN for an empty sample
     */
    public static double percentile(double[] values, double p) {
        if (values.length == 0) {
            return Double.NaN;
        }
        double[] sorted = values.clone();
        Arrays.sort(sorted);
        return percentileOfSorted(sorted, p);
    }

    /** {@link #percentile} on an already sorted array. */
    public static double percentileOfSorted(double[] sorted, double p) {
        if (sorted.length == 0) {
            return Double.NaN;
        }
        double h = (sorted.length - 1) * p / 100.0;
        int lo = (int) Math.floor(h);
        int hi = Math.min(sorted.length - 1, lo + 1);
        return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo]);
    }

    /** Arithmetic mean; NaN for an empty sample. */
    public static double mean(double[] values) {
        if (values.length == 0) {
            return Double.NaN;
        }
        double s = 0;
        for (double v : values) {
            s += v;
        }
        return s / values.length;
    }

    /** Sample standard deviation (n - 1 in the denominator); NaN below two values. */
    public static double stdDev(double[] values) {
        if (values.length < 2) {
            return Double.NaN;
        }
        double m = mean(values);
        double s = 0;
        for (double v : values) {
            s += (v - m) * (v - m);
        }
        return Math.sqrt(s / (values.length - 1));
    }
}
