package dev.driftlab.evaluation;

/**
 * A stretch of time when the filter was lost.
 *
 * @param start seconds from the run start when the error first went over the threshold
 * @param end seconds when it came back under, or the run's last frame time if it never did
 * @param ended whether it came back under before the run ended
 */
public record Episode(double start, double end, boolean ended) {
    /** Length in seconds. */
    public double duration() {
        return end - start;
    }
}
