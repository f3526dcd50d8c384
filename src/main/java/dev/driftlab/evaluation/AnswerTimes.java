package dev.driftlab.evaluation;

import java.util.List;

/**
 * The localizer's answer times over trials, against the scan period: how long it took, from a scan
 * handed over to its estimate back, in wall-clock seconds on the machine that ran the trials. Each
 * trial carries its median and 99th percentile ({@link TrialOutcome#answerP50()}, {@link
 * TrialOutcome#answerP99()}); here they are summarised as the median trial's median and the
 * slowest trial's 99th percentile.
 *
 * @param timed trials whose answer times were measured
 * @param p50 median over those trials of their median answer time, seconds; NaN when none
 * @param worstP99 largest 99th percentile of any trial, seconds; NaN when none
 * @param scanPeriod seconds between scans (1 / rangefinder rate)
 * @param overPeriod trials whose 99th percentile is longer than the scan period
 */
public record AnswerTimes(int timed, double p50, double worstP99, double scanPeriod, int overPeriod) {

    /** The summary of the trials' answer times. */
    public static AnswerTimes of(List<TrialOutcome> trials, double scanPeriod) {
        double[] medians = trials.stream()
                .filter(TrialOutcome::answerTimed)
                .mapToDouble(TrialOutcome::answerP50)
                .toArray();
        double worst = trials.stream()
                .filter(TrialOutcome::answerTimed)
                .mapToDouble(TrialOutcome::answerP99)
                .max()
                .orElse(Double.NaN);
        int over = (int) trials.stream()
                .filter(t -> t.answerTimed() && t.answerP99() > scanPeriod)
                .count();
        return new AnswerTimes(
                medians.length,
                medians.length == 0 ? Double.NaN : Stats.percentile(medians, 50),
                worst,
                scanPeriod,
                over);
    }

    /** Whether any trial was timed. */
    public boolean measured() {
        return timed > 0;
    }
}
