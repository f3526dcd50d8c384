package dev.driftlab.evaluation;

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
        double z = normalQuantile(1 - (1 - confidence) / 2);
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

    /**
     * Quantile of the standard normal distribution by Acklam's rational approximation (relative
     * error below 1.2e-9, ample for interval bounds reported to four decimals).
     */
    public static double normalQuantile(double p) {
        if (!(p > 0 && p < 1)) {
            throw new IllegalArgumentException("probability must lie strictly between 0 and 1: " + p);
        }
        final double[] a = {
            -3.969683028665376e+01,
            2.209460984245205e+02,
            -2.759285104469687e+02,
            1.383577518672690e+02,
            -3.066479806614716e+01,
            2.506628277459239e+00
        };
        final double[] b = {
            -5.447609879822406e+01,
            1.615858368580409e+02,
            -1.556989798598866e+02,
            6.680131188771972e+01,
            -1.328068155288572e+01
        };
        final double[] c = {
            -7.784894002430293e-03,
            -3.223964580411365e-01,
            -2.400758277161838e+00,
            -2.549732539343734e+00,
            4.374664141464968e+00,
            2.938163982698783e+00
        };
        final double[] d = {7.784695709041462e-03, 3.224671290700398e-01, 2.445134137142996e+00, 3.754408661907416e+00};
        double q;
        double x;
        if (p < 0.02425) {
            q = Math.sqrt(-2 * Math.log(p));
            x = (((((c[0] * q + c[1]) * q + c[2]) * q + c[3]) * q + c[4]) * q + c[5])
                    / ((((d[0] * q + d[1]) * q + d[2]) * q + d[3]) * q + 1);
        } else if (p <= 1 - 0.02425) {
            q = p - 0.5;
            double r = q * q;
            x = (((((a[0] * r + a[1]) * r + a[2]) * r + a[3]) * r + a[4]) * r + a[5])
                    * q
                    / (((((b[0] * r + b[1]) * r + b[2]) * r + b[3]) * r + b[4]) * r + 1);
        } else {
            q = Math.sqrt(-2 * Math.log(1 - p));
            x = -(((((c[0] * q + c[1]) * q + c[2]) * q + c[3]) * q + c[4]) * q + c[5])
                    / ((((d[0] * q + d[1]) * q + d[2]) * q + d[3]) * q + 1);
        }
        return x;
    }
}
