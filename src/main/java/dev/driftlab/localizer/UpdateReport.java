package dev.driftlab.localizer;

import java.util.List;
import java.util.Objects;

/**
 * What one call to {@link MonteCarloLocalizer#update} did and what the filter believes after it.
 *
 * @param updated false when the robot had not moved past the update thresholds, so the filter
 *     left its particles alone (the figures then repeat the last belief and the averages)
 * @param estimate weighted mean pose (circular mean heading) and covariance of all particles
 * @param hypotheses clusters of particles, heaviest first; two for a two-place ambiguity
 * @param effectiveSampleSize effective sample size after weighting, before resampling
 * @param particleCount particles after the update
 * @param meanLikelihood per-beam geometric mean of the weighted mean scan likelihood, per metre:
 *     {@code exp(log(sum_i w_i p(z | x_i)) / beams)}, 0 if no beam was usable
 * @param slowAverage augmented MCL slow average w_slow of the mean likelihood
 * @param fastAverage augmented MCL fast average w_fast
 * @param injectionProbability {@code max(0, 1 - w_fast / w_slow)} used this update (0 if off)
 * @param injected particles replaced by uniform free-space poses
 * @param sensorReset particles replaced by poses that fit the scan
 * @param resampled whether resampling ran
 * @param weightsUnderflowed whether the scan likelihood of every particle underflowed double
 *     precision; the recovery rule then ran instead of the weighting
 */
public record UpdateReport(
        boolean updated,
        Hypothesis estimate,
        List<Hypothesis> hypotheses,
        double effectiveSampleSize,
        int particleCount,
        double meanLikelihood,
        double slowAverage,
        double fastAverage,
        double injectionProbability,
        int injected,
        int sensorReset,
        boolean resampled,
        boolean weightsUnderflowed) {

    /** Checks presence and copies the hypothesis list. */
    public UpdateReport {
        Objects.requireNonNull(estimate, "estimate");
        hypotheses = List.copyOf(hypotheses);
    }

    /** The heaviest hypothesis. */
    public Hypothesis best() {
        return hypotheses.isEmpty() ? estimate : hypotheses.get(0);
    }
}
