package dev.driftlab.evaluation;

import dev.driftlab.sim.FaultFiring;
import java.util.List;

/**
 * The figures of one trial (one run with one seed and one settings variant). Times in seconds,
 * distances in metres; NaN where a figure does not exist (never converged).
 *
 * <p>Answer times are measurements of the machine, not figures of the trial: {@link #equals}
 * leaves them out, so the same seed run twice (or in another process) gives equal outcomes.
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
 * @param answerP50 median time the localizer took to answer a scan, seconds of wall-clock time
 *     on the machine that ran the trial; NaN when not measured
 * @param answerP99 99th percentile (nearest rank) of the same times, seconds; NaN when not measured
 * @param localizerTrouble what went wrong with an outside localizer (kind, message, the last
 *     lines of its error output), empty when nothing did
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
        double rpe5,
        double answerP50,
        double answerP99,
        String localizerTrouble) {

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
                rpe5,
                answerP50,
                answerP99,
                localizerTrouble);
    }

    /** An outcome without answer times and without localizer trouble. */
    public TrialOutcome(
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
        this(
                variant,
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
                rpe5,
                Double.NaN,
                Double.NaN,
                "");
    }

    /** The same outcome with the localizer's answer times, seconds. */
    public TrialOutcome withAnswerTimes(double p50, double p99) {
        return new TrialOutcome(
                variant,
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
                rpe5,
                p50,
                p99,
                localizerTrouble);
    }

    /** The same outcome marked with what went wrong with the localizer. */
    public TrialOutcome withLocalizerTrouble(String trouble) {
        return new TrialOutcome(
                variant,
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
                rpe5,
                answerP50,
                answerP99,
                trouble);
    }

    /** Whether the localizer's answer times were measured. */
    public boolean answerTimed() {
        return Double.isFinite(answerP99);
    }

    /** Every component but the answer times (see the class comment). */
    @Override
    public boolean equals(Object o) {
        if (this == o) {
            return true;
        }
        if (!(o instanceof TrialOutcome t)) {
            return false;
        }
        return variant.equals(t.variant)
                && seed == t.seed
                && Double.compare(duration, t.duration) == 0
                && Double.compare(rmse, t.rmse) == 0
                && Double.compare(alignedAte, t.alignedAte) == 0
                && Double.compare(finalPositionError, t.finalPositionError) == 0
                && Double.compare(finalHeadingError, t.finalHeadingError) == 0
                && Double.compare(convergenceTime, t.convergenceTime) == 0
                && lost.equals(t.lost)
                && kidnaps.equals(t.kidnaps)
                && collisions == t.collisions
                && Double.compare(meanParticles, t.meanParticles) == 0
                && end.equals(t.end)
                && faults.equals(t.faults)
                && Double.compare(rpe1, t.rpe1) == 0
                && Double.compare(rpe5, t.rpe5) == 0
                && localizerTrouble.equals(t.localizerTrouble);
    }

    /** Consistent with {@link #equals}: leaves the answer times out. */
    @Override
    public int hashCode() {
        return java.util.Objects.hash(
                variant,
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
                rpe5,
                localizerTrouble);
    }

    /** Copies the lists. */
    public TrialOutcome {
        if (localizerTrouble == null) {
            throw new IllegalArgumentException("localizerTrouble must be given (empty when none)");
        }
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
        boolean counted = true;
        for (int i = 0; i < n; i++) {
            tx[i] = trace.trueX(i);
            ty[i] = trace.trueY(i);
            ex[i] = trace.estX(i);
            ey[i] = trace.estY(i);
            particles += trace.particles(i);
            counted &= trace.particles(i) >= 0;
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
                counted ? particles / n : Double.NaN,
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
