package dev.driftlab.app.runs;

import dev.driftlab.evaluation.BatchSummary;
import dev.driftlab.evaluation.EpisodeRules;
import dev.driftlab.evaluation.RunTrace;
import dev.driftlab.evaluation.TrialOutcome;
import dev.driftlab.recording.FrameSink;
import dev.driftlab.report.Report;
import dev.driftlab.report.ResultJson;
import dev.driftlab.scenario.Problem;
import dev.driftlab.scenario.RouteTiming;
import dev.driftlab.scenario.Scenario;
import dev.driftlab.scenario.ScenarioFiles;
import dev.driftlab.scenario.SettingsVariant;
import dev.driftlab.trial.BatchResult;
import dev.driftlab.trial.LocalizerSource;
import dev.driftlab.trial.Sweep;
import dev.driftlab.trial.TrialRecords;
import dev.driftlab.trial.TrialRunner;
import java.time.Instant;
import java.time.temporal.ChronoUnit;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;
import java.util.OptionalInt;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.stereotype.Component;

/**
 * Runs trials in this server's process with the plain-Java engine: the simulator and the
 * localizer in lockstep for each seed, frames of the run's first seed recorded into chunks when
 * asked, each outcome stored losslessly ({@link TrialRecords}) so that the run's result can be
 * assembled by any process.
 * Compiled sites are kept for the few most recent scenario revisions, so a batch's runs (one per
 * variant) share one compilation. Thread-safe: the queue calls it from several workers at once.
 */
@Component
class EngineTrialExecutor implements TrialExecutor {

    /** Frames per stored chunk: about 5 s of a 10 Hz rangefinder. */
    static final int FRAMES_PER_CHUNK = 50;

    private static final int CACHED_SITES = 8;

    private final LocalizerAllowList localizers;

    @Autowired
    EngineTrialExecutor(LocalizerAllowList localizers) {
        this.localizers = localizers;
    }

    /** The built-in localizer only (tests). */
    EngineTrialExecutor() {
        this(new LocalizerAllowList(Map.of()));
    }

    private final Map<String, TrialRunner> runners = new LinkedHashMap<>(16, 0.75f, true) {
        @Override
        protected boolean removeEldestEntry(Map.Entry<String, TrialRunner> eldest) {
            return size() > CACHED_SITES;
        }
    };

    /** What every call needs: the checked scenario, the variant as run and the compiled site. */
    private record Prepared(Scenario scenario, SettingsVariant variant, TrialRunner runner, int[] sweepCounts) {}

    /**
     * @param source the localizer the runner starts: the run's own to run trials; assembling needs
     *     none, so any process can assemble whatever localizer the trials ran
     */
    private Prepared prepare(TrialRequest request, LocalizerSource source) {
        ScenarioFiles.Checked checked = ScenarioFiles.check(request.scenarioJson());
        if (!checked.ok()) {
            Problem first = checked.report().errors().get(0);
            throw new IllegalStateException(
                    "This revision does not validate, so it cannot run: " + first.path() + ": " + first.message());
        }
        Scenario scenario = checked.scenario().orElseThrow();
        SettingsVariant variant = scenario.allVariants().stream()
                .filter(v -> v.name().equals(request.variant()))
                .findFirst()
                .orElseThrow(() -> new IllegalStateException("No settings variant named " + request.variant()));
        TrialRunner runner = runner(request.scenarioJson(), scenario, source);
        int[] sweepCounts = new int[0];
        if (request.options().sweep()) {
            // one count of a particle-count sweep: the variant's settings at a fixed count, named by the count
            int count = request.options().particles();
            sweepCounts = new int[] {count};
            return new Prepared(
                    scenario, Sweep.variants(variant.settings(), sweepCounts).get(0), runner, sweepCounts);
        }
        return new Prepared(scenario, variant, runner, sweepCounts);
    }

    @Override
    public void runSeeds(TrialRequest request, List<Long> seeds, TrialContext context) throws InterruptedException {
        Prepared p = prepare(request, source(request.options()));
        double planned = Math.max(
                1, RouteTiming.runSeconds(p.scenario().route(), p.scenario().robot()));
        long recordedSeed = request.seeds().get(0);
        boolean single = request.seeds().size() == 1;
        for (int i = 0; i < seeds.size(); i++) {
            if (context.cancelled()) {
                throw new InterruptedException("cancelled");
            }
            long seed = seeds.get(i);
            final int done = i;
            // the run's first seed is the one whose frames the player shows
            FrameSink sink = seed == recordedSeed && request.options().recordFrames()
                    ? p.runner()
                            .recorder(FRAMES_PER_CHUNK, (index, first, count, data) -> context.frameChunk(index, data))
                    : FrameSink.NONE;
            long started = System.nanoTime();
            TrialRunner.Result r = p.runner()
                    .run(
                            p.variant(),
                            seed,
                            sink,
                            EpisodeRules.defaults(),
                            context::cancelled,
                            t -> context.progress(
                                    (done + Math.min(1, t / planned)) / seeds.size(),
                                    String.format(
                                            Locale.ROOT,
                                            "seed %d (%d of %d): %.0f of about %.0f s",
                                            seed,
                                            done + 1,
                                            seeds.size(),
                                            t,
                                            planned)));
            if (r.cancelled()) {
                throw new InterruptedException("cancelled");
            }
            double seconds = (System.nanoTime() - started) / 1e9;
            context.trialDone(new TrialRecord(
                    seed, TrialRecords.outcome(r.outcome()), single ? TrialRecords.trace(r.trace()) : null, seconds));
        }
        context.progress(1, "unit done");
    }

    @Override
    public StoredResult assemble(TrialRequest request, List<TrialRecord> trials) {
        Prepared p = prepare(request, LocalizerSource.BUILT_IN);
        List<TrialOutcome> outcomes = new ArrayList<>(trials.size());
        double seconds = 0;
        for (TrialRecord t : trials) {
            outcomes.add(TrialRecords.readOutcome(t.outcome()));
            seconds += t.seconds();
        }
        OptionalInt kldRequired = request.options().sweep()
                // what the KLD bound asks for at the start, for the sweep report's flag
                ? OptionalInt.of(Sweep.kldRequired(
                        p.runner(),
                        variantByName(p.scenario(), request.variant()).settings(),
                        request.seeds().get(0)))
                : OptionalInt.empty();
        boolean single = request.seeds().size() == 1;
        Optional<RunTrace> trace = single && trials.get(0).trace() != null
                ? Optional.of(TrialRecords.readTrace(trials.get(0).trace()))
                : Optional.empty();
        BatchResult result = new BatchResult(
                outcomes,
                BatchSummary.of(outcomes, p.scenario()),
                request.seeds().size(),
                false,
                seconds);
        long[] seedArray = request.seeds().stream().mapToLong(Long::longValue).toArray();
        Report report = Report.of(
                single ? Report.Kind.RUN : Report.Kind.BATCH,
                p.scenario(),
                p.scenario().name(),
                seedArray,
                result,
                trace,
                kldRequired,
                p.sweepCounts(),
                Instant.now().truncatedTo(ChronoUnit.SECONDS).toString());
        if (request.options().outside()) {
            report = report.withLocalizer(request.options().localizer());
        }
        return new StoredResult(ResultJson.render(report), report.verdict());
    }

    private static SettingsVariant variantByName(Scenario scenario, String name) {
        return scenario.allVariants().stream()
                .filter(v -> v.name().equals(name))
                .findFirst()
                .orElseThrow();
    }

    /**
     * The run's localizer: the built-in one, or the outside one of that name from this process's
     * allow-list. The engine hands a process only units of localizers it offers, so a missing name
     * means the list changed since the unit was queued.
     */
    private LocalizerSource source(TrialOptions options) {
        if (!options.outside()) {
            return LocalizerSource.BUILT_IN;
        }
        return localizers
                .find(options.localizer())
                .map(LocalizerAllowList.Allowed::source)
                .orElseThrow(() -> new IllegalStateException("This process does not offer the localizer '"
                        + options.localizer() + "' any more (driftlab.localizers); offered here: "
                        + (localizers.names().isEmpty() ? "none" : String.join(", ", localizers.names()))));
    }

    private TrialRunner runner(String json, Scenario scenario, LocalizerSource source) {
        synchronized (runners) {
            return runners.computeIfAbsent(source.name() + "\n" + json, k -> new TrialRunner(scenario, source));
        }
    }
}
