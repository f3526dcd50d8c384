package dev.driftlab.app.runs;

import dev.driftlab.app.runs.persistence.RunRepository;
import dev.driftlab.app.runs.persistence.RunRepository.RunRow;
import dev.driftlab.app.scenarios.ScenarioStore;
import java.time.Clock;
import java.time.OffsetDateTime;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.concurrent.ConcurrentHashMap;
import java.util.concurrent.LinkedBlockingQueue;
import java.util.concurrent.Semaphore;
import java.util.concurrent.ThreadPoolExecutor;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicBoolean;
import java.util.concurrent.atomic.AtomicInteger;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

/**
 * The fixed pool of workers and the fixed number of places (running and waiting together). Places are
 * reserved before a run is stored and handed back when its worker is done, so every stored run gets
 * a worker and the pool's own queue never refuses one.
 */
final class RunWorkers {

    private static final Logger LOG = LoggerFactory.getLogger(RunWorkers.class);

    private final RunRepository runs;
    private final ScenarioStore scenarios;
    private final TrialExecutor executor;
    private final Clock clock;
    private final int workers;
    private final int places;
    private final Semaphore free;
    private final ThreadPoolExecutor pool;
    private final Map<Long, Active> active = new ConcurrentHashMap<>();
    private final AtomicBoolean stopping = new AtomicBoolean();

    private record Active(AtomicBoolean cancel, Thread thread) {}

    RunWorkers(
            RunRepository runs,
            ScenarioStore scenarios,
            TrialExecutor executor,
            Clock clock,
            int workers,
            int queueCapacity) {
        this.runs = runs;
        this.scenarios = scenarios;
        this.executor = executor;
        this.clock = clock;
        this.workers = workers > 0 ? workers : Runtime.getRuntime().availableProcessors();
        if (queueCapacity < 0) {
            throw new IllegalArgumentException("driftlab.runs.queue-capacity must be 0 or more");
        }
        this.places = this.workers + queueCapacity;
        this.free = new Semaphore(places);
        AtomicInteger n = new AtomicInteger();
        // the semaphore bounds what reaches the pool, so its own queue never refuses a task
        this.pool = new ThreadPoolExecutor(
                this.workers, this.workers, 0, TimeUnit.SECONDS, new LinkedBlockingQueue<>(places), r -> {
                    Thread t = new Thread(r, "driftlab-run-" + n.incrementAndGet());
                    t.setDaemon(true);
                    return t;
                });
    }

    int workers() {
        return workers;
    }

    int places() {
        return places;
    }

    int freePlaces() {
        return free.availablePermits();
    }

    /** Takes n places, all or none; false when stopping or short of places. */
    boolean reserve(int n) {
        return !stopping.get() && free.tryAcquire(n);
    }

    /** Gives back places reserved for runs that were not stored after all. */
    void release(int n) {
        free.release(n);
    }

    /** Hands stored runs to the workers, one reserved place each. */
    void start(List<Long> ids) {
        for (long id : ids) {
            pool.execute(() -> work(id));
        }
    }

    /** Asks a running run to stop; false when no worker has it. */
    boolean cancelRunning(long id) {
        Active a = active.get(id);
        if (a == null) {
            return false;
        }
        a.cancel().set(true);
        a.thread().interrupt();
        return true;
    }

    void stop() throws InterruptedException {
        stopping.set(true);
        pool.shutdownNow();
        if (!pool.awaitTermination(10, TimeUnit.SECONDS)) {
            LOG.warn("some runs did not stop within 10 s; they will show as interrupted after the next start");
        }
    }

    private void work(long id) {
        try {
            AtomicBoolean cancel = new AtomicBoolean();
            // registered before the state flips, so a cancel arriving in between is not missed
            active.put(id, new Active(cancel, Thread.currentThread()));
            try {
                if (stopping.get() || !runs.markRunning(id, now())) {
                    return;
                }
                runOne(id, cancel);
            } finally {
                active.remove(id);
                // a cancel's interrupt must not leak into the next run on this thread
                Thread.interrupted();
            }
        } catch (RuntimeException e) {
            LOG.error("run {} could not be recorded", id, e);
        } finally {
            free.release();
        }
    }

    private void runOne(long id, AtomicBoolean cancel) {
        RunRow row = runs.find(id).orElseThrow(RunNotFound::new);
        String document = scenarios.documentOfRevision(row.revisionId()).orElseThrow(RunNotFound::new);
        TrialRequest request = new TrialRequest(document, row.variant(), row.seedList(), TrialOptions.of(row));
        RunProgress context = new RunProgress(runs, id, cancel, stopping);
        try {
            StoredResult outcome = executor.execute(request, context);
            if (context.cancelled()) {
                finishStopped(id, cancel);
            } else {
                runs.finishDone(id, now(), outcome.resultJson(), outcome.verdict());
            }
        } catch (InterruptedException e) {
            finishStopped(id, cancel);
        } catch (RuntimeException e) {
            if (context.cancelled()) {
                finishStopped(id, cancel);
                return;
            }
            LOG.warn("run {} failed", id, e);
            String why = Optional.ofNullable(e.getMessage())
                    .filter(m -> !m.isBlank())
                    .orElse("the run stopped with an internal error");
            runs.finish(id, RunState.FAILED.word(), now(), RunProgress.clip(why, 2000));
        }
    }

    private void finishStopped(long id, AtomicBoolean cancel) {
        Thread.interrupted();
        if (cancel.get() || !stopping.get()) {
            runs.finish(id, RunState.CANCELLED.word(), now(), "");
        } else {
            runs.finish(id, RunState.INTERRUPTED.word(), now(), "The server stopped during this run; run it again.");
        }
    }

    private OffsetDateTime now() {
        return OffsetDateTime.now(clock);
    }
}
