package dev.driftlab.app.reports;

import dev.driftlab.app.runs.RunBoard;
import dev.driftlab.app.runs.RunNotFound;
import dev.driftlab.app.runs.RunScenario;
import dev.driftlab.app.runs.RunState;
import dev.driftlab.app.runs.TrialOptions;
import dev.driftlab.app.runs.persistence.RunRepository.RunRow;
import dev.driftlab.app.scenarios.ScenarioStore;
import dev.driftlab.evaluation.BatchSummary;
import dev.driftlab.evaluation.KeyFrames;
import dev.driftlab.evaluation.KidnapOutcome;
import dev.driftlab.evaluation.RunTrace;
import dev.driftlab.evaluation.TrialOutcome;
import dev.driftlab.recording.Frame;
import dev.driftlab.report.Findings;
import dev.driftlab.report.Report;
import dev.driftlab.scenario.Scenario;
import dev.driftlab.sim.ScanGeometry;
import dev.driftlab.trial.BatchResult;
import java.time.Instant;
import java.time.temporal.ChronoUnit;
import java.util.ArrayList;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Optional;
import java.util.OptionalInt;
import java.util.Set;
import java.util.function.Function;
import tools.jackson.databind.DeserializationFeature;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;

/**
 * Builds the report model of a run or a batch from what the runs stored: the trials are
 * reconstructed from each run's result document and summarised again together (so variants are
 * compared pair by pair on their common seeds), and the key frames come from the first run that
 * recorded frames.
 */
public final class RunReports {

    // a result document carries much more than the totals read here, and older ones lack the KLD figure
    private static final JsonMapper MAPPER = JsonMapper.builder()
            .disable(DeserializationFeature.FAIL_ON_UNKNOWN_PROPERTIES)
            .disable(DeserializationFeature.FAIL_ON_NULL_FOR_PRIMITIVES)
            .build();

    /**
     * The totals of a stored result document that a report adds up over runs (its trials are read by
     * {@code ResultJson.trials}).
     *
     * @param seconds time the run took, 0 when not written
     * @param kldRequiredParticles the KLD bound for the start belief, null when not written
     */
    record ResultTotals(double seconds, Integer kldRequiredParticles) {}

    private final ScenarioStore store;
    private final RunBoard board;

    /** Reads through the given store and board. */
    public RunReports(ScenarioStore store, RunBoard board) {
        this.store = store;
        this.board = board;
    }

    /** The report of one run. */
    public Report ofRun(RunRow run) {
        return of(List.of(run));
    }

    /**
     * The headline findings of one run's report ({@link Findings#headline}): early ends, faults
     * that did not fire, gates no trial exercised. Empty for a run without a result, and for a
     * result whose trials do not read. Builds the report without its pictures, so it is cheap
     * enough for the run's page.
     */
    public List<String> headline(RunRow run) {
        if (!run.hasResult()) {
            return List.of();
        }
        try {
            Scenario scenario = RunScenario.of(store, run);
            return Findings.headline(build(List.of(run), scenario, scenario.name(), r -> "", false, false, false));
        } catch (RuntimeException e) {
            // a result that no longer reads costs the findings, not the page
            return List.of();
        }
    }

    /** The report of the runs submitted with this one (the whole batch). */
    public Report ofBatch(RunRow run) {
        return of(board.batch(run.scenarioId(), run.batchKey()));
    }

    /** The report of the given runs, which share one scenario revision. */
    public Report of(List<RunRow> runs) {
        if (runs.isEmpty()) {
            throw new RunNotFound();
        }
        Scenario scenario = RunScenario.of(store, runs.get(0));
        boolean sweep = runs.stream().allMatch(r -> TrialOptions.of(r).sweep());
        return build(
                runs,
                scenario,
                scenario.name() + ", revision " + runs.get(0).revisionNumber(),
                r -> "",
                sweep,
                true,
                false);
    }

    /**
     * The report of the runs submitted with this one, shaped as the command line's {@code batch}
     * job makes it: a batch (or sweep) report whatever the number of runs and seeds, with no key
     * frames or run plots, so the result document, JUnit file and page made from it are those a
     * local job writes for the same trials.
     */
    public Report ofBatchFiles(RunRow run) {
        List<RunRow> runs = board.batch(run.scenarioId(), run.batchKey());
        Scenario scenario = RunScenario.of(store, runs.get(0));
        boolean sweep = runs.stream().allMatch(r -> TrialOptions.of(r).sweep());
        return build(
                runs,
                scenario,
                scenario.name() + ", revision " + runs.get(0).revisionNumber(),
                r -> "",
                sweep,
                false,
                true);
    }

    /**
     * A before-and-after report of two batches of one scenario, typically the same seeds on the
     * revision before a change and on the one after it. Each variant is labelled with its revision
     * (or its run number when both share a revision), the earlier batch's variants come first, so
     * the later ones are compared pair by pair against the earlier base on their common seeds. The
     * plan, settings and gates shown are those of {@code after}.
     */
    public Report compare(RunRow before, RunRow after) {
        List<RunRow> first = board.batch(before.scenarioId(), before.batchKey());
        List<RunRow> second = board.batch(after.scenarioId(), after.batchKey());
        boolean sameRevision = before.revisionNumber() == after.revisionNumber();
        Set<Long> firstIds = new java.util.HashSet<>();
        first.forEach(r -> firstIds.add(r.id()));
        Function<RunRow, String> label = r -> {
            RunRow head = firstIds.contains(r.id()) ? before : after;
            return sameRevision ? ", run #" + head.id() : ", revision " + r.revisionNumber();
        };
        List<RunRow> runs = new ArrayList<>(first);
        runs.addAll(second);
        Scenario scenario = RunScenario.of(store, after);
        String source = scenario.name() + ", revision " + after.revisionNumber() + " against revision "
                + before.revisionNumber();
        return build(runs, scenario, source, label, false, true, false);
    }

    /**
     * The report of runs whose trials are relabelled: each trial's variant gets the label its run
     * adds (empty for a plain batch). Key frames and the run's plots come from recorded frames
     * when {@code pictures} is set. A single run of one seed makes a run report unless
     * {@code asBatch} asks for the batch shape, which also reads each run's trials unrounded where
     * they are stored so.
     */
    private Report build(
            List<RunRow> runs,
            Scenario scenario,
            String source,
            Function<RunRow, String> label,
            boolean sweep,
            boolean pictures,
            boolean asBatch) {
        // the batch files are to equal a local job's, so they are summarised from unrounded trials
        boolean exact = asBatch;
        OptionalInt kld = OptionalInt.empty();
        List<TrialOutcome> trials = new ArrayList<>();
        Set<Long> seeds = new LinkedHashSet<>();
        int planned = 0;
        double seconds = 0;
        boolean cancelled = false;
        for (RunRow r : runs) {
            List<Long> s = r.seedList();
            seeds.addAll(s);
            planned += s.size();
            // only a cancel stops a batch early; a run still queued or running, interrupted by a
            // stopped server or failed simply has not run its trials, and the report says so
            cancelled |= RunState.CANCELLED.word().equals(r.state());
            Optional<String> json = board.result(r.id());
            if (json.isPresent()) {
                JsonNode doc = MAPPER.readTree(json.get());
                ResultTotals totals = MAPPER.treeToValue(doc, ResultTotals.class);
                seconds += totals.seconds();
                if (kld.isEmpty() && totals.kldRequiredParticles() != null) {
                    kld = OptionalInt.of(totals.kldRequiredParticles());
                }
                String suffix = label.apply(r);
                List<TrialOutcome> stored = exact ? board.exactTrials(r).orElseGet(() -> trials(doc)) : trials(doc);
                for (TrialOutcome t : stored) {
                    trials.add(suffix.isEmpty() ? t : t.withVariant(t.variant() + suffix));
                }
            }
        }
        long[] seedArray = seeds.stream().mapToLong(Long::longValue).toArray();
        BatchResult result = new BatchResult(trials, BatchSummary.of(trials, scenario), planned, cancelled, seconds);
        boolean single = !asBatch && runs.size() == 1 && seedArray.length == 1;
        Optional<Recorded> recorded = pictures ? recorded(runs, trials, label) : Optional.empty();
        boolean sweepReport = sweep && !single;
        Report report = Report.of(
                single ? Report.Kind.RUN : sweepReport ? Report.Kind.SWEEP : Report.Kind.BATCH,
                scenario,
                source,
                seedArray,
                result,
                single ? recorded.map(Recorded::trace) : Optional.empty(),
                sweepReport ? kld : OptionalInt.empty(),
                sweepReport
                        ? runs.stream()
                                .mapToInt(r -> TrialOptions.of(r).particles())
                                .toArray()
                        : new int[0],
                Instant.now().truncatedTo(ChronoUnit.SECONDS).toString());
        if (recorded.isPresent()) {
            Recorded rec = recorded.get();
            List<Report.KeyFrame> keys = new ArrayList<>();
            for (KeyFrames.Pick p : KeyFrames.pick(rec.trace(), rec.outcome())) {
                if (p.index() < rec.frames().size()) {
                    keys.add(new Report.KeyFrame(
                            p.caption() + ", " + rec.outcome().variant() + ", seed "
                                    + rec.outcome().seed(),
                            rec.frames().get(p.index())));
                }
            }
            report = report.withKeyFrames(
                    keys, ScanGeometry.of(scenario.rangefinder()).copyAngles());
        }
        // runs of one submission judge one localizer; a report over several names them all
        List<String> judged = runs.stream()
                .map(r -> TrialOptions.of(r).localizer())
                .map(name -> name == null ? Report.BUILT_IN : name)
                .distinct()
                .toList();
        if (!judged.equals(List.of(Report.BUILT_IN))) {
            report = report.withLocalizer(String.join(", ", judged));
        }
        return report;
    }

    /** Frames of one run, with its trace and outcome, for key frames and the run's plots. */
    private record Recorded(List<Frame> frames, RunTrace trace, TrialOutcome outcome) {}

    private Optional<Recorded> recorded(List<RunRow> runs, List<TrialOutcome> trials, Function<RunRow, String> label) {
        for (RunRow r : runs) {
            List<Integer> chunks = board.chunks(r.id());
            List<Long> seeds = r.seedList();
            if (chunks.isEmpty() || seeds.isEmpty()) {
                continue;
            }
            Optional<TrialOutcome> outcome = trials.stream()
                    .filter(t -> t.variant().equals(variantAsRun(r) + label.apply(r)) && t.seed() == seeds.get(0))
                    .findFirst();
            if (outcome.isEmpty()) {
                continue;
            }
            try {
                List<Frame> frames = board.frames(r.id());
                if (frames.isEmpty()) {
                    continue;
                }
                RunTrace trace = RunTrace.of(frames);
                for (KidnapOutcome k : outcome.get().kidnaps()) {
                    trace.addKidnap(k.at());
                }
                return Optional.of(new Recorded(frames, trace, outcome.get()));
            } catch (IllegalArgumentException e) {
                // a damaged or foreign chunk only costs the pictures, not the report
                continue;
            }
        }
        return Optional.empty();
    }

    /** The variant name a run's trials carry: a sweep run's is named by its particle count. */
    private static String variantAsRun(RunRow r) {
        int particles = TrialOptions.of(r).particles();
        return particles > 0 ? dev.driftlab.trial.Sweep.name(particles) : r.variant();
    }

    /** The trials of one stored result document. */
    static List<TrialOutcome> trials(JsonNode doc) {
        return dev.driftlab.report.ResultJson.trials(doc);
    }
}
