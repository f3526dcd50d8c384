package dev.driftlab.app.runs;

import dev.driftlab.app.runs.persistence.RunRepository;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicBoolean;

/**
 * What a running trial reports back through: progress (written at most every 200 ms, so a fast
 * trial does not turn into a stream of updates), recorded frame chunks and whether to stop.
 */
final class RunProgress implements TrialContext {

    private static final long PROGRESS_EVERY_NANOS = TimeUnit.MILLISECONDS.toNanos(200);

    private final RunRepository runs;
    private final long id;
    private final AtomicBoolean cancel;
    private final AtomicBoolean stopping;
    private long lastWrite = System.nanoTime() - PROGRESS_EVERY_NANOS;

    RunProgress(RunRepository runs, long id, AtomicBoolean cancel, AtomicBoolean stopping) {
        this.runs = runs;
        this.id = id;
        this.cancel = cancel;
        this.stopping = stopping;
    }

    @Override
    public void progress(double fraction, String message) {
        long t = System.nanoTime();
        double f = Double.isFinite(fraction) ? Math.max(0, Math.min(1, fraction)) : 0;
        if (t - lastWrite >= PROGRESS_EVERY_NANOS || f >= 1) {
            lastWrite = t;
            runs.progress(id, f, clip(message == null ? "" : message, 500));
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
        runs.insertChunk(id, index, data);
    }

    static String clip(String s, int max) {
        return s.length() <= max ? s : s.substring(0, max);
    }
}
