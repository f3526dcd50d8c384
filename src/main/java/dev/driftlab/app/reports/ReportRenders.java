package dev.driftlab.app.reports;

import dev.driftlab.app.runs.RunState;
import dev.driftlab.app.runs.persistence.RunRepository.RunRow;
import dev.driftlab.app.system.ByteBoundedCache;
import java.util.List;
import java.util.concurrent.Semaphore;
import java.util.function.Supplier;
import org.springframework.beans.factory.annotation.Value;
import org.springframework.stereotype.Component;

/**
 * Bounds what report rendering may cost the server: at most a few renders at once (a request past
 * that is answered busy at once, never queued, so waiting requests cannot pile up their memory) and
 * a byte-bounded cache of the reports of finished runs, which never change. One instance serves
 * every controller that renders reports, so the bounds hold for the pages, the PDFs and the
 * downloaded batch files together.
 */
@Component
public final class ReportRenders {

    /** A render refused because as many as allowed are under way. */
    public static final class Busy extends RuntimeException {
        public Busy(String what) {
            super("Busy: " + what + " are being made already; try again in a few seconds.");
        }
    }

    private final Semaphore pdfs;
    private final Semaphore pages;
    private final ByteBoundedCache<String, byte[]> pdfCache;
    private final ByteBoundedCache<String, String> pageCache;

    /**
     * @param concurrentPdfs PDFs made at once
     * @param concurrentPages report pages made at once
     * @param cacheBytes budget of each cache (PDFs, pages)
     */
    public ReportRenders(
            @Value("${driftlab.reports.concurrent-pdfs:2}") int concurrentPdfs,
            @Value("${driftlab.reports.concurrent-pages:4}") int concurrentPages,
            @Value("${driftlab.reports.cache-bytes:67108864}") long cacheBytes) {
        this.pdfs = new Semaphore(Math.max(1, concurrentPdfs));
        this.pages = new Semaphore(Math.max(1, concurrentPages));
        this.pdfCache = new ByteBoundedCache<>(cacheBytes, b -> b.length + 40L);
        this.pageCache = new ByteBoundedCache<>(cacheBytes, ByteBoundedCache::weightOf);
    }

    /** A PDF from the cache, or made under the PDF bound and kept when every run is finished. */
    public byte[] pdf(String key, List<RunRow> runs, Supplier<byte[]> make) {
        return cached(pdfCache, pdfs, "PDF reports", key, runs, make);
    }

    /** A report page from the cache, or made under the page bound and kept when every run is finished. */
    public String page(String key, List<RunRow> runs, Supplier<String> make) {
        return cached(pageCache, pages, "report pages", key, runs, make);
    }

    /**
     * A downloadable report file (result document, JUnit file, page without its tool bar) from the
     * cache, or made under the page bound, which it shares with the report pages.
     */
    public String file(String key, List<RunRow> runs, Supplier<String> make) {
        return cached(pageCache, pages, "report files and pages", "file/" + key, runs, make);
    }

    private static <V> V cached(
            ByteBoundedCache<String, V> cache,
            Semaphore bound,
            String what,
            String key,
            List<RunRow> runs,
            Supplier<V> make) {
        String full = runs.get(0).scenarioId() + "/" + key;
        var hit = cache.get(full);
        if (hit.isPresent()) {
            return hit.get();
        }
        if (!bound.tryAcquire()) {
            throw new Busy(what);
        }
        try {
            V value = make.get();
            if (runs.stream().allMatch(ReportRenders::settled)) {
                cache.put(full, value);
            }
            return value;
        } finally {
            bound.release();
        }
    }

    /** A run whose stored result can no longer change (an interrupted run may still be run again). */
    private static boolean settled(RunRow r) {
        return RunState.of(r.state())
                .map(s -> s.finished() && s != RunState.INTERRUPTED)
                .orElse(false);
    }
}
