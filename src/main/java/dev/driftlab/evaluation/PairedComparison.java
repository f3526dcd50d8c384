package dev.driftlab.evaluation;

/**
 * A variant compared with the base on the same seeds (same simulated world and sensor data).
 * Differences are variant minus base; intervals are normal approximations (mean +/- 1.96 standard
 * errors of the per-seed differences).
 *
 * @param base base variant name
 * @param variant compared variant name
 * @param pairs seeds present in both
 * @param bothRecovered seeds where both recovered in time
 * @param onlyBaseRecovered seeds where only the base recovered
 * @param onlyVariantRecovered seeds where only the variant recovered
 * @param neitherRecovered seeds where neither did (or neither had a kidnap)
 * @param recoveryShareDifference difference of recovery success share
 * @param recoveryShareLow lower 95 % bound of that difference
 * @param recoveryShareHigh upper 95 % bound
 * @param rmseDifference mean per-seed RMS error difference, metres
 * @param rmseLow lower 95 % bound, metres
 * @param rmseHigh upper 95 % bound, metres
 * @param medianRecoveryTimeDifference median per-seed recovery time difference where both
 *     recovered, seconds (NaN if no such seed)
 */
public record PairedComparison(
        String base,
        String variant,
        int pairs,
        int bothRecovered,
        int onlyBaseRecovered,
        int onlyVariantRecovered,
        int neitherRecovered,
        double recoveryShareDifference,
        double recoveryShareLow,
        double recoveryShareHigh,
        double rmseDifference,
        double rmseLow,
        double rmseHigh,
        double medianRecoveryTimeDifference) {}
