package dev.driftlab.app.system;

import java.util.concurrent.Semaphore;
import java.util.function.Supplier;
import java.util.function.ToLongFunction;

/**
 * Bounds what one kind of expensive answer (a PDF, a report page, a player scene) may cost the
 * server: at most a few are made at once, and a request past that is refused at once, never
 * queued, so waiting requests cannot pile up their memory; answers that can no longer change are
 * kept in a byte-bounded cache.
 *
 * @param <V> the answer
 */
public final class RenderGate<V> {

    /** Seconds a refused client is asked to wait (the {@code Retry-After} header). */
    public static final int RETRY_AFTER_SECONDS = 5;

    /** An answer refused because as many as allowed are being made. */
    public static final class Busy extends RuntimeException {
        public Busy(String what) {
            super("Busy: " + what + " are being made already; try again in a few seconds.");
        }
    }

    private final String what;
    private final Semaphore permits;
    private final ByteBoundedCache<String, V> cache;

    /**
     * @param what the answers in the plural, for the refusal ("report pages")
     * @param concurrent answers made at once (at least one)
     * @param cacheBytes budget of the cache
     * @param weigher approximate bytes of one answer
     */
    public RenderGate(String what, int concurrent, long cacheBytes, ToLongFunction<V> weigher) {
        this.what = what;
        this.permits = new Semaphore(Math.max(1, concurrent));
        this.cache = new ByteBoundedCache<>(cacheBytes, weigher);
    }

    /**
     * The cached answer, or one made under the bound and kept when it can no longer change.
     *
     * @param key names the answer among this gate's answers
     * @param settled whether the answer can no longer change, so it may be kept
     * @param make makes the answer; what it throws reaches the caller and nothing is kept
     * @throws Busy when as many answers as allowed are being made
     */
    public V render(String key, boolean settled, Supplier<V> make) {
        var hit = cache.get(key);
        if (hit.isPresent()) {
            return hit.get();
        }
        if (!permits.tryAcquire()) {
            throw new Busy(what);
        }
        try {
            V value = make.get();
            if (settled) {
                cache.put(key, value);
            }
            return value;
        } finally {
            permits.release();
        }
    }

    /** Answers that may start now. */
    public int available() {
        return permits.availablePermits();
    }

    /** Answers kept. */
    public int cached() {
        return cache.size();
    }
}
