package dev.driftlab.evaluation;

import dev.driftlab.sim.FaultFiring;
import java.util.List;

/**
 * The figures of one trial (one run with one seed and one settings variant). Times in seconds,
 * distances in metres; NaN where a figure does not exist (never converged).
 *
 * @param variant settings variant name
 * @param seed the run's seed
 * @param duration robot time simulated, seconds
 * @param rmse root mean square position error over all frames
 * @param alignedAte absolute trajectory error after rigid alignment
 * @param finalPositionError position error at the last frame
 * @param finalHeadingError absolute heading error at the last frame, radians
 * @param convergenceTime first convergence, seconds from the start, NaN if never
 * @param lost lost episodes after the first convergence
 * @param kidnaps one outcome per kidnap
 * @param collisions times the robot was stopped by an obstacle
 * @param meanParticles mean particle count over the run
 * @param end how the trial ended (the whole route, or early with why, when and where)
 * @param faults each scheduled fault, in scenario order: whether it fired, and why not
 * @param rpe1 relative pose error over 1 s intervals, metres, NaN when the trial is shorter
 * @param rpe5 relative pose error over 5 s intervals, metres, NaN when the trial is shorter
 */
public record TrialOutcome(
        String variant,
        long seed,
        double duration,
        double rmse,
        double alignedAte,
        double finalPositionError,
        double finalHeadingError,
        double convergenceTime,
        List<Episode> lost,
        List<KidnapOutcome> kidnaps,
        int collisions,
        double meanParticles,
        TrialEnd end,
        List<FaultFiring> faults,
        double rpe1,
        double rpe5) {

    /** Interval of the short relative pose error, seconds. */
    public static final double RPE_SHORT = 1.0;

    /** Interval of the long relative pose error, seconds. */
    public static final double RPE_LONG = 5.0;

    /** The same outcome under another variant name (to tell batches apart in one report). */
    public TrialOutcome withVariant(String name) {
        return new TrialOutcome(
                name,
                seed,
                duration,
                rmse,
                alignedAte,
                finalPositionError,
                finalHeadingError,
                convergenceTime,
                lost,
                kidnaps,
                collisions,
                meanParticles,
                end,
                faults,
                rpe1,
                rpe5);
    }

    /** Copies the lists. */
    public TrialOutcome {
        lost = List.copyOf(lost);
        kidnaps = List.copyOf(kidnaps);
        faults = List.copyOf(faults);
        if (end == null) {
            throw new IllegalArgumentException("end must be given");
        }
    }

    /** Figures of a trace under the given rules. */
    public static TrialOutcome of(
            String variant,
            long seed,
            RunTrace trace,
            EpisodeRules rules,
            int collisions,
            TrialEnd end,
            List<FaultFiring> faults) {
        int n = trace.size();
        if (n == 0) {
            throw new IllegalArgumentException("a trial needs at least one frame");
        }
        double[] tx = new double[n];
        double[] ty = new double[n];
        double[] ex = new double[n];
        double[] ey = new double[n];
        double particles = 0;
        for (int i = 0; i < n; i++) {
            tx[i] = trace.trueX(i);
            ty[i] = trace.trueY(i);
            ex[i] = trace.estX(i);
            ey[i] = trace.estY(i);
            particles += trace.particles(i);
        }
        double converged = Episodes.convergence(trace, rules);
        List<Episode> lost = Double.isNaN(converged)
                ? List.of(new Episode(trace.time(0), trace.time(n - 1), false))
                : Episodes.lost(trace, rules, converged);
        return new TrialOutcome(
                variant,
                seed,
                trace.time(n - 1),
                TrajectoryError.rmse(trace.positionErrors()),
                TrajectoryError.alignedAte(tx, ty, ex, ey),
                trace.positionError(n - 1),
                trace.headingError(n - 1),
                converged,
                lost,
                Episodes.kidnaps(trace, rules),
                collisions,
                particles / n,
                end,
                faults,
                trace.relativePoseError(RPE_SHORT),
                trace.relativePoseError(RPE_LONG));
    }

    /** Whether at least one kidnap fired in this trial. */
    public boolean kidnapped() {
        return !kidnaps.isEmpty();
    }

    /** Longest lost episode in seconds (the whole run when it never converged); 0 if none. */
    public double longestLost() {
        double m = 0;
        for (Episode e : lost) {
            m = Math.max(m, e.duration());
        }
        return m;
    }

    /** Whether global localization converged. */
    public boolean converged() {
        return !Double.isNaN(convergenceTime);
    }

    /**
     * Whether every kidnap was recovered within the deadline (true when there was none: callers
     * that judge recovery must first ask {@link #kidnapped()}).
     */
    public boolean allRecoveredWithin(double seconds) {
        return kidnaps.stream().allMatch(k -> k.recoveredWithin(seconds));
    }
}
