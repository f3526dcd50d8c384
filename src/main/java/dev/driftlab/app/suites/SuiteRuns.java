package dev.driftlab.app.suites;

import dev.driftlab.app.runs.RunBoard;
import dev.driftlab.app.runs.RunQueue;
import dev.driftlab.app.runs.RunState;
import dev.driftlab.app.runs.persistence.RunRepository;
import dev.driftlab.app.runs.persistence.RunRepository.RunRow;
import dev.driftlab.app.scenarios.ScenarioStore;
import dev.driftlab.app.sharing.LinkNotFound;
import dev.driftlab.app.sharing.Tokens;
import dev.driftlab.app.suites.persistence.SuiteRepository;
import dev.driftlab.app.suites.persistence.SuiteRepository.CellRow;
import dev.driftlab.app.suites.persistence.SuiteRepository.SuiteRunRow;
import dev.driftlab.evaluation.BatchSummary;
import dev.driftlab.evaluation.Gates;
import dev.driftlab.evaluation.TrialOutcome;
import dev.driftlab.report.Report;
import dev.driftlab.report.ResultJson;
import dev.driftlab.report.SuiteReport;
import dev.driftlab.report.SuiteResultJson;
import dev.driftlab.scenario.Gate;
import dev.driftlab.scenario.Problem;
import dev.driftlab.scenario.Profile;
import dev.driftlab.scenario.Scenario;
import dev.driftlab.scenario.ScenarioException;
import dev.driftlab.scenario.ScenarioFiles;
import dev.driftlab.trial.SuitePlan;
import dev.driftlab.trial.SuiteResult;
import java.time.Clock;
import java.time.Duration;
import java.time.OffsetDateTime;
import java.time.format.DateTimeFormatter;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import org.springframework.stereotype.Service;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;
import tools.jackson.databind.node.ArrayNode;
import tools.jackson.databind.node.ObjectNode;

/**
 * Runs suites on the work engine: one submission queues every cell (scenario as it is and under
 * each profile that leaves it valid) as an ordinary run with its own batch key and work units,
 * all or none. Once every cell's run has ended, the first reader that sees it assembles the suite
 * result from the runs' trials ({@link #settle}), compares it with the previous finished run of
 * the suite (the automatic baseline) and stores it once.
 */
@Service
public class SuiteRuns {

    /**
     * A suite run's cell as the pages show it.
     *
     * @param column the column name
     * @param run the cell's run, empty for a cell a profile made invalid
     * @param problems the validator's messages of an invalid cell
     */
    public record CellState(String column, Optional<RunRow> run, List<String> problems) {}

    /**
     * A suite run in progress or finished.
     *
     * @param run the row
     * @param rows per scenario: its name and cells
     * @param progress share of trials done, 0 to 1
     */
    public record Progress(SuiteRunRow run, List<RowState> rows, double progress) {
        /** Whole percent done. */
        public int percent() {
            return (int) Math.floor(progress * 100);
        }
    }

    /** One scenario of a suite run: its name in the suite and its cells. */
    public record RowState(String name, String source, List<CellState> cells) {}

    private static final JsonMapper MAPPER = JsonMapper.builder().build();

    private final SuiteRepository suites;
    private final SuiteStore store;
    private final ScenarioStore scenarios;
    private final RunQueue queue;
    private final RunRepository runs;
    private final RunBoard board;
    private final Clock clock;

    public SuiteRuns(
            SuiteRepository suites,
            SuiteStore store,
            ScenarioStore scenarios,
            RunQueue queue,
            RunRepository runs,
            RunBoard board,
            Optional<Clock> clock) {
        this.suites = suites;
        this.store = store;
        this.scenarios = scenarios;
        this.queue = queue;
        this.runs = runs;
        this.board = board;
        this.clock = clock.orElse(Clock.systemUTC());
    }

    /**
     * Queues a run of the suite at its latest revision.
     *
     * @param localizer an outside localizer some live process offers (see {@link
     *     RunQueue#checkLocalizer}), judged in every cell, or null for the built-in one
     * @return the suite run
     * @throws SuiteRefused when a scenario no longer opens, a pinned revision is gone or a profile
     *     names a field that does not exist
     * @throws dev.driftlab.app.runs.RunRefused over the budget or for a localizer no process offers
     * @throws dev.driftlab.app.runs.QueueFull when the queue has no room for every cell
     */
    public SuiteRunRow submit(long suiteId, String localizer) {
        SuiteStore.SuiteView v = store.view(suiteId);
        SuiteStore.Checked checked = store.check(v.document());
        List<RunQueue.Cell> cells = new ArrayList<>();
        List<int[]> positions = new ArrayList<>();
        List<String[]> invalid = new ArrayList<>();
        for (int r = 0; r < checked.plan().rows().size(); r++) {
            SuitePlan.Row row = checked.plan().rows().get(r);
            SuiteStore.Resolved res = checked.entries().get(r);
            List<Long> seeds =
                    java.util.Arrays.stream(row.entry().seeds()).boxed().toList();
            for (int c = 0; c < row.cells().size(); c++) {
                SuitePlan.Cell cell = row.cells().get(c);
                if (cell.invalid()) {
                    invalid.add(new String[] {String.valueOf(r), String.valueOf(c), problemsJson(cell.problems())});
                    continue;
                }
                Optional<String> profile = c == 0
                        ? Optional.empty()
                        : Optional.of(checked.profiles().get(c - 1).toJson());
                cells.add(new RunQueue.Cell(
                        res.scenarioId(), res.revisionId(), cell.scenario().orElseThrow(), profile, seeds));
                positions.add(new int[] {r, c});
            }
        }
        String plan = planJson(checked);
        long[] id = new long[1];
        queue.submitCells(cells, localizer, runIds -> {
            id[0] = suites.insertRun(
                    suiteId, v.revision().id(), Tokens.next(), plan, localizer, OffsetDateTime.now(clock));
            for (int i = 0; i < runIds.size(); i++) {
                suites.insertCell(id[0], positions.get(i)[0], positions.get(i)[1], runIds.get(i), null);
            }
            for (String[] x : invalid) {
                suites.insertCell(id[0], Integer.parseInt(x[0]), Integer.parseInt(x[1]), null, x[2]);
            }
        });
        return suites.run(id[0]).orElseThrow();
    }

    /** A suite run by its permalink token, or {@link LinkNotFound}. */
    public SuiteRunRow byToken(String token) {
        if (!Tokens.wellFormed(token)) {
            throw new LinkNotFound();
        }
        return suites.runByToken(token).orElseThrow(LinkNotFound::new);
    }

    /** A suite run of the given suite, or {@link LinkNotFound}. */
    public SuiteRunRow of(long suiteId, long runId) {
        return suites.run(runId).filter(r -> r.suiteId() == suiteId).orElseThrow(LinkNotFound::new);
    }

    /** The latest runs of a suite, settling any whose cells have all ended. */
    public List<SuiteRunRow> recent(long suiteId, int limit) {
        suites.running(suiteId).forEach(r -> settle(r.id()));
        return suites.runs(suiteId, limit);
    }

    /** The last run of each suite, for the listing, settling those whose cells have ended. */
    public Map<Long, SuiteRunRow> last(List<Long> suiteIds) {
        Map<Long, SuiteRunRow> out = new HashMap<>();
        for (long id : suiteIds) {
            recent(id, 1).stream().findFirst().ifPresent(r -> out.put(id, r));
        }
        return out;
    }

    /** Where a suite run is: every cell's run and the share of trials done. Settles it when it can. */
    public Progress progress(SuiteRunRow run) {
        SuiteRunRow now = run.finished() ? run : settle(run.id());
        Plan plan = Plan.read(now.plan());
        List<CellRow> cells = suites.cells(now.id());
        List<RowState> rows = new ArrayList<>();
        double done = 0;
        double total = 0;
        for (int r = 0; r < plan.names.size(); r++) {
            List<CellState> states = new ArrayList<>();
            for (int c = 0; c < plan.columns.size(); c++) {
                CellRow cell = find(cells, r, c);
                Optional<RunRow> rr =
                        cell == null ? Optional.empty() : cell.runId().flatMap(runs::find);
                List<String> problems = cell == null ? List.of() : problemsOf(cell.problems());
                if (rr.isPresent()) {
                    int seeds = rr.get().seedList().size();
                    total += seeds;
                    done += seeds
                            * (RunState.of(rr.get().state())
                                            .map(RunState::finished)
                                            .orElse(false)
                                    ? 1
                                    : rr.get().progress());
                }
                states.add(new CellState(plan.columns.get(c), rr, problems));
            }
            rows.add(new RowState(plan.names.get(r), plan.sources.get(r), states));
        }
        return new Progress(now, rows, total == 0 ? 1 : done / total);
    }

    /** Cancels every cell of a running suite run that has not ended. */
    public void cancel(SuiteRunRow run) {
        for (CellRow c : suites.cells(run.id())) {
            c.runId().ifPresent(queue::cancel);
        }
        settle(run.id());
    }

    /**
     * Stores the result of a suite run whose cells have all ended; does nothing while a cell runs
     * or once stored. Safe to call from any process: the result is written by a conditional update.
     */
    public SuiteRunRow settle(long suiteRunId) {
        SuiteRunRow run = suites.run(suiteRunId).orElseThrow(LinkNotFound::new);
        if (run.finished()) {
            return run;
        }
        List<CellRow> cells = suites.cells(run.id());
        for (CellRow c : cells) {
            Optional<RunRow> r = c.runId().flatMap(runs::find);
            if (r.isPresent()
                    && !RunState.of(r.get().state()).map(RunState::finished).orElse(true)) {
                return run;
            }
        }
        OffsetDateTime now = OffsetDateTime.now(clock);
        Optional<SuiteRunRow> baseline =
                suites.previousFinished(run.suiteId(), run.id(), run.localizer().orElse(null));
        SuiteReport report = report(run, cells, baseline, now);
        String json = SuiteResultJson.render(report);
        suites.finish(
                run.id(),
                now,
                baseline.map(SuiteRunRow::id).orElse(null),
                report.verdict(),
                report.result().gatesPassing(),
                report.result().gatesPlanned(),
                json);
        return suites.run(run.id()).orElseThrow();
    }

    /** The report of a finished suite run, made again from its runs exactly as when it was stored. */
    public SuiteReport report(SuiteRunRow run) {
        if (!run.finished()) {
            throw new LinkNotFound();
        }
        Optional<SuiteRunRow> baseline = run.baselineId().flatMap(suites::run);
        return report(run, suites.cells(run.id()), baseline, run.finishedAt().orElseThrow());
    }

    /** The stored result document of a finished suite run. */
    public Optional<String> result(SuiteRunRow run) {
        return suites.result(run.id());
    }

    private SuiteReport report(
            SuiteRunRow run, List<CellRow> cells, Optional<SuiteRunRow> baseline, OffsetDateTime at) {
        Plan stored = Plan.read(run.plan());
        SuitePlan plan = stored.rebuild(scenarios);
        boolean cancelled = false;
        List<SuiteResult.Row> rows = new ArrayList<>();
        for (int r = 0; r < plan.rows().size(); r++) {
            SuitePlan.Row row = plan.rows().get(r);
            List<Gate> gates = Gates.effective(row.entry().scenario());
            List<String> order = plan.columns();
            List<TrialOutcome> trials = new ArrayList<>();
            for (int c = 0; c < row.cells().size(); c++) {
                if (row.cells().get(c).invalid()) {
                    continue;
                }
                CellRow cell = find(cells, r, c);
                Optional<RunRow> rr =
                        cell == null ? Optional.empty() : cell.runId().flatMap(runs::find);
                if (rr.isEmpty() || !rr.get().state().equals(RunState.DONE.word())) {
                    cancelled = true;
                    continue;
                }
                String column = order.get(c);
                trials(rr.get()).forEach(t -> trials.add(t.withVariant(column)));
            }
            trials.sort(Comparator.<TrialOutcome>comparingInt(t -> order.indexOf(t.variant()))
                    .thenComparingLong(TrialOutcome::seed));
            BatchSummary summary =
                    trials.isEmpty() ? new BatchSummary(List.of(), List.of()) : BatchSummary.of(trials, gates);
            rows.add(new SuiteResult.Row(row, trials, summary, gates));
        }
        double seconds = Duration.between(run.queuedAt(), at).toMillis() / 1000.0;
        int finished = rows.stream().mapToInt(x -> x.trials().size()).sum();
        SuiteResult result = new SuiteResult(plan, rows, plan.trials(), cancelled || finished < plan.trials(), seconds);
        SuiteStore.SuiteView v = store.view(run.suiteId(), run.revisionNumber());
        Optional<SuiteReport.Baseline> base =
                baseline.flatMap(b -> suites.result(b.id())).map(SuiteResultJson::baseline);
        return SuiteReport.of(
                        v.head().name(),
                        v.document().description() == null ? "" : v.document().description(),
                        "suite revision " + run.revisionNumber() + ", run " + run.id(),
                        result,
                        base,
                        at.format(DateTimeFormatter.ISO_OFFSET_DATE_TIME))
                .withLocalizer(run.localizer().orElse(Report.BUILT_IN));
    }

    private List<TrialOutcome> trials(RunRow run) {
        return board.exactTrials(run)
                .orElseGet(() -> board.result(run.id())
                        .map(doc -> ResultJson.trials(MAPPER.readTree(doc)))
                        .orElse(List.of()));
    }

    private static CellRow find(List<CellRow> cells, int r, int c) {
        for (CellRow x : cells) {
            if (x.row() == r && x.column() == c) {
                return x;
            }
        }
        return null;
    }

    private static String problemsJson(List<Problem> problems) {
        ArrayNode a = MAPPER.createArrayNode();
        problems.forEach(p -> a.add(p.path() + ": " + p.message()));
        return MAPPER.writeValueAsString(a);
    }

    private static List<String> problemsOf(Optional<String> json) {
        if (json.isEmpty()) {
            return List.of();
        }
        List<String> out = new ArrayList<>();
        MAPPER.readTree(json.get()).forEach(n -> out.add(n.asString()));
        return out;
    }

    private static String planJson(SuiteStore.Checked checked) {
        ObjectNode o = MAPPER.createObjectNode();
        ArrayNode entries = o.putArray("entries");
        for (SuiteStore.Resolved r : checked.entries()) {
            ObjectNode e = entries.addObject();
            e.put("name", r.entry().name());
            e.put("source", r.entry().source());
            e.put("scenarioId", r.scenarioId());
            e.put("revisionId", r.revisionId());
            ArrayNode seeds = e.putArray("seeds");
            for (long s : r.entry().seeds()) {
                seeds.add(s);
            }
        }
        ArrayNode profiles = o.putArray("profiles");
        checked.profiles().forEach(p -> profiles.add(p.toJson()));
        return MAPPER.writeValueAsString(o);
    }

    /** A suite run's plan as stored: what was queued, so the result is made of exactly that. */
    private record Plan(
            List<String> names,
            List<String> sources,
            List<Long> revisionIds,
            List<long[]> seeds,
            List<String> profiles,
            List<String> columns) {

        static Plan read(String json) {
            JsonNode o = MAPPER.readTree(json);
            List<String> names = new ArrayList<>();
            List<String> sources = new ArrayList<>();
            List<Long> revs = new ArrayList<>();
            List<long[]> seeds = new ArrayList<>();
            for (JsonNode e : o.get("entries")) {
                names.add(e.get("name").asString());
                sources.add(e.get("source").asString());
                revs.add(e.get("revisionId").asLong());
                List<Long> s = new ArrayList<>();
                e.get("seeds").forEach(n -> s.add(n.asLong()));
                seeds.add(s.stream().mapToLong(Long::longValue).toArray());
            }
            List<String> profiles = new ArrayList<>();
            List<String> columns = new ArrayList<>(List.of(SuitePlan.AS_IS));
            for (JsonNode p : o.get("profiles")) {
                profiles.add(p.asString());
                columns.add(Profile.read(p.asString()).name());
            }
            return new Plan(names, sources, revs, seeds, profiles, columns);
        }

        SuitePlan rebuild(ScenarioStore store) {
            List<SuitePlan.Entry> entries = new ArrayList<>();
            for (int i = 0; i < names.size(); i++) {
                String doc = store.documentOfRevision(revisionIds.get(i)).orElseThrow(LinkNotFound::new);
                Scenario s = ScenarioFiles.check(doc).scenario().orElseThrow(LinkNotFound::new);
                entries.add(new SuitePlan.Entry(names.get(i), sources.get(i), s, seeds.get(i)));
            }
            try {
                return SuitePlan.of(
                        entries, profiles.stream().map(Profile::read).toList());
            } catch (ScenarioException e) {
                throw new IllegalStateException("a stored suite plan no longer reads: " + e.getMessage(), e);
            }
        }
    }
}
