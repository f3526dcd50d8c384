package dev.driftlab.app.runs;

import dev.driftlab.app.runs.persistence.RunRepository.RunRow;
import dev.driftlab.app.runs.persistence.WorkerRepository;
import dev.driftlab.app.runs.persistence.WorkerRepository.ProcessLine;
import dev.driftlab.app.runs.persistence.WorkerRepository.RunningUnit;
import dev.driftlab.app.runs.persistence.WorkerRepository.Throughput;
import dev.driftlab.app.runs.persistence.WorkerRepository.UnitCounts;
import dev.driftlab.app.runs.persistence.WorkerRepository.UnitLine;
import dev.driftlab.app.sharing.ShareLinks;
import java.time.Clock;
import java.time.Duration;
import java.time.OffsetDateTime;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.stream.Collectors;
import org.springframework.beans.factory.annotation.Value;
import org.springframework.stereotype.Service;
import org.springframework.transaction.annotation.Transactional;

/**
 * What the processes that run units are doing, for the workers page and its API, and the units of
 * one run for the run page. Whether a process is alive is judged here only: by its heartbeat in
 * {@code work_process}, against the same silence after which the engine takes its units again.
 *
 * <p>What runs where is shown with the scenario's name and a link to the run only where the home
 * page lists scenarios ({@code driftlab.home.list-scenarios}), and the link goes through the
 * scenario's view link, which that listing already shows to anyone; a run's own link and every
 * edit link stay off this page. Where the listing is off, only run numbers are shown.
 */
@Service
@Transactional(readOnly = true)
public class WorkerBoard {

    /** Most processes listed; the rest are counted only. */
    public static final int MAX_PROCESSES = 200;

    /** Most unit rows a run page shows. */
    public static final int MAX_UNIT_ROWS = 200;

    /** Most running units listed over all processes. */
    static final int MAX_RUNNING_UNITS = 5_000;

    /**
     * Silence after which a process counts as lost: the engine takes a unit from its holder after
     * the same number of missed heartbeats.
     */
    public static final Duration LOST_AFTER = WorkEngine.HEARTBEAT.multipliedBy(WorkEngine.MISSED_HEARTBEATS);

    /** Processes last seen longer ago than this are left off the page. */
    public static final Duration SHOWN_FOR = Duration.ofHours(1);

    /** Whether a process is working, as the page says it. */
    public enum Liveness {
        /** Its last heartbeat is recent. */
        ALIVE("alive", "heartbeat within the last " + LOST_AFTER.toSeconds() + " s"),
        /** It said it stopped (shut down in order); its units went back in the queue. */
        STOPPED("stopped", "shut down in order"),
        /** Its heartbeat stopped without a word (killed, cut off): its units are taken again. */
        LOST("lost", "no heartbeat for over " + LOST_AFTER.toSeconds() + " s");

        private final String word;
        private final String meaning;

        Liveness(String word, String meaning) {
            this.word = word;
            this.meaning = meaning;
        }

        /** The word shown and sent by the API. */
        public String word() {
            return word;
        }

        /** What the word means, for the page. */
        public String meaning() {
            return meaning;
        }
    }

    /**
     * A unit a process runs now.
     *
     * @param runId the run's number
     * @param unit the unit's number within the run, from 1 as pages show it
     * @param progress done share of the unit's seeds, 0..1
     * @param scenarioName the run's scenario, when scenarios are listed
     * @param runPath path of the run page through the scenario's view link, when scenarios are
     *     listed and the scenario has a view link
     */
    public record Current(
            long runId, int unit, double progress, Optional<String> scenarioName, Optional<String> runPath) {}

    /**
     * One process.
     *
     * @param name its engine name (host, process id, a random part)
     * @param host host name
     * @param role "server" (also serves pages) or "worker"
     * @param threads unit threads
     * @param startedAt when it started
     * @param lastSeen its last heartbeat
     * @param secondsSinceSeen whole seconds since its last heartbeat (0 when it is ahead of this clock)
     * @param state alive, stopped or lost
     * @param unitsDone units it finished
     * @param trialsDone trials it finished
     * @param running what it runs now (nothing unless alive)
     * @param localizers the outside localizers it offers, by name
     */
    public record Worker(
            String name,
            String host,
            String role,
            int threads,
            OffsetDateTime startedAt,
            OffsetDateTime lastSeen,
            long secondsSinceSeen,
            Liveness state,
            long unitsDone,
            long trialsDone,
            List<Current> running,
            List<String> localizers) {}

    /**
     * The whole picture at one time.
     *
     * @param at when it was taken
     * @param workers processes seen in the last {@link #SHOWN_FOR}, alive first, at most {@link #MAX_PROCESSES}
     * @param moreWorkers whether more processes were seen than are listed
     * @param unitsWaiting units waiting for a process
     * @param trialsLastMinute trials finished in the last minute
     * @param trialsLastTenMinutes trials finished in the last ten minutes
     * @param scenariosShown whether scenario names and run links are shown
     */
    public record Snapshot(
            OffsetDateTime at,
            List<Worker> workers,
            boolean moreWorkers,
            long unitsWaiting,
            long trialsLastMinute,
            long trialsLastTenMinutes,
            boolean scenariosShown) {

        /** Processes alive now. */
        public long alive() {
            return workers.stream().filter(w -> w.state() == Liveness.ALIVE).count();
        }

        /** Unit threads of the processes alive now. */
        public long aliveThreads() {
            return workers.stream()
                    .filter(w -> w.state() == Liveness.ALIVE)
                    .mapToLong(Worker::threads)
                    .sum();
        }

        /** Units running now on processes alive now. */
        public long unitsRunning() {
            return workers.stream().mapToLong(w -> w.running().size()).sum();
        }

        /** Trials per minute, averaged over the last ten minutes. */
        public double trialsPerMinute() {
            return trialsLastTenMinutes / 10.0;
        }
    }

    /**
     * One unit of a run, for the run page.
     *
     * @param unit number within the run, from 1
     * @param firstSeed its first seed
     * @param lastSeed its last seed
     * @param seedCount how many seeds it runs
     * @param state what it is doing, in words
     * @param worker the process that runs or ran it, if any
     * @param attempts how many times a process started it
     * @param progress done share of its seeds, 0..1
     */
    public record UnitRow(
            int unit,
            long firstSeed,
            long lastSeed,
            int seedCount,
            String state,
            Optional<String> worker,
            int attempts,
            double progress) {

        /** The seeds for people: one seed, or the first and last. */
        public String seeds() {
            return seedCount == 1 ? Long.toString(firstSeed) : firstSeed + " to " + lastSeed;
        }

        /** Percent done, rounded down so a unit shows 100 only when it is done. */
        public int percent() {
            return (int) Math.floor(Math.max(0, Math.min(1, progress)) * 100);
        }
    }

    /**
     * A run's units: the first {@link #MAX_UNIT_ROWS} and the counts over all of them.
     *
     * @param rows units in number order
     * @param counts units per state over the whole run
     */
    public record UnitTable(List<UnitRow> rows, UnitCounts counts) {

        /** Whether the run has more units than rows shown. */
        public boolean capped() {
            return counts.total() > rows.size();
        }

        /** Whether the run is cut into more than one unit (a one-unit run needs no table). */
        public boolean multiple() {
            return counts.total() > 1;
        }
    }

    private final WorkerRepository repo;
    private final ShareLinks links;
    private final Clock clock;
    private final boolean listScenarios;

    public WorkerBoard(
            WorkerRepository repo,
            ShareLinks links,
            Optional<Clock> clock,
            @Value("${driftlab.home.list-scenarios:true}") boolean listScenarios) {
        this.repo = repo;
        this.links = links;
        this.clock = clock.orElse(Clock.systemUTC());
        this.listScenarios = listScenarios;
    }

    /** Whether a process with this heartbeat is alive at {@code now}. */
    public static Liveness liveness(OffsetDateTime lastSeen, Optional<OffsetDateTime> stoppedAt, OffsetDateTime now) {
        if (stoppedAt.isPresent()) {
            return Liveness.STOPPED;
        }
        return lastSeen.isBefore(now.minus(LOST_AFTER)) ? Liveness.LOST : Liveness.ALIVE;
    }

    /**
     * The outside localizers some process alive now offers, each name once, in order: what a run
     * may name. A process that stopped or lost its heartbeat no longer counts.
     */
    public List<String> offeredLocalizers() {
        return repo.offeredLocalizers(OffsetDateTime.now(clock).minus(LOST_AFTER));
    }

    /** The processes, what each runs, the queue and the throughput now. */
    public Snapshot snapshot() {
        OffsetDateTime now = OffsetDateTime.now(clock);
        OffsetDateTime seenSince = now.minus(SHOWN_FOR);
        List<ProcessLine> lines = repo.processes(seenSince, now.minus(LOST_AFTER), MAX_PROCESSES + 1);
        List<RunningUnit> running = repo.runningUnits(seenSince, MAX_RUNNING_UNITS);
        Map<Long, String> viewTokens = listScenarios
                ? links.viewTokens(running.stream().map(RunningUnit::scenarioId).collect(Collectors.toSet()))
                : Map.of();
        Map<String, List<Current>> byWorker = new HashMap<>();
        for (RunningUnit u : running) {
            byWorker.computeIfAbsent(u.worker(), k -> new ArrayList<>()).add(current(u, viewTokens));
        }
        List<Worker> workers = new ArrayList<>();
        for (ProcessLine p : lines.subList(0, Math.min(MAX_PROCESSES, lines.size()))) {
            Liveness state = liveness(p.lastSeen(), p.stoppedAt(), now);
            workers.add(new Worker(
                    p.name(),
                    p.host(),
                    p.role(),
                    p.threads(),
                    p.startedAt(),
                    p.lastSeen(),
                    Math.max(0, Duration.between(p.lastSeen(), now).toSeconds()),
                    state,
                    p.unitsDone(),
                    p.trialsDone(),
                    // a lost process's units are about to be taken again: they are not its work any more
                    state == Liveness.ALIVE ? List.copyOf(byWorker.getOrDefault(p.name(), List.of())) : List.of(),
                    p.localizers()));
        }
        Throughput t = repo.trialsFinished(now.minusMinutes(1), now.minusMinutes(10));
        return new Snapshot(
                now,
                List.copyOf(workers),
                lines.size() > MAX_PROCESSES,
                repo.unitsWaiting(WorkUnits.ANY_TASK),
                t.lastMinute(),
                t.lastTenMinutes(),
                listScenarios);
    }

    private Current current(RunningUnit u, Map<Long, String> viewTokens) {
        if (!listScenarios) {
            return new Current(u.runId(), u.unitNo() + 1, u.progress(), Optional.empty(), Optional.empty());
        }
        Optional<String> path =
                Optional.ofNullable(viewTokens.get(u.scenarioId())).map(token -> "/s/" + token + "/runs/" + u.runId());
        return new Current(u.runId(), u.unitNo() + 1, u.progress(), Optional.of(u.scenarioName()), path);
    }

    /** A run's units (the first {@link #MAX_UNIT_ROWS}) with their state in words. */
    public UnitTable units(RunRow run) {
        OffsetDateTime now = OffsetDateTime.now(clock);
        boolean over = RunState.of(run.state()).map(RunState::finished).orElse(true);
        List<Long> seeds = run.seedList();
        List<UnitRow> rows = new ArrayList<>();
        for (UnitLine u : repo.units(run.id(), MAX_UNIT_ROWS)) {
            int first = Math.min(u.firstIndex(), seeds.size() - 1);
            int last = Math.min(u.firstIndex() + u.seedCount() - 1, seeds.size() - 1);
            rows.add(new UnitRow(
                    u.unitNo() + 1,
                    seeds.isEmpty() ? 0 : seeds.get(Math.max(0, first)),
                    seeds.isEmpty() ? 0 : seeds.get(Math.max(0, last)),
                    u.seedCount(),
                    stateWords(u, over, now),
                    u.worker(),
                    u.attempts(),
                    u.progress()));
        }
        return new UnitTable(List.copyOf(rows), repo.unitCounts(run.id()));
    }

    private static String stateWords(UnitLine u, boolean runOver, OffsetDateTime now) {
        if (u.state().equals("done")) {
            return "done";
        }
        if (runOver) {
            return u.attempts() == 0 ? "not started: the run ended" : "stopped: the run ended";
        }
        if (u.state().equals("running")) {
            Liveness holder = u.workerLastSeen()
                    .map(seen -> liveness(seen, u.workerStoppedAt(), now))
                    .orElse(Liveness.LOST);
            return switch (holder) {
                case ALIVE -> "running";
                case STOPPED -> "waiting to run again: its process stopped";
                case LOST -> "waiting to run again: its process was lost";
            };
        }
        return u.attempts() == 0 ? "waiting" : "waiting to run again";
    }
}
