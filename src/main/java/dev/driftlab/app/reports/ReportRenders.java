package dev.driftlab.app.reports;

import dev.driftlab.app.runs.RunState;
import dev.driftlab.app.runs.persistence.RunRepository.RunRow;
import dev.driftlab.app.system.ByteBoundedCache;
import dev.driftlab.app.system.RenderGate;
import java.util.List;
import java.util.function.Supplier;
import org.springframework.beans.factory.annotation.Value;
import org.springframework.stereotype.Component;

/**
 * Bounds what report rendering may cost the server, through one {@link RenderGate} for PDFs and
 * one for pages: at most a few renders of each at once (a request past that is answered busy at
 * once, never queued) and a byte-bounded cache of the reports of finished runs, which never change.
 * One instance serves every controller that renders reports, so the bounds hold for the pages, the
 * PDFs and the downloaded batch files together.
 */
@Component
public final class ReportRenders {

    private final RenderGate<byte[]> pdfs;
    private final RenderGate<String> pages;

    /**
     * @param concurrentPdfs PDFs made at once
     * @param concurrentPages report pages made at once
     * @param cacheBytes budget of each cache (PDFs, pages)
     */
    public ReportRenders(
            @Value("${driftlab.reports.concurrent-pdfs:2}") int concurrentPdfs,
            @Value("${driftlab.reports.concurrent-pages:4}") int concurrentPages,
            @Value("${driftlab.reports.cache-bytes:67108864}") long cacheBytes) {
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

    /**
     * A downloadable report file (result document, JUnit file, page without its tool bar) from the
     * cache, or made under the page bound, which it shares with the report pages.
     */
    public String file(String key, List<RunRow> runs, Supplier<String> make) {
        return pages.render(fullKey("file/" + key, runs), settled(runs), make);
    }

    /**
     * A suite report file (page, PDF) under the same bounds, keyed by the suite run, kept once the
     * suite run has its result (it no longer changes then).
     */
    public String suitePage(String key, boolean settled, Supplier<String> make) {
        return pages.render("suite/" + key, settled, make);
    }

    /** A suite report PDF under the PDF bound, as {@link #suitePage}. */
    public byte[] suitePdf(String key, boolean settled, Supplier<byte[]> make) {
        return pdfs.render("suite/" + key, settled, make);
    }

    private static String fullKey(String key, List<RunRow> runs) {
        return runs.get(0).scenarioId() + "/" + key;
    }

    private static boolean settled(List<RunRow> runs) {
        return runs.stream().allMatch(r -> RunState.settled(r.state()));
    }
}
