package dev.driftlab.evaluation;

/**
 * What the filter did after one kidnap. Times are seconds after the kidnap; NaN when it never
 * happened before the run ended (or before the next kidnap, for recovery).
 *
 * @param at kidnap time, seconds from the run start
 * @param noticedAfter seconds until the filter showed it noticed (likelihood drop or injection)
 * @param recoveredAfter seconds until the estimate was right again (the recovery time)
 */
public record KidnapOutcome(double at, double noticedAfter, double recoveredAfter) {

    /** Whether the filter recovered at all. */
    public boolean recovered() {
        return !Double.isNaN(recoveredAfter);
    }

    /** Whether it recovered within a deadline in seconds. */
    public boolean recoveredWithin(double seconds) {
        return recovered() && recoveredAfter <= seconds;
    }

    /** Whether the filter noticed. */
    public boolean noticed() {
        return !Double.isNaN(noticedAfter);
    }
}
