package dev.driftlab.evaluation;

/**
 * Percentile summary of a sample.
 *
 * @param count sample size
 * @param p50 median
 * @param p90 90th percentile
 * @param max largest value
 * @param mean arithmetic mean
 */
public record Spread(int count, double p50, double p90, double max, double mean) {

    /** Summary of a sample; all figures NaN for an empty one. */
    public static Spread of(double[] values) {
        if (values.length == 0) {
            return new Spread(0, Double.NaN, Double.NaN, Double.NaN, Double.NaN);
        }
        double[] sorted = values.clone();
        java.util.Arrays.sort(sorted);
        return new Spread(
                sorted.length,
                Stats.percentileOfSorted(sorted, 50),
                Stats.percentileOfSorted(sorted, 90),
                sorted[sorted.length - 1],
                Stats.mean(sorted));
    }
}
