package dev.driftlab.app.runs;

import dev.driftlab.evaluation.Verdict;
import java.nio.charset.StandardCharsets;
import java.util.List;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicInteger;

/**
 * A stand-in for the simulation engine in tests: one step per seed with progress, one frame chunk
 * per seed when asked, optionally held at the first step until released (to test cancelling,
 * queueing and stopping), optionally failing.
 */
@org.springframework.context.annotation.Primary
public class ScriptedTrialExecutor implements TrialExecutor {

    /** Released to let held runs go on; replace it to hold again. */
    public volatile CountDownLatch hold = new CountDownLatch(0);

    /** When set, every run fails with this message. */
    public volatile String failWith = "";

    /** The verdict every run returns. */
    public volatile Verdict verdict = Verdict.PASS;

    /** When set, the result document every run returns, in place of the scripted one. */
    public volatile String result = "";

    public final AtomicInteger started = new AtomicInteger();
    public final AtomicInteger finished = new AtomicInteger();

    /** Holds every run until {@link #release()}. */
    public void holdRuns() {
        hold = new CountDownLatch(1);
    }

    public void release() {
        hold.countDown();
    }

    /** Back to: run at once, never fail. */
    public void reset() {
        release();
        failWith = "";
        verdict = Verdict.PASS;
        result = "";
        started.set(0);
        finished.set(0);
    }

    @Override
    public void runSeeds(TrialRequest request, List<Long> seeds, TrialContext context) throws InterruptedException {
        started.incrementAndGet();
        if (!request.scenarioJson().contains("driftlab-scenario/1")) {
            throw new IllegalStateException("not a scenario document");
        }
        long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(30);
        while (!hold.await(10, TimeUnit.MILLISECONDS)) {
            if (context.cancelled()) {
                throw new InterruptedException("cancelled");
            }
            if (System.nanoTime() > deadline) {
                throw new IllegalStateException("held for more than 30 s");
            }
        }
        if (!failWith.isEmpty()) {
            throw new IllegalStateException(failWith);
        }
        int n = seeds.size();
        for (int i = 0; i < n; i++) {
            if (context.cancelled()) {
                throw new InterruptedException("cancelled");
            }
            long seed = seeds.get(i);
            if (request.options().recordFrames()) {
                // one chunk per seed, numbered by the seed's place in the run
                context.frameChunk(
                        request.seeds().indexOf(seed), ("frames of seed " + seed).getBytes(StandardCharsets.UTF_8));
            }
            context.trialDone(new TrialRecord(seed, "{\"seed\":" + seed + "}", null, 0.001));
            context.progress((i + 1.0) / n, "seed " + (i + 1) + " of " + n);
        }
        finished.incrementAndGet();
    }

    @Override
    public StoredResult assemble(TrialRequest request, List<TrialRecord> trials) {
        String json = result.isEmpty()
                ? "{\"variant\":\"" + request.variant() + "\",\"trials\":" + trials.size() + "}"
                : result;
        return new StoredResult(json, verdict);
    }
}
