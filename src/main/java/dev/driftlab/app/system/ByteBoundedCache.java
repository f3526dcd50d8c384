package dev.driftlab.app.system;

import java.util.Iterator;
import java.util.LinkedHashMap;
import java.util.Optional;
import java.util.function.ToLongFunction;

/**
 * A least-recently-used cache bounded by the bytes its values hold, not by their count: one drawing
 * or report of a large site can weigh megabytes, so a count bound alone lets a few such entries
 * take the heap. A value heavier than the whole budget is not kept at all.
 *
 * @param <K> key
 * @param <V> value
 */
public final class ByteBoundedCache<K, V> {

    private final long maxBytes;
    private final ToLongFunction<V> weigher;
    private final LinkedHashMap<K, V> map = new LinkedHashMap<>(64, 0.75f, true);
    private long bytes;

    /**
     * @param maxBytes budget of all values together
     * @param weigher approximate bytes of one value
     */
    public ByteBoundedCache(long maxBytes, ToLongFunction<V> weigher) {
        if (maxBytes < 0) {
            throw new IllegalArgumentException("maxBytes: must not be negative");
        }
        this.maxBytes = maxBytes;
        this.weigher = weigher;
    }

    /** Bytes of a string held in memory (UTF-16 at worst). */
    public static long weightOf(String s) {
        return 2L * s.length() + 40;
    }

    public synchronized Optional<V> get(K key) {
        return Optional.ofNullable(map.get(key));
    }

    /** Keeps the value when it fits the budget, dropping the least recently used entries to make room. */
    public synchronized void put(K key, V value) {
        long w = weigher.applyAsLong(value);
        V old = map.remove(key);
        if (old != null) {
            bytes -= weigher.applyAsLong(old);
        }
        if (w > maxBytes) {
            return;
        }
        Iterator<V> eldest = map.values().iterator();
        while (bytes + w > maxBytes && eldest.hasNext()) {
            bytes -= weigher.applyAsLong(eldest.next());
            eldest.remove();
        }
        map.put(key, value);
        bytes += w;
    }

    /** Bytes held now. */
    public synchronized long bytes() {
        return bytes;
    }

    public synchronized int size() {
        return map.size();
    }
}
