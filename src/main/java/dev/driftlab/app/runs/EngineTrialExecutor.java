package dev.driftlab.app.runs;

import dev.driftlab.evaluation.BatchSummary;
import dev.driftlab.evaluation.EpisodeRules;
import dev.driftlab.evaluation.RunTrace;
import dev.driftlab.recording.FrameSink;
import dev.driftlab.report.Report;
import dev.driftlab.report.ResultJson;
import dev.driftlab.scenario.Problem;
import dev.driftlab.scenario.RouteTiming;
import dev.driftlab.scenario.Scenario;
import dev.driftlab.scenario.ScenarioFiles;
import dev.driftlab.scenario.SettingsVariant;
import dev.driftlab.trial.BatchResult;
import dev.driftlab.trial.Sweep;
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
import org.springframework.stereotype.Component;

/**
 * Runs trials in this server's process with the plain-Java engine: the simulator and the
 * localizer in lockstep for each seed, frames of the first seed recorded into chunks when asked.
 * Compiled sites are kept for the few most recent scenario revisions, so a batch's runs (one per
 * variant) share one compilation. Thread-safe: the queue calls it from several workers at once.
 */
@Component
class EngineTrialExecutor implements TrialExecutor {

    /** Frames per stored chunk: about 5 s of a 10 Hz rangefinder. */
    static final int FRAMES_PER_CHUNK = 50;

    private static final int CACHED_SITES = 8;

    private final Map<String, TrialRunner> runners = new LinkedHashMap<>(16, 0.75f, true) {
        @Override
        protected boolean removeEldestEntry(Map.Entry<String, TrialRunner> eldest) {
            return size() > CACHED_SITES;
        }
    };

    @Override
    public StoredResult execute(TrialRequest request, TrialContext context) throws InterruptedException {
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
        TrialRunner runner = runner(request.scenarioJson(), scenario);
        OptionalInt kldRequired = OptionalInt.empty();
        int[] sweepCounts = new int[0];
        if (request.options().sweep()) {
            // one count of a particle-count sweep: the variant's settings at a fixed count, named
            // by the count, with what the KLD bound asks for at the start for the report's flag
            int count = request.options().particles();
            kldRequired = OptionalInt.of(Sweep.kldRequired(
                    runner, variant.settings(), request.seeds().get(0)));
            variant = Sweep.variants(variant.settings(), new int[] {count}).get(0);
            sweepCounts = new int[] {count};
        }
        double planned = Math.max(1, RouteTiming.runSeconds(scenario.route(), scenario.robot()));
        List<Long> seeds = request.seeds();
        List<dev.driftlab.evaluation.TrialOutcome> outcomes = new ArrayList<>();
        RunTrace firstTrace = null;
        long started = System.nanoTime();
        for (int i = 0; i < seeds.size(); i++) {
            if (context.cancelled()) {
                throw new InterruptedException("cancelled");
            }
            long seed = seeds.get(i);
            final int done = i;
            FrameSink sink = i == 0 && request.options().recordFrames()
                    ? runner.recorder(FRAMES_PER_CHUNK, (index, first, count, data) -> context.frameChunk(index, data))
                    : FrameSink.NONE;
            TrialRunner.Result r = runner.run(
                    variant,
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
            outcomes.add(r.outcome());
            if (i == 0) {
                firstTrace = r.trace();
            }
        }
        double seconds = (System.nanoTime() - started) / 1e9;
        BatchResult result =
                new BatchResult(outcomes, BatchSummary.of(outcomes, scenario), seeds.size(), false, seconds);
        long[] seedArray = seeds.stream().mapToLong(Long::longValue).toArray();
        Report report = Report.of(
                seeds.size() == 1 ? Report.Kind.RUN : Report.Kind.BATCH,
                scenario,
                scenario.name(),
                seedArray,
                result,
                seeds.size() == 1 ? Optional.ofNullable(firstTrace) : Optional.empty(),
                kldRequired,
                sweepCounts,
                Instant.now().truncatedTo(ChronoUnit.SECONDS).toString());
        context.progress(1, "done");
        return new StoredResult(ResultJson.render(report), report.verdict());
    }

    private TrialRunner runner(String json, Scenario scenario) {
        synchronized (runners) {
            return runners.computeIfAbsent(json, k -> new TrialRunner(scenario));
        }
    }
}
