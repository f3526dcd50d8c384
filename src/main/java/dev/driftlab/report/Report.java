package dev.driftlab.report;

import dev.driftlab.evaluation.BatchSummary;
import dev.driftlab.evaluation.GateVerdict;
import dev.driftlab.evaluation.RunTrace;
import dev.driftlab.evaluation.TrialOutcome;
import dev.driftlab.evaluation.VariantSummary;
import dev.driftlab.scenario.Scenario;
import dev.driftlab.trial.BatchResult;
import java.util.List;
import java.util.Optional;
import java.util.OptionalInt;

/**
 * Everything a report shows, independent of how it is rendered (HTML page, JSON, JUnit XML).
 *
 * @param kind one run, a batch, or a particle-count sweep
 * @param scenario the scenario run
 * @param source where the scenario came from (file name or revision), shown in the header
 * @param seeds the seeds run
 * @param trials finished trials
 * @param summary per-variant figures and gate verdicts
 * @param planned trials planned
 * @param cancelled whether the work stopped early
 * @param seconds wall-clock seconds taken
 * @param trace per-frame figures, for a single run
 * @param kldRequired particles the KLD bound asks for, for a sweep
 * @param sweepCounts particle counts of a sweep, in variant order
 * @param generatedAt ISO-8601 time the report was made
 * @param keyFrames recorded frames to draw (before a kidnap, just after, recovered), may be empty
 * @param beamAngles beam angles of the rangefinder in the sensor frame, radians, for drawing scans
 * @param localizer the localizer judged: {@link #BUILT_IN} or the outside program's command
 */
public record Report(
        Kind kind,
        Scenario scenario,
        String source,
        long[] seeds,
        List<TrialOutcome> trials,
        BatchSummary summary,
        int planned,
        boolean cancelled,
        double seconds,
        Optional<RunTrace> trace,
        OptionalInt kldRequired,
        int[] sweepCounts,
        String generatedAt,
        List<KeyFrame> keyFrames,
        double[] beamAngles,
        String localizer) {

    /** The {@link #localizer} of reports of the built-in localizer. */
    public static final String BUILT_IN = dev.driftlab.trial.LocalizerSource.BUILT_IN.name();

    /**
     * A frame drawn in the report.
     *
     * @param caption what it shows
     * @param frame the recorded frame
     */
    public record KeyFrame(String caption, dev.driftlab.recording.Frame frame) {}

    /** The same report with key frames to draw. */
    public Report withKeyFrames(List<KeyFrame> frames, double[] angles) {
        return new Report(
                kind,
                scenario,
                source,
                seeds,
                trials,
                summary,
                planned,
                cancelled,
                seconds,
                trace,
                kldRequired,
                sweepCounts,
                generatedAt,
                frames,
                angles.clone(),
                localizer);
    }

    /** The same report of trials run by the named localizer. */
    public Report withLocalizer(String name) {
        return new Report(
                kind,
                scenario,
                source,
                seeds,
                trials,
                summary,
                planned,
                cancelled,
                seconds,
                trace,
                kldRequired,
                sweepCounts,
                generatedAt,
                keyFrames,
                beamAngles,
                name);
    }

    /** Whether the trials ran an outside localizer. */
    public boolean outsideLocalizer() {
        return !localizer.equals(BUILT_IN);
    }

    /** What kind of work the report covers. */
    public enum Kind {
        RUN,
        BATCH,
        SWEEP
    }

    /** Copies the list. */
    public Report {
        trials = List.copyOf(trials);
        keyFrames = List.copyOf(keyFrames);
    }

    /** A report of one batch (or sweep) result. */
    public static Report of(
            Kind kind,
            Scenario scenario,
            String source,
            long[] seeds,
            BatchResult result,
            Optional<RunTrace> trace,
            OptionalInt kld,
            int[] sweepCounts,
            String generatedAt) {
        return new Report(
                kind,
                scenario,
                source,
                seeds.clone(),
                result.trials(),
                result.summary(),
                result.planned(),
                result.cancelled(),
                result.seconds(),
                trace,
                kld,
                sweepCounts.clone(),
                generatedAt,
                List.of(),
                new double[0],
                BUILT_IN);
    }

    /** Every gate verdict of every variant, base first. */
    public List<GateVerdict> verdicts() {
        return summary.variants().stream().flatMap(v -> v.gates().stream()).toList();
    }

    /**
     * Whether every gate holds on trials that exercised it. Every scenario has at least the
     * default route gate unless its route allows contact; without any gate the report passes when
     * every trial ran. A cancelled batch never passes.
     */
    public boolean passed() {
        return verdict() == dev.driftlab.evaluation.Verdict.PASS;
    }

    /** The verdict at a glance: pass, fail, ended early, not exercised or incomplete. */
    public dev.driftlab.evaluation.Verdict verdict() {
        return dev.driftlab.evaluation.Verdict.of(verdicts(), !cancelled && trials.size() >= planned);
    }

    /** The base variant's summary, if any trial finished. */
    public Optional<VariantSummary> base() {
        return summary.variants().stream().findFirst();
    }

    /** The caution printed on every report. */
    public static final String CAUTION =
            "Simulation results do not certify safety. Robots move near people: follow the "
                    + "applicable safety standards, local codes and licensed practice, and test on the real robot at the "
                    + "real site.";
}
