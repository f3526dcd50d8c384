package dev.driftlab.app.scenarios;

import dev.driftlab.app.system.ByteBoundedCache;
import dev.driftlab.report.SitePlanSvg;
import dev.driftlab.scenario.ScenarioFiles;
import dev.driftlab.scenario.SettingsVariant;
import java.util.List;

/**
 * Parsed, validated and drawn form of a revision document. Revisions never change, so the result
 * is cached by revision id; this keeps the home page and scenario page cheap under load.
 *
 * @param checked read and validation result
 * @param svg site plan drawing, escaped by the renderer; empty when unreadable
 * @param bytes approximate memory held: the drawing, and the parsed scenario at a few times its
 *     document's size
 */
public record Rendering(ScenarioFiles.Checked checked, String svg, long bytes) {

    /** A drawing larger than this is not shown in lists (the scenario page still shows it). */
    public static final int THUMBNAIL_BYTES = 64 * 1024;

    static Rendering of(String document) {
        ScenarioFiles.Checked checked = ScenarioFiles.check(document);
        String svg = checked.scenario().map(SitePlanSvg::render).orElse("");
        return new Rendering(checked, svg, 2L * svg.length() + 4L * document.length() + 1024);
    }

    /** Whether the drawing is small enough to show among many on one page. */
    public boolean thumbnail() {
        return !svg.isEmpty() && svg.length() <= THUMBNAIL_BYTES;
    }

    /** Names of the settings variants, "base" first; empty when the document does not read. */
    public List<String> variantNames() {
        return checked.scenario()
                .map(s -> s.allVariants().stream().map(SettingsVariant::name).toList())
                .orElse(List.of());
    }

    /**
     * An LRU cache keyed by revision id, bounded by bytes: the drawing of a site of thousands of
     * rooms weighs megabytes, so a bound by count let a few hundred such entries fill the heap.
     */
    static final class Cache {
        private final ByteBoundedCache<Long, Rendering> map;

        Cache(long maxBytes) {
            this.map = new ByteBoundedCache<>(maxBytes, Rendering::bytes);
        }

        java.util.Optional<Rendering> get(long revisionId) {
            return map.get(revisionId);
        }

        void put(long revisionId, Rendering r) {
            map.put(revisionId, r);
        }

        long bytes() {
            return map.bytes();
        }
    }
}
