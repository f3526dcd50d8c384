package dev.driftlab.trial;

import dev.driftlab.evaluation.BatchSummary;
import dev.driftlab.evaluation.EpisodeRules;
import dev.driftlab.evaluation.TrialOutcome;
import dev.driftlab.recording.FrameSink;
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
 * Runs seeds x settings variants on a bounded pool of threads. Every variant runs with the same
 * seeds, so variants are compared on identical simulated worlds. Results do not depend on the
 * thread count: each trial is a pure function of its inputs and results are sorted before
 * summarising.
 */
public final class BatchRunner {

    private final TrialRunner runner;
    private final int threads;

    /**
     * A batch runner.
     *
     * @param scenario a valid scenario
     * @param threads worker threads, at least 1
     */
    public BatchRunner(Scenario scenario, int threads) {
        this(scenario, threads, LocalizerSource.BUILT_IN);
    }

    /**
     * A batch runner whose trials run localizers from the given source.
     *
     * @param scenario a valid scenario
     * @param threads worker threads, at least 1
     * @param localizers where each trial's localizer comes from
     */
    public BatchRunner(Scenario scenario, int threads, LocalizerSource localizers) {
        if (threads < 1) {
            throw new IllegalArgumentException("threads must be at least 1, got " + threads);
        }
        this.runner = new TrialRunner(scenario, localizers);
        this.threads = threads;
    }

    /** The trial runner the batch uses (compiled site shared by all trials). */
    public TrialRunner trialRunner() {
        return runner;
    }

    /**
     * The seeds of a batch: {@code first}, {@code first + 1}, ... {@code count} of them.
     *
     * @throws IllegalArgumentException for a count under 1
     */
    public static long[] seeds(long first, int count) {
        if (count < 1) {
            throw new IllegalArgumentException("a batch needs at least one seed, got " + count);
        }
        long[] s = new long[count];
        for (int i = 0; i < count; i++) {
            s[i] = first + i;
        }
        return s;
    }

    /**
     * Runs the batch.
     *
     * @param variants settings variants, the first being the base of the paired comparisons
     * @param seeds seeds to run for every variant
     * @param rules episode thresholds
     * @param progress called after each trial
     * @param cancel set to true to stop; finished trials are kept
     */
    public BatchResult run(
            List<SettingsVariant> variants,
            long[] seeds,
            EpisodeRules rules,
            BatchProgress progress,
            AtomicBoolean cancel) {
        if (variants.isEmpty() || seeds.length == 0) {
            throw new IllegalArgumentException("a batch needs at least one variant and one seed");
        }
        long started = System.nanoTime();
        int total = variants.size() * seeds.length;
        AtomicInteger done = new AtomicInteger();
        ExecutorService pool = Executors.newFixedThreadPool(threads, r -> {
            Thread t = new Thread(r, "driftlab-trial");
            t.setDaemon(true);
            return t;
        });
        List<Future<TrialOutcome>> futures = new ArrayList<>(total);
        try {
            // seed-major order: the first trials done cover every variant, so a cancelled batch stays paired
            for (long seed : seeds) {
                for (SettingsVariant v : variants) {
                    futures.add(pool.submit(() -> {
                        if (cancel.get()) {
                            return null;
                        }
                        TrialRunner.Result r = runner.run(v, seed, FrameSink.NONE, rules, cancel::get);
                        if (r.cancelled()) {
                            return null;
                        }
                        progress.trialDone(done.incrementAndGet(), total, r.outcome());
                        return r.outcome();
                    }));
                }
            }
            List<TrialOutcome> finished = new ArrayList<>(total);
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
            List<String> order = variants.stream().map(SettingsVariant::name).toList();
            finished.sort(Comparator.<TrialOutcome>comparingInt(t -> order.indexOf(t.variant()))
                    .thenComparingLong(TrialOutcome::seed));
            BatchSummary summary = finished.isEmpty()
                    ? new BatchSummary(List.of(), List.of())
                    : BatchSummary.of(finished, runner.scenario());
            double seconds = (System.nanoTime() - started) / 1e9;
            return new BatchResult(finished, summary, total, finished.size() < total, seconds);
        } finally {
            pool.shutdownNow();
        }
    }
}
