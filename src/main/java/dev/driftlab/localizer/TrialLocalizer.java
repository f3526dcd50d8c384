package dev.driftlab.localizer;

import dev.driftlab.geometry.Pose;

/**
 * A localizer in the trial loop: the built-in {@link MonteCarloLocalizer} or an outside program
 * behind the open protocol. The trial hands it each scan with the odometry read at the same moment
 * and judges the estimate it answers with, the same way whoever wrote it.
 *
 * <p>Figures a localizer does not report are NaN in the {@link UpdateReport} (likelihood, effective
 * sample size, averages) and {@link Covariance#UNKNOWN} in a hypothesis; a localizer that shows no
 * particles answers {@link #showsParticles()} false, and its particle count is {@link
 * #UNKNOWN_COUNT}. Absent is never written as zero.
 */
public interface TrialLocalizer extends AutoCloseable {

    /** Particle count of a localizer that reports none. */
    int UNKNOWN_COUNT = -1;

    /**
     * One sensor cycle.
     *
     * @param odometry dead-reckoned pose, odometry frame (only its change between scans means anything)
     * @param scan the range scan taken at that pose
     * @return the belief after the scan
     * @throws LocalizerFailure when an outside localizer failed (crashed, hung, answered nonsense)
     */
    UpdateReport update(Pose odometry, Scan scan);

    /**
     * One sensor cycle at a known time; the trial loop calls this one. By default the time is not
     * used.
     *
     * @param time seconds since the start of the trial
     * @param odometry dead-reckoned pose, odometry frame
     * @param scan the range scan taken at that pose
     * @return the belief after the scan
     */
    default UpdateReport update(double time, Pose odometry, Scan scan) {
        return update(odometry, scan);
    }

    /**
     * The pose a belief is judged by: the heaviest hypothesis for the built-in filter (so a
     * two-place ambiguity does not average into a wall), the answered pose for an outside one.
     */
    default Pose judged(UpdateReport r) {
        return r.best().mean();
    }

    /** The particles of the last answer, to draw; read between updates. Empty when none are shown. */
    ParticleSet particles();

    /** Whether the last answer carried particles to draw (false means absent, not zero). */
    default boolean showsParticles() {
        return true;
    }

    /** Releases threads or the outside process; never throws. */
    @Override
    void close();
}
