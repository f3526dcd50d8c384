package dev.driftlab.evaluation;

/**
 * Thresholds that turn an error series into events. Defaults: converged (and recovered) when the
 * position error stays under 0.3 m and the heading error under 10 degrees for 2 s; lost when the
 * position error stays over 1 m (or heading over 30 degrees) for 1 s; a kidnap is noticed when
 * the mean likelihood falls under half its level in the 5 s before the kidnap, or the filter
 * injects particles.
 *
 * @param convergePosition metres
 * @param convergeHeading radians
 * @param convergeHold seconds the error must stay under the thresholds
 * @param lostPosition metres
 * @param lostHeading radians
 * @param lostHold seconds the error must stay over the thresholds to count as lost
 * @param noticeRatio share of the pre-kidnap likelihood below which a drop counts as noticed
 * @param noticeWindow seconds before a kidnap used as the likelihood reference
 */
public record EpisodeRules(
        double convergePosition,
        double convergeHeading,
        double convergeHold,
        double lostPosition,
        double lostHeading,
        double lostHold,
        double noticeRatio,
        double noticeWindow) {

    /** Checks every threshold is positive and finite (holds may be 0). */
    public EpisodeRules {
        for (double v : new double[] {convergePosition, convergeHeading, lostPosition, lostHeading, noticeRatio}) {
            if (!(v > 0) || !Double.isFinite(v)) {
                throw new IllegalArgumentException("episode thresholds must be positive and finite");
            }
        }
        if (!(convergeHold >= 0 && lostHold >= 0 && noticeWindow >= 0)) {
            throw new IllegalArgumentException("hold times must be 0 or more");
        }
    }

    /** The defaults described above. */
    public static EpisodeRules defaults() {
        return new EpisodeRules(0.3, Math.toRadians(10), 2.0, 1.0, Math.toRadians(30), 1.0, 0.5, 5.0);
    }
}
