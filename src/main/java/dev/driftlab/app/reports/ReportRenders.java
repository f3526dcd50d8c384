package dev.driftlab.app.reports;

import dev.driftlab.app.runs.RunState;
import dev.driftlab.app.runs.persistence.RunRepository.RunRow;
import dev.driftlab.app.system.ByteBoundedCache;
import dev.driftlab.app.system.RenderGate;
import java.util.List;
import java.util.function.Supplier;

/**
 * Bounds what report rendering may cost the server, through one {@link RenderGate} for PDFs and
 * one for pages: at most a few renders of each at once (a request past that is answered busy at
 * once, never queued) and a byte-bounded cache of the reports of finished runs, which never change.
 */
public final class ReportRenders {

    private final RenderGate<byte[]> pdfs;
    private final RenderGate<String> pages;

    /**
     * @param concurrentPdfs PDFs made at once
     * @param concurrentPages report pages made at once
     * @param cacheBytes budget of each cache (PDFs, pages)
     */
    public ReportRenders(int concurrentPdfs, int concurrentPages, long cacheBytes) {
        this.pdfs = new RenderGate<>("PDF reports", concurrentPdfs, cacheBytes, b -> b.length + 40L);
        this.pages = new RenderGate<>("report pages", concurrentPages, cacheBytes, ByteBoundedCache::weightOf);
    }

    /** A PDF from the cache, or made under the PDF bound and kept when every run is finished. */
    public byte[] pdf(String key, List<RunRow> runs, Supplier<byte[]> make) {
        return pdfs.render(fullKey(key, runs), settled(runs), make);
    }

    /** A report page from the cache, or made under the page bound and kept when every run is finished. */
    public String page(String key, List<RunRow> runs, Supplier<String> make) {
        return pages.render(fullKey(key, runs), settled(runs), make);
    }

    private static String fullKey(String key, List<RunRow> runs) {
        return runs.get(0).scenarioId() + "/" + key;
    }

    private static boolean settled(List<RunRow> runs) {
        return runs.stream().allMatch(r -> RunState.settled(r.state()));
    }
}
