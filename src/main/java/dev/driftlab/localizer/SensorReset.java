package dev.driftlab.localizer;

import java.util.SplittableRandom;

/**
 * Sensor resetting: proposes poses that fit the current scan. Candidate positions are drawn from
 * free space, each is tried at a coarse set of evenly spaced headings, every candidate is scored
 * against the scan with the filter's own measurement model, and replacement poses are drawn in
 * proportion to those scores with a little jitter (after Lenser and Veloso's sensor resetting
 * localization, 2000; the candidate scheme is ours).
 */
final class SensorReset {

    /** Candidate positions per reset; enough to cover a few rooms at about a metre apart (common practice, no source). */
    static final int POSITIONS = 400;

    /** Headings tried at every candidate position. */
    static final int HEADINGS = 24;

    private static final double POSITION_JITTER = 0.1;
    private static final double HEADING_JITTER = Math.PI / HEADINGS / 2;

    private final FreeSpaceSampler freeSpace;
    private final double[] px = new double[POSITIONS];
    private final double[] py = new double[POSITIONS];
    private final double[] cx = new double[POSITIONS * HEADINGS];
    private final double[] cy = new double[POSITIONS * HEADINGS];
    private final double[] ch = new double[POSITIONS * HEADINGS];
    private final double[] score = new double[POSITIONS * HEADINGS];
    private final double[] cumulative = new double[POSITIONS * HEADINGS];

    SensorReset(FreeSpaceSampler freeSpace) {
        this.freeSpace = freeSpace;
    }

    /**
     * Draws and scores candidates for the scan the model is prepared with.
     *
     * @param model measurement model, already prepared with the current scan
     * @param rng randomness for the candidate positions
     */
    void score(MeasurementModel model, SplittableRandom rng) {
        freeSpace.sample(rng, px, py, 0, POSITIONS);
        int k = 0;
        for (int i = 0; i < POSITIONS; i++) {
            for (int h = 0; h < HEADINGS; h++) {
                cx[k] = px[i];
                cy[k] = py[i];
                ch[k] = ParticleSet.wrap(-Math.PI + (h + 0.5) * (2 * Math.PI / HEADINGS));
                k++;
            }
        }
        model.logLikelihoods(cx, cy, ch, 0, k, score);
        Weights.normalizeLog(score, k, cumulative);
        double c = 0;
        for (int i = 0; i < k; i++) {
            c += cumulative[i];
            cumulative[i] = c;
        }
    }

    /** Writes one pose drawn from the scored candidates into slot {@code i} of the set. */
    void draw(ParticleSet set, int i, SplittableRandom rng) {
        int n = cumulative.length;
        double u = rng.nextDouble() * cumulative[n - 1];
        int lo = 0;
        int hi = n - 1;
        while (lo < hi) {
            int mid = (lo + hi) >>> 1;
            if (cumulative[mid] > u) {
                hi = mid;
            } else {
                lo = mid + 1;
            }
        }
        set.x[i] = cx[lo] + POSITION_JITTER * rng.nextGaussian();
        set.y[i] = cy[lo] + POSITION_JITTER * rng.nextGaussian();
        set.heading[i] = ParticleSet.wrap(ch[lo] + HEADING_JITTER * rng.nextGaussian());
    }
}
