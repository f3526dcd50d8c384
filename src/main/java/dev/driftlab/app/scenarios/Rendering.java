package dev.driftlab.app.scenarios;

import dev.driftlab.report.SitePlanSvg;
import dev.driftlab.scenario.ScenarioFiles;
import dev.driftlab.scenario.SettingsVariant;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * Parsed, validated and drawn form of a revision document. Revisions never change, so the result
 * is cached by revision id; this keeps the home page and scenario page cheap under load.
 *
 * @param checked read and validation result
 * @param svg site plan drawing, escaped by the renderer; empty when unreadable
 */
public record Rendering(ScenarioFiles.Checked checked, String svg) {

    static Rendering of(String document) {
        ScenarioFiles.Checked checked = ScenarioFiles.check(document);
        return new Rendering(
                checked, checked.scenario().map(SitePlanSvg::render).orElse(""));
    }

    /** Names of the settings variants, "base" first; empty when the document does not read. */
    public List<String> variantNames() {
        return checked.scenario()
                .map(s -> s.allVariants().stream().map(SettingsVariant::name).toList())
                .orElse(List.of());
    }

    /** A small LRU cache keyed by revision id. */
    static final class Cache {
        private final int capacity;
        private final Map<Long, Rendering> map;

        Cache(int capacity) {
            this.capacity = capacity;
            this.map = new LinkedHashMap<>(64, 0.75f, true) {
                @Override
                protected boolean removeEldestEntry(Map.Entry<Long, Rendering> e) {
                    return size() > Cache.this.capacity;
                }
            };
        }

        synchronized java.util.Optional<Rendering> get(long revisionId) {
            return java.util.Optional.ofNullable(map.get(revisionId));
        }

        synchronized void put(long revisionId, Rendering r) {
            map.put(revisionId, r);
        }
    }
}
