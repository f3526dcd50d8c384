package dev.driftlab.localizer;

/**
 * The slow and fast running averages of the mean measurement likelihood from augmented MCL
 * (Thrun, Burgard and Fox, Probabilistic Robotics, table 8.3), and the injection probability
 * {@code max(0, 1 - w_fast / w_slow)} they give. Both averages start at 0, as in the table.
 */
public final class LikelihoodAverages {

    private final double slowRate;
    private final double fastRate;
    private double slow;
    private double fast;

    /**
     * Averages with the given rates, {@code 0 < slowRate < fastRate <= 1}.
     *
     * @param slowRate alpha_slow
     * @param fastRate alpha_fast
     */
    public LikelihoodAverages(double slowRate, double fastRate) {
        this.slowRate = slowRate;
        this.fastRate = fastRate;
    }

    /**
     * Folds in one mean likelihood: {@code w_slow += alpha_slow (w_avg - w_slow)} and likewise
     * for the fast average.
     *
     * @param meanLikelihood w_avg, not negative
     */
    public void update(double meanLikelihood) {
        slow += slowRate * (meanLikelihood - slow);
        fast += fastRate * (meanLikelihood - fast);
    }

    /** The slow average w_slow. */
    public double slow() {
        return slow;
    }

    /** The fast average w_fast. */
    public double fast() {
        return fast;
    }

    /** {@code max(0, 1 - w_fast / w_slow)}; 0 while w_slow is 0. */
    public double injectionProbability() {
        if (!(slow > 0)) {
            return 0.0;
        }
        return Math.max(0.0, 1.0 - fast / slow);
    }

    /** Forgets the history, as after a global reinitialisation. */
    public void reset() {
        slow = 0;
        fast = 0;
    }
}
