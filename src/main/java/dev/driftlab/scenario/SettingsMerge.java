package dev.driftlab.scenario;

import java.util.Map;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.node.ObjectNode;

/**
 * Localizer settings as JSON trees: a variant's changes merged over the base settings when read,
 * and the difference from the base when written, so a variant file holds only what it changes.
 */
final class SettingsMerge {

    private SettingsMerge() {}

    /** Deep merge: keys of {@code changes} replace those of {@code base}; objects merge recursively. */
    static JsonNode merge(JsonNode base, JsonNode changes) {
        ObjectNode out = base != null && base.isObject()
                ? ((ObjectNode) base).deepCopy()
                : ScenarioJson.MAPPER.createObjectNode();
        if (changes == null || !changes.isObject()) {
            return out;
        }
        for (Map.Entry<String, JsonNode> e : changes.properties()) {
            JsonNode existing = out.get(e.getKey());
            if (existing != null && existing.isObject() && e.getValue().isObject()) {
                out.set(e.getKey(), merge(existing, e.getValue()));
            } else {
                out.set(e.getKey(), e.getValue().deepCopy());
            }
        }
        return out;
    }

    /** Keys of {@code variant} that differ from {@code base}, recursively; the inverse of merge. */
    static ObjectNode diff(ObjectNode base, ObjectNode variant) {
        ObjectNode out = ScenarioJson.MAPPER.createObjectNode();
        for (Map.Entry<String, JsonNode> e : variant.properties()) {
            JsonNode b = base.get(e.getKey());
            JsonNode v = e.getValue();
            if (b != null && b.isObject() && v.isObject()) {
                ObjectNode sub = diff((ObjectNode) b, (ObjectNode) v);
                if (!sub.isEmpty()) {
                    out.set(e.getKey(), sub);
                }
            } else if (!v.equals(b)) {
                out.set(e.getKey(), v);
            }
        }
        return out;
    }
}
