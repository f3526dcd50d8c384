package dev.driftlab.app.runs;

import dev.driftlab.app.runs.persistence.RunRepository;
import dev.driftlab.app.runs.persistence.RunRepository.RunRow;
import dev.driftlab.app.runs.persistence.UnitRepository;
import dev.driftlab.app.runs.persistence.UnitRepository.TrialRow;
import dev.driftlab.app.runs.persistence.UnitRepository.UnitRow;
import dev.driftlab.app.scenarios.ScenarioStore;
import java.time.Clock;
import java.time.OffsetDateTime;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.HashSet;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import java.util.concurrent.ConcurrentHashMap;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicBoolean;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;
import org.springframework.dao.DataAccessException;
import org.springframework.transaction.support.TransactionTemplate;

/**
 * Executes one work unit on this process: runs the unit's seeds that have no stored trial yet,
 * stores each trial as it ends, and, when the run's last trial is stored, assembles the run's
 * result once (under a row lock on the run). Safe to repeat: a unit that runs again after its
 * process died finds what it already stored and changes nothing.
 */
final class UnitWork {

    /** Thrown out of a unit stopped because this process is stopping, so the engine runs it again. */
    static final class Stopped extends RuntimeException {
        Stopped() {
            super("the process stopped during this unit; it will run again");
        }
    }

    private static final Logger LOG = LoggerFactory.getLogger(UnitWork.class);
    private static final long PROGRESS_EVERY_NANOS = TimeUnit.MILLISECONDS.toNanos(500);

    private final RunRepository runs;
    private final UnitRepository units;
    private final ScenarioStore scenarios;
    private final TrialExecutor executor;
    private final TransactionTemplate tx;
    private final Clock clock;
    private final String worker;
    private final AtomicBoolean stopping;
    /** Cancel flags of the units this process runs now, by run. */
    private final Map<Long, Set<AtomicBoolean>> active = new ConcurrentHashMap<>();

    UnitWork(
            RunRepository runs,
            UnitRepository units,
            ScenarioStore scenarios,
            TrialExecutor executor,
            TransactionTemplate tx,
            Clock clock,
            String worker,
            AtomicBoolean stopping) {
        this.runs = runs;
        this.units = units;
        this.scenarios = scenarios;
        this.executor = executor;
        this.tx = tx;
        this.clock = clock;
        this.worker = worker;
        this.stopping = stopping;
    }

    /** Runs whose units this process runs now. */
    Set<Long> activeRuns() {
        return new HashSet<>(active.keySet());
    }

    /** Stops this process's units of a run (it was cancelled, failed or finished elsewhere). */
    void stopRun(long runId) {
        Set<AtomicBoolean> flags = active.get(runId);
        if (flags != null) {
            flags.forEach(f -> f.set(true));
        }
    }

    /**
     * Executes one unit.
     *
     * @throws Stopped when this process is stopping (the engine runs the unit again)
     * @throws DataAccessException when the database failed (the engine runs the unit again)
     */
    void execute(long runId, int unitNo) {
        Optional<RunRow> found = runs.find(runId);
        Optional<UnitRow> unit = units.unit(runId, unitNo);
        if (found.isEmpty()
                || unit.isEmpty()
                || RunState.of(found.get().state()).map(RunState::finished).orElse(true)) {
            return; // cancelled, failed, deleted or already assembled: nothing left to do
        }
        RunRow run = found.get();
        runs.markRunning(runId, now());
        units.unitStarted(runId, unitNo, worker, now());
        String document = RunScenario.document(scenarios, run).orElse(null);
        if (document == null) {
            runs.finish(
                    runId,
                    RunState.FAILED.word(),
                    now(),
                    run.profile().isPresent()
                            ? "the scenario revision of this run no longer exists, or its profile no longer applies"
                            : "the scenario revision of this run no longer exists");
            return;
        }
        List<Long> all = run.seedList();
        TrialRequest request = new TrialRequest(document, run.variant(), all, TrialOptions.of(run));
        UnitRow u = unit.get();
        List<Long> mine = new ArrayList<>(all.subList(u.firstIndex(), u.firstIndex() + u.seedCount()));
        if (all.size() > 1) {
            // an earlier attempt stored some: run only the rest (a one-seed run runs again, for its trace)
            mine.removeAll(new HashSet<>(units.storedSeeds(runId)));
        }
        AtomicBoolean cancel = new AtomicBoolean();
        active.computeIfAbsent(runId, k -> ConcurrentHashMap.newKeySet()).add(cancel);
        UnitProgress context = new UnitProgress(runId, unitNo, all.size(), cancel);
        try {
            if (!runs.active(runId)) {
                units.unitStopped(runId, unitNo, now());
                return; // cancelled while we set up
            }
            executor.runSeeds(request, mine, context);
        } catch (InterruptedException e) {
            Thread.interrupted();
            if (stopping.get() && !cancel.get()) {
                throw new Stopped();
            }
            units.unitStopped(runId, unitNo, now());
            return; // cancelled: the run already says so
        } catch (DataAccessException e) {
            throw e;
        } catch (RuntimeException e) {
            if (stopping.get() && !cancel.get()) {
                throw new Stopped();
            }
            units.unitStopped(runId, unitNo, now());
            if (cancel.get()) {
                return;
            }
            LOG.warn("run {} unit {} failed", runId, unitNo, e);
            runs.finish(runId, RunState.FAILED.word(), now(), clip(why(e), 2000));
            return;
        } finally {
            Set<AtomicBoolean> flags = active.get(runId);
            if (flags != null) {
                flags.remove(cancel);
                active.computeIfPresent(runId, (k, v) -> v.isEmpty() ? null : v);
            }
        }
        units.unitDone(runId, unitNo, now());
        units.countDone(worker, 1, context.trials);
        assembleIfComplete(runId, request);
    }

    /** Assembles the run's result if every seed has its trial; only one process ever does. */
    void assembleIfComplete(long runId, TrialRequest request) {
        List<Long> all = request.seeds();
        if (units.countTrials(runId) < all.size()) {
            return;
        }
        try {
            tx.executeWithoutResult(status -> {
                if (!runs.lockRunning(runId)) {
                    return; // another process assembled it, or it was cancelled
                }
                Map<Long, TrialRow> bySeed = new HashMap<>();
                for (TrialRow t : units.trials(runId)) {
                    bySeed.put(t.seed(), t);
                }
                List<TrialRecord> ordered = new ArrayList<>(all.size());
                for (long seed : all) {
                    TrialRow t = bySeed.get(seed);
                    if (t == null) {
                        return;
                    }
                    ordered.add(new TrialRecord(seed, t.outcome(), t.trace().orElse(null), t.seconds()));
                }
                StoredResult result = executor.assemble(request, ordered);
                runs.progress(runId, 1, "done");
                runs.finishDone(runId, now(), result.resultJson(), result.verdict());
            });
        } catch (DataAccessException e) {
            throw e;
        } catch (RuntimeException e) {
            LOG.warn("run {} could not be assembled", runId, e);
            runs.finish(runId, RunState.FAILED.word(), now(), clip(why(e), 2000));
        }
    }

    private static String why(RuntimeException e) {
        return Optional.ofNullable(e.getMessage())
                .filter(m -> !m.isBlank())
                .orElse("the run stopped with an internal error");
    }

    static String clip(String s, int max) {
        return s.length() <= max ? s : s.substring(0, max);
    }

    private OffsetDateTime now() {
        return OffsetDateTime.now(clock);
    }

    /** What the executor reports through while this unit runs. */
    private final class UnitProgress implements TrialContext {
        private final long runId;
        private final int unitNo;
        private final int seeds;
        private final AtomicBoolean cancel;
        private long lastWrite = System.nanoTime() - PROGRESS_EVERY_NANOS;
        int trials;

        UnitProgress(long runId, int unitNo, int seeds, AtomicBoolean cancel) {
            this.runId = runId;
            this.unitNo = unitNo;
            this.seeds = seeds;
            this.cancel = cancel;
        }

        @Override
        public void progress(double fraction, String message) {
            long t = System.nanoTime();
            double f = Double.isFinite(fraction) ? Math.max(0, Math.min(1, fraction)) : 0;
            if (t - lastWrite >= PROGRESS_EVERY_NANOS) {
                lastWrite = t;
                units.unitProgress(runId, unitNo, f);
                runs.progressFromUnits(
                        runId, seeds, clip("unit " + (unitNo + 1) + ": " + (message == null ? "" : message), 500));
            }
        }

        @Override
        public boolean cancelled() {
            return cancel.get() || stopping.get() || Thread.currentThread().isInterrupted();
        }

        @Override
        public void frameChunk(int index, byte[] data) {
            if (index < 0) {
                throw new IllegalArgumentException("frame chunk index must be 0 or more, got " + index);
            }
            if (data.length > MAX_CHUNK_BYTES) {
                throw new IllegalArgumentException(
                        "frame chunk " + index + " has " + data.length + " bytes; at most " + MAX_CHUNK_BYTES);
            }
            runs.insertChunk(runId, index, data);
        }

        @Override
        public void trialDone(TrialRecord trial) {
            units.insertTrial(runId, trial.seed(), trial.outcome(), trial.trace(), trial.seconds(), worker, now());
            trials++;
        }
    }
}
