package dev.driftlab.trial;

import dev.driftlab.evaluation.BatchSummary;
import dev.driftlab.evaluation.EpisodeRules;
import dev.driftlab.evaluation.Gates;
import dev.driftlab.evaluation.TrialOutcome;
import dev.driftlab.recording.FrameSink;
import dev.driftlab.scenario.Gate;
import dev.driftlab.scenario.Scenario;
import dev.driftlab.scenario.SettingsVariant;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.concurrent.atomic.AtomicBoolean;
import java.util.concurrent.atomic.AtomicInteger;

/**
 * Runs a {@link SuitePlan}: for each scenario in turn, the scenario as it is and under each profile
 * that leaves it valid, every one on the scenario's seeds, on a bounded pool of threads. Only each
 * scenario's base settings run (its settings variants do not). The trials of one scenario are
 * summarised together with the scenario's gates, the column as it is first, so every profile's
 * figures are paired with the scenario as it is on the same seeds. One scenario's compiled sites
 * are dropped before the next is compiled, so memory stays that of one scenario and its profiles.
 * Like {@link BatchRunner}, results do not depend on the thread count.
 */
public final class SuiteRunner {

    private final int threads;
    private final LocalizerSource localizers;

    /**
     * A suite runner judging the built-in localizer.
     *
     * @param threads worker threads, at least 1
     */
    public SuiteRunner(int threads) {
        this(threads, LocalizerSource.BUILT_IN);
    }

    /**
     * A suite runner.
     *
     * @param threads worker threads, at least 1
     * @param localizers the localizer every trial judges: the built-in one or an outside program
     */
    public SuiteRunner(int threads, LocalizerSource localizers) {
        if (threads < 1) {
            throw new IllegalArgumentException("threads must be at least 1, got " + threads);
        }
        this.threads = threads;
        this.localizers = java.util.Objects.requireNonNull(localizers, "localizers");
    }

    /** The localizer every trial judges. */
    public LocalizerSource localizers() {
        return localizers;
    }

    /**
     * Runs the plan.
     *
     * @param plan the scenarios, profiles and seeds
     * @param rules episode thresholds
     * @param progress called after each trial, with counts over the whole suite
     * @param cancel set to true to stop; finished trials are kept
     */
    public SuiteResult run(SuitePlan plan, EpisodeRules rules, BatchProgress progress, AtomicBoolean cancel) {
        long started = System.nanoTime();
        int total = plan.trials();
        AtomicInteger done = new AtomicInteger();
        ExecutorService pool = Executors.newFixedThreadPool(threads, r -> {
            Thread t = new Thread(r, "driftlab-suite-trial");
            t.setDaemon(true);
            return t;
        });
        try {
            List<SuiteResult.Row> rows = new ArrayList<>();
            for (SuitePlan.Row row : plan.rows()) {
                rows.add(row(row, rules, progress, cancel, pool, done, total, localizers));
            }
            double seconds = (System.nanoTime() - started) / 1e9;
            int finished = rows.stream().mapToInt(r -> r.trials().size()).sum();
            return new SuiteResult(plan, rows, total, finished < total, seconds);
        } finally {
            pool.shutdownNow();
        }
    }

    private static SuiteResult.Row row(
            SuitePlan.Row row,
            EpisodeRules rules,
            BatchProgress progress,
            AtomicBoolean cancel,
            ExecutorService pool,
            AtomicInteger done,
            int total,
            LocalizerSource localizers) {
        Scenario asIs = row.entry().scenario();
        List<Gate> gates = Gates.effective(asIs);
        List<String> order = new ArrayList<>();
        List<TrialRunner> runners = new ArrayList<>();
        for (SuitePlan.Cell c : row.cells()) {
            if (!c.invalid()) {
                order.add(c.name());
                runners.add(new TrialRunner(c.scenario().orElseThrow(), localizers));
            }
        }
        List<Future<TrialOutcome>> futures = new ArrayList<>();
        // seed-major, as in a batch: a cancelled suite keeps every column of the seeds it finished
        for (long seed : row.entry().seeds()) {
            for (int i = 0; i < runners.size(); i++) {
                TrialRunner runner = runners.get(i);
                String column = order.get(i);
                SettingsVariant base =
                        new SettingsVariant("base", runner.scenario().localizer());
                futures.add(pool.submit(() -> {
                    if (cancel.get()) {
                        return null;
                    }
                    TrialRunner.Result r = runner.run(base, seed, FrameSink.NONE, rules, cancel::get);
                    if (r.cancelled()) {
                        return null;
                    }
                    TrialOutcome o = r.outcome().withVariant(column);
                    progress.trialDone(done.incrementAndGet(), total, o);
                    return o;
                }));
            }
        }
        List<TrialOutcome> finished = new ArrayList<>();
        for (Future<TrialOutcome> f : futures) {
            try {
                TrialOutcome o = f.get();
                if (o != null) {
                    finished.add(o);
                }
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                cancel.set(true);
            } catch (ExecutionException e) {
                cancel.set(true);
                Throwable cause = e.getCause();
                throw cause instanceof RuntimeException re
                        ? re
                        : new IllegalStateException("a trial failed: " + cause, cause);
            }
        }
        finished.sort(Comparator.<TrialOutcome>comparingInt(t -> order.indexOf(t.variant()))
                .thenComparingLong(TrialOutcome::seed));
        BatchSummary summary =
                finished.isEmpty() ? new BatchSummary(List.of(), List.of()) : BatchSummary.of(finished, gates);
        return new SuiteResult.Row(row, finished, summary, gates);
    }
}
