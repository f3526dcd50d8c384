package dev.driftlab.localizer;

/**
 * A range measurement model: the log-likelihood of one scan for many poses at once. Prepare it
 * with a scan, then ask for log-likelihoods of disjoint particle ranges, possibly from several
 * threads at once; the result for a pose never depends on how the work was split.
 */
public interface MeasurementModel {

    /**
     * Takes in a scan: picks every k-th beam and precomputes what all poses share. Not thread-safe;
     * call before any {@link #logLikelihoods}.
     *
     * @param scan the scan to score poses against
     */
    void prepare(Scan scan);

    /** Number of beams of the prepared scan that enter the likelihood. */
    int beamsUsed();

    /**
     * Natural log of p(scan | pose) for poses {@code [from, to)}, up to a constant shared by all
     * poses. Thread-safe for disjoint ranges of {@code out}; allocates nothing.
     *
     * @param x pose x in metres, site frame
     * @param y pose y in metres, site frame
     * @param heading pose heading in radians
     * @param from first pose
     * @param to one past the last pose
     * @param out receives the log-likelihoods at the same indices
     */
    void logLikelihoods(double[] x, double[] y, double[] heading, int from, int to, double[] out);
}
