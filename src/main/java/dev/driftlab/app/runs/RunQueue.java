package dev.driftlab.app.runs;

import dev.driftlab.app.runs.persistence.RunColumns;
import dev.driftlab.app.runs.persistence.RunRepository;
import dev.driftlab.app.runs.persistence.RunRepository.RunRow;
import dev.driftlab.app.scenarios.ScenarioStore;
import dev.driftlab.app.sharing.Tokens;
import dev.driftlab.scenario.Limits;
import dev.driftlab.scenario.Scenario;
import dev.driftlab.scenario.SettingsVariant;
import dev.driftlab.trial.TrialCost;
import jakarta.annotation.PostConstruct;
import java.time.Clock;
import java.time.OffsetDateTime;
import java.util.ArrayList;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Optional;
import java.util.Set;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;
import org.springframework.beans.factory.annotation.Value;
import org.springframework.stereotype.Service;
import org.springframework.transaction.support.TransactionTemplate;

/**
 * Takes run submissions: checks them, refuses what is over the server's budget, and stores each
 * run with its work units, which the {@link WorkEngine} hands to whichever server or worker process
 * is free. The queue is bounded: at most {@link #places()} runs are queued or running at once, and
 * a submission that does not fit is refused whole ({@link QueueFull}); an accepted run is never
 * dropped. Runs outlive the process that took them: after a restart their units simply run on.
 */
@Service
public class RunQueue {

    /** Most seeds one run may hold. */
    public static final int MAX_SEEDS = 10_000;

    /**
     * What a submission queued.
     *
     * @param batchKey shared by the runs submitted together
     * @param runIds the runs, one per variant
     */
    public record Submitted(String batchKey, List<Long> runIds) {}

    private static final Logger LOG = LoggerFactory.getLogger(RunQueue.class);

    /** Most particle counts in one sweep. */
    public static final int MAX_SWEEP_COUNTS = 12;

    private final RunRepository runs;
    private final ScenarioStore scenarios;
    private final TransactionTemplate tx;
    private final Clock clock;
    private final WorkEngine engine;
    private final WorkerBoard board;
    private final dev.driftlab.app.runs.persistence.UnitRepository units;
    private final int workers;
    private final int places;
    private final double unitWork;
    /** Admission on this process is one at a time, so two submissions cannot both take the last places. */
    private final Object admission = new Object();

    private final double maxParticleBeams;
    private final double maxRecordedParticles;
    private final int maxActivePerScenario;

    public RunQueue(
            RunRepository runs,
            ScenarioStore scenarios,
            dev.driftlab.app.runs.persistence.UnitRepository units,
            WorkEngine engine,
            WorkerBoard board,
            TransactionTemplate tx,
            Optional<Clock> clock,
            @Value("${driftlab.runs.workers:0}") int workers,
            @Value("${driftlab.runs.queue-capacity:64}") int queueCapacity,
            @Value("${driftlab.runs.max-particle-beams:1e13}") double maxParticleBeams,
            @Value("${driftlab.runs.max-recorded-particles:1e8}") double maxRecordedParticles,
            @Value("${driftlab.runs.max-active-per-scenario:16}") int maxActivePerScenario,
            @Value("${driftlab.runs.unit-work:2e7}") double unitWork) {
        this.maxParticleBeams = maxParticleBeams;
        this.maxRecordedParticles = maxRecordedParticles;
        this.maxActivePerScenario = maxActivePerScenario;
        this.runs = runs;
        this.scenarios = scenarios;
        this.tx = tx;
        this.clock = clock.orElse(Clock.systemUTC());
        this.units = units;
        this.engine = engine;
        this.board = board;
        this.workers = workers > 0 ? workers : Runtime.getRuntime().availableProcessors();
        if (queueCapacity < 0) {
            throw new IllegalArgumentException("driftlab.runs.queue-capacity must be 0 or more");
        }
        this.places = this.workers + queueCapacity;
        this.unitWork = unitWork;
    }

    @PostConstruct
    void interruptLeftovers() {
        int n = runs.interruptLeftovers(
                now(),
                "This run was queued by an earlier version of the server, which kept no work units; run it again.");
        if (n > 0) {
            LOG.info("marked {} run(s) without work units, left by an earlier server version, as interrupted", n);
        }
    }

    /**
     * Gives runs stored before verdicts had a column the verdict their result document names, so
     * every list shows it without reading results. Once done, later starts find nothing to do.
     */
    @PostConstruct
    void fillMissingVerdicts() {
        int filled = fillMissingVerdicts(runs);
        if (filled > 0) {
            LOG.info("read the verdict of {} earlier run(s) from their results", filled);
        }
    }

    /** Fills in the verdicts that stored results name; returns how many. */
    static int fillMissingVerdicts(RunRepository runs) {
        int filled = 0;
        for (long id : runs.missingVerdicts()) {
            Optional<dev.driftlab.evaluation.Verdict> v = runs.result(id).flatMap(ResultVerdict::of);
            if (v.isPresent()) {
                runs.fillVerdict(id, v.get());
                filled++;
            }
        }
        return filled;
    }

    /** Number of unit threads configured for this server (driftlab.runs.workers). */
    public int workers() {
        return workers;
    }

    /** Places for running and waiting runs together, on the whole server. */
    public int places() {
        return places;
    }

    /** Places free right now. */
    public int freePlaces() {
        return (int) Math.max(0, places - runs.countActiveAll());
    }

    /**
     * Queues one run per variant over the same seeds, all or none.
     *
     * @throws RunRefused for an unknown variant or a bad seed list
     * @throws QueueFull when there is no room for all of them
     */
    public Submitted submit(
            long scenarioId, long revisionId, List<String> variants, List<Long> seeds, TrialOptions options) {
        Scenario scenario = scenarioFor(revisionId, variants);
        List<String> names = checkVariants(scenario, variants);
        checkSeeds(seeds);
        checkLocalizer(options.localizer());
        List<TrialOptions> each = names.stream().map(n -> options).toList();
        checkBudget(scenarioId, scenario, names, each, seeds.size());
        return enqueue(scenarioId, revisionId, scenario, names, each, seeds);
    }

    /**
     * Queues a particle-count sweep of one variant: one run per count, each its settings at that fixed
     * count (KLD-sampling off), over the same seeds, all or none. Counts are run in ascending order.
     *
     * @throws RunRefused for an unknown variant, a bad seed list or bad counts
     * @throws QueueFull when there is no room for all of them
     */
    public Submitted submitSweep(
            long scenarioId,
            long revisionId,
            List<String> variants,
            List<Integer> counts,
            List<Long> seeds,
            boolean recordFrames,
            String localizer) {
        if (variants.size() > 1) {
            throw new RunRefused("particleCounts", "a sweep varies one settings variant; choose just one, e.g. base");
        }
        Scenario scenario = scenarioFor(revisionId, variants);
        String name = checkVariants(scenario, variants).get(0);
        checkSeeds(seeds);
        checkLocalizer(localizer);
        if (counts.isEmpty()) {
            throw new RunRefused("particleCounts", "give at least one particle count, e.g. 300, 1000, 3000");
        }
        if (counts.size() > MAX_SWEEP_COUNTS) {
            throw new RunRefused(
                    "particleCounts", counts.size() + " counts given; at most " + MAX_SWEEP_COUNTS + " in one sweep");
        }
        for (int c : counts) {
            if (c < 1 || c > Limits.MAX_PARTICLES) {
                throw new RunRefused(
                        "particleCounts", "particle count " + c + " is outside 1 to " + Limits.MAX_PARTICLES);
            }
        }
        List<Integer> sorted = counts.stream().distinct().sorted().toList();
        List<String> names = sorted.stream().map(c -> name).toList();
        List<TrialOptions> options = sorted.stream()
                .map(c -> new TrialOptions(recordFrames, c, localizer))
                .toList();
        checkBudget(scenarioId, scenario, names, options, seeds.size());
        return enqueue(scenarioId, revisionId, scenario, names, options, seeds);
    }

    /** Queues one run per (variant, options) pair over the same seeds, all or none, with its units. */
    private Submitted enqueue(
            long scenarioId,
            long revisionId,
            Scenario scenario,
            List<String> names,
            List<TrialOptions> options,
            List<Long> seeds) {
        String batch = Tokens.next();
        synchronized (admission) {
            long active = runs.countActiveAll();
            if (active + names.size() > places) {
                throw new QueueFull(names.size(), (int) Math.max(0, places - active));
            }
            List<Long> ids = tx.execute(s -> {
                List<Long> out = new ArrayList<>();
                OffsetDateTime now = now();
                for (int i = 0; i < names.size(); i++) {
                    long id = runs.insert(
                            scenarioId,
                            revisionId,
                            batch,
                            Tokens.next(),
                            names.get(i),
                            RunColumns.seedsJson(seeds),
                            RunColumns.optionsJson(options.get(i).stored()),
                            now);
                    double trialWork =
                            cost(scenario, names.get(i), options.get(i)).particleBeams();
                    List<WorkUnits.Unit> cut = WorkUnits.cut(seeds.size(), trialWork, unitWork);
                    for (WorkUnits.Unit u : cut) {
                        units.insertUnit(id, u.unitNo(), u.firstIndex(), u.seedCount());
                    }
                    engine.schedule(id, cut, options.get(i).localizer());
                    out.add(id);
                }
                return out;
            });
            return new Submitted(batch, ids);
        }
    }

    /**
     * Refuses a localizer no process alive now offers. The name only picks from the lists the
     * processes' administrators wrote; nothing in a request becomes a command.
     *
     * @param name an outside localizer's name, or null for the built-in one
     * @throws RunRefused naming the field {@code localizer}
     */
    public void checkLocalizer(String name) {
        if (name == null) {
            return;
        }
        List<String> offered = board.offeredLocalizers();
        if (!LocalizerAllowList.NAME.matcher(name).matches() || !offered.contains(name)) {
            String shown = name.length() > 40 ? name.substring(0, 40) + "..." : name;
            throw new RunRefused(
                    "localizer",
                    "'" + shown + "' is not a localizer this server's processes offer; "
                            + (offered.isEmpty()
                                    ? "none offers an outside localizer (the administrator lists them under"
                                            + " driftlab.localizers), so leave it empty for the built-in one"
                                    : "choose one of " + String.join(", ", offered)
                                            + ", or leave it empty for the built-in one"));
        }
    }

    /**
     * One cell of a suite: a scenario revision as it is or under a profile, run on its base settings.
     *
     * @param scenarioId the scenario
     * @param revisionId the exact revision
     * @param scenario the scenario the cell runs (the profile already applied), for the budget
     * @param profile the profile document merged into the revision before the trials run, if any
     * @param seeds the seeds
     */
    public record Cell(
            long scenarioId, long revisionId, Scenario scenario, Optional<String> profile, List<Long> seeds) {}

    /**
     * Queues every cell of a suite as a run of its own (variant base, its own batch key, so each
     * cell's batch report is that cell alone), all or none: the budget is checked over the whole
     * submission, and {@code alongside} runs in the same transaction with the runs' ids in cell
     * order, so a suite run and its runs are stored together or not at all.
     *
     * @param localizer an outside localizer some live process offers, judged in every cell, or null
     *     for the built-in one
     * @throws RunRefused for a localizer no process offers, over the budget or a bad seed list
     * @throws QueueFull when there is no room for all of them
     */
    public List<Long> submitCells(
            List<Cell> cells, String localizer, java.util.function.Consumer<List<Long>> alongside) {
        if (cells.isEmpty()) {
            throw new RunRefused("scenarios", "nothing to run");
        }
        checkLocalizer(localizer);
        if (cells.size() > places) {
            // never fits, however long one waits: refuse it as too big rather than busy
            throw new RunRefused(
                    "scenarios",
                    "this suite has " + cells.size() + " cells to run (scenarios x columns); this server holds at most "
                            + places + " runs at once (driftlab.runs.queue-capacity plus its unit threads): fewer"
                            + " scenarios or profiles");
        }
        double work = 0;
        java.util.Map<Long, Integer> perScenario = new java.util.HashMap<>();
        for (Cell c : cells) {
            checkSeeds(c.seeds());
            work += TrialCost.of(c.scenario(), c.scenario().localizer(), 0).particleBeams()
                    * c.seeds().size();
            perScenario.merge(c.scenarioId(), 1, Integer::sum);
        }
        if (work > maxParticleBeams) {
            throw new RunRefused(
                    "seeds",
                    String.format(
                            java.util.Locale.ROOT,
                            "this suite would take about %.2g particle-beam updates (%d run(s));"
                                    + " this server takes at most %.2g per submission"
                                    + " (driftlab.runs.max-particle-beams): fewer seeds, scenarios or profiles",
                            work,
                            cells.size(),
                            maxParticleBeams));
        }
        for (java.util.Map.Entry<Long, Integer> e : perScenario.entrySet()) {
            long active = runs.countActive(e.getKey());
            if (active + e.getValue() > maxActivePerScenario) {
                throw new RunRefused(
                        "scenarios",
                        "a scenario of this suite has " + active + " run(s) queued or running and the suite adds "
                                + e.getValue() + "; at most " + maxActivePerScenario + " at once per scenario"
                                + " (driftlab.runs.max-active-per-scenario): wait for them or cancel some");
            }
        }
        synchronized (admission) {
            long active = runs.countActiveAll();
            if (active + cells.size() > places) {
                throw new QueueFull(cells.size(), (int) Math.max(0, places - active));
            }
            return tx.execute(s -> {
                List<Long> out = new ArrayList<>();
                OffsetDateTime now = now();
                TrialOptions options = new TrialOptions(false, 0, localizer);
                for (Cell c : cells) {
                    long id = runs.insert(
                            c.scenarioId(),
                            c.revisionId(),
                            Tokens.next(),
                            Tokens.next(),
                            "base",
                            RunColumns.seedsJson(c.seeds()),
                            RunColumns.optionsJson(options.stored()),
                            c.profile().orElse(null),
                            now);
                    double trialWork = TrialCost.of(c.scenario(), c.scenario().localizer(), 0)
                            .particleBeams();
                    List<WorkUnits.Unit> cut = WorkUnits.cut(c.seeds().size(), trialWork, unitWork);
                    for (WorkUnits.Unit u : cut) {
                        units.insertUnit(id, u.unitNo(), u.firstIndex(), u.seedCount());
                    }
                    engine.schedule(id, cut, localizer);
                    out.add(id);
                }
                alongside.accept(out);
                return out;
            });
        }
    }

    private static TrialCost cost(Scenario s, String variant, TrialOptions options) {
        SettingsVariant v = s.allVariants().stream()
                .filter(x -> x.name().equals(variant))
                .findFirst()
                .orElseThrow();
        return TrialCost.of(s, v.settings(), options.particles());
    }

    /** Queues a fresh run with the same revision, variant, seeds and options as an earlier one. */
    public Submitted rerun(long runId) {
        RunRow r = runs.find(runId).orElseThrow(RunNotFound::new);
        return submit(r.scenarioId(), r.revisionId(), List.of(r.variant()), r.seedList(), TrialOptions.of(r));
    }

    /**
     * Queues one seed of a run again, alone and with frames, so that the player can show a trial
     * of a batch that kept no frames. A trial is a pure function of (revision, variant, seed), so
     * the replay is the very trial the batch ran.
     *
     * @throws RunRefused when the seed is not one of the run's
     */
    public Submitted replaySeed(long runId, long seed) {
        RunRow r = runs.find(runId).orElseThrow(RunNotFound::new);
        if (!r.seedList().contains(seed)) {
            throw new RunRefused("seed", "seed " + seed + " is not one of this run's seeds (" + r.seedText() + ")");
        }
        return submit(
                r.scenarioId(),
                r.revisionId(),
                List.of(r.variant()),
                List.of(seed),
                new TrialOptions(
                        true, TrialOptions.of(r).particles(), TrialOptions.of(r).localizer()));
    }

    /**
     * Cancels a queued or running run; does nothing to a finished one.
     *
     * @return whether the run was queued or running
     */
    public boolean cancel(long runId) {
        if (!runs.cancelActive(runId, now())) {
            return false;
        }
        engine.dropRun(runId);
        return true;
    }

    /** The revision's scenario, read once per submission; refuses an empty variant list first. */
    private Scenario scenarioFor(long revisionId, List<String> variants) {
        if (variants.isEmpty()) {
            throw new RunRefused("variants", "name at least one settings variant, e.g. base");
        }
        return scenarios
                .rendering(revisionId)
                .checked()
                .scenario()
                .orElseThrow(() -> new RunRefused("revision", "this revision cannot be read"));
    }

    private static List<String> checkVariants(Scenario s, List<String> variants) {
        Set<String> known = new LinkedHashSet<>();
        for (SettingsVariant v : s.allVariants()) {
            known.add(v.name());
        }
        Set<String> asked = new LinkedHashSet<>(variants);
        for (String v : asked) {
            if (!known.contains(v)) {
                throw new RunRefused(
                        "variants",
                        "no settings variant named \"" + clip(v, 100) + "\"; known: " + String.join(", ", known));
            }
        }
        return List.copyOf(asked);
    }

    /**
     * Refuses a submission whose estimated work or recording exceeds the server's budget, or that
     * would give one scenario more runs at once than its share, with the estimate and the limit.
     */
    private void checkBudget(long scenarioId, Scenario s, List<String> names, List<TrialOptions> options, int seeds) {
        double work = 0;
        double recorded = 0;
        for (int i = 0; i < names.size(); i++) {
            TrialCost cost = cost(s, names.get(i), options.get(i));
            work += cost.particleBeams() * seeds;
            if (options.get(i).recordFrames()) {
                // a run records the frames of its first seed only
                recorded += cost.recordedParticles();
            }
        }
        if (work > maxParticleBeams) {
            throw new RunRefused(
                    "seeds",
                    String.format(
                            java.util.Locale.ROOT,
                            "this submission would take about %.2g particle-beam updates (%d run(s) x %d seed(s));"
                                    + " this server takes at most %.2g per submission"
                                    + " (driftlab.runs.max-particle-beams): fewer seeds, particles or beams",
                            work,
                            names.size(),
                            seeds,
                            maxParticleBeams));
        }
        if (recorded > maxRecordedParticles) {
            throw new RunRefused(
                    "recordFrames",
                    String.format(
                            java.util.Locale.ROOT,
                            "recording frames would keep about %.2g particle states; this server keeps at most %.2g"
                                    + " per submission (driftlab.runs.max-recorded-particles): record fewer particles"
                                    + " or none",
                            recorded,
                            maxRecordedParticles));
        }
        long active = runs.countActive(scenarioId);
        if (active + names.size() > maxActivePerScenario) {
            throw new RunRefused(
                    "variants",
                    "this scenario has " + active + " run(s) queued or running; at most " + maxActivePerScenario
                            + " at once per scenario (driftlab.runs.max-active-per-scenario): wait for them or"
                            + " cancel some");
        }
    }

    private static void checkSeeds(List<Long> seeds) {
        if (seeds.isEmpty()) {
            throw new RunRefused("seeds", "give at least one seed");
        }
        if (seeds.size() > MAX_SEEDS) {
            throw new RunRefused("seeds", seeds.size() + " seeds given; at most " + MAX_SEEDS + " per run");
        }
        // a repeated seed is the very same trial again: it would count twice in every share
        java.util.Set<Long> seen = new java.util.HashSet<>();
        for (Long s : seeds) {
            if (s == null) {
                throw new RunRefused("seeds", "a seed is missing (null); give whole numbers");
            }
            if (!seen.add(s)) {
                long times = seeds.stream().filter(s::equals).count();
                throw new RunRefused(
                        "seeds",
                        "seed " + s + " is given " + times + " times; a trial depends only on its seed, so each"
                                + " seed may appear once");
            }
        }
    }

    /**
     * The seeds {@code first, first + 1, ..., first + count - 1}, refused with a message naming
     * the field when the count is out of range or the last seed would pass the largest one (the
     * web form and the API both read seeds this way).
     */
    public static List<Long> consecutiveSeeds(long first, int count) {
        if (count < 1) {
            throw new RunRefused("seedCount", count + " seeds asked for; give at least 1");
        }
        if (count > MAX_SEEDS) {
            throw new RunRefused("seedCount", count + " seeds asked for; at most " + MAX_SEEDS + " per run");
        }
        if (first > Long.MAX_VALUE - (count - 1)) {
            throw new RunRefused(
                    "firstSeed",
                    first + " plus " + count + " seeds passes the largest seed, " + Long.MAX_VALUE
                            + "; start at most at " + (Long.MAX_VALUE - (count - 1)));
        }
        List<Long> out = new java.util.ArrayList<>(count);
        for (int i = 0; i < count; i++) {
            out.add(first + i);
        }
        return out;
    }

    private static String clip(String s, int max) {
        return s.length() <= max ? s : s.substring(0, max);
    }

    private OffsetDateTime now() {
        return OffsetDateTime.now(clock);
    }
}
