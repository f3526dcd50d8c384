package dev.driftlab.app.scenarios;

import dev.driftlab.scenario.Scenario;
import dev.driftlab.scenario.ScenarioJson;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;

/**
 * What changed between two revisions, by section (rooms, doors, route, faults, settings, ...).
 * Both revisions are parsed into records and written back in the canonical form first, so
 * formatting, key order and unit rounding never show up as changes; list items with an id (or a
 * name, for variants) are matched by it, so reordering is not a change either.
 *
 * @param from the older revision number
 * @param to the newer revision number
 * @param sections every section, with its changes (possibly none)
 */
public record RevisionDiff(int from, int to, List<Section> sections) {

    /** How one item differs. */
    public enum Kind {
        ADDED,
        REMOVED,
        CHANGED
    }

    /**
     * One difference.
     *
     * @param kind added, removed or changed
     * @param path path of the field in the scenario file
     * @param before old value as compact JSON, empty when added
     * @param after new value as compact JSON, empty when removed
     */
    public record Change(Kind kind, String path, String before, String after) {}

    /**
     * One part of the scenario.
     *
     * @param title plain name, e.g. "Doors"
     * @param changes its differences in file order
     */
    public record Section(String title, List<Change> changes) {
        /** Whether anything changed here. */
        public boolean changed() {
            return !changes.isEmpty();
        }
    }

    private static final JsonMapper MAPPER = JsonMapper.builder().build();
    private static final int MAX_VALUE_TEXT = 300;

    /** Copies the list. */
    public RevisionDiff {
        sections = List.copyOf(sections);
    }

    /** Whether the two revisions hold the same scenario. */
    public boolean identical() {
        return sections.stream().noneMatch(Section::changed);
    }

    /** The sections with at least one change. */
    public List<Section> changedSections() {
        return sections.stream().filter(Section::changed).toList();
    }

    /** Compares two parsed revisions. */
    public static RevisionDiff between(int from, Scenario a, int to, Scenario b) {
        JsonNode x = MAPPER.readTree(ScenarioJson.write(a));
        JsonNode y = MAPPER.readTree(ScenarioJson.write(b));
        List<Section> out = new ArrayList<>();
        out.add(section("Name and description", x, y, "name", "description"));
        out.add(keyed(
                "Rooms",
                "site.rooms",
                x.path("site").path("rooms"),
                y.path("site").path("rooms"),
                "id"));
        out.add(keyed(
                "Doors",
                "site.doors",
                x.path("site").path("doors"),
                y.path("site").path("doors"),
                "id"));
        out.add(keyed(
                "Fixtures",
                "site.fixtures",
                x.path("site").path("fixtures"),
                y.path("site").path("fixtures"),
                "id"));
        out.add(keyed(
                "Floor zones",
                "site.floorZones",
                x.path("site").path("floorZones"),
                y.path("site").path("floorZones"),
                "id"));
        out.add(keyed(
                "Clutter",
                "site.clutter",
                x.path("site").path("clutter"),
                y.path("site").path("clutter"),
                "id"));
        out.add(section("Robot", x, y, "robot"));
        out.add(section("Rangefinder", x, y, "rangefinder"));
        out.add(section("Route", x, y, "route"));
        out.add(keyed("Faults", "faults", x.path("faults"), y.path("faults"), "id"));
        out.add(section("Localizer settings", x, y, "localizer"));
        out.add(keyed("Settings variants", "variants", x.path("variants"), y.path("variants"), "name"));
        out.add(keyed("Gates", "gates", x.path("gates"), y.path("gates"), "id"));
        return new RevisionDiff(from, to, out);
    }

    private static Section section(String title, JsonNode x, JsonNode y, String... keys) {
        List<Change> changes = new ArrayList<>();
        for (String k : keys) {
            diff(k, x.get(k), y.get(k), changes);
        }
        return new Section(title, changes);
    }

    private static Section keyed(String title, String path, JsonNode xs, JsonNode ys, String key) {
        Map<String, JsonNode> a = byKey(xs, key);
        Map<String, JsonNode> b = byKey(ys, key);
        Set<String> all = new LinkedHashSet<>(a.keySet());
        all.addAll(b.keySet());
        List<Change> changes = new ArrayList<>();
        for (String k : all) {
            diff(path + "[\"" + k + "\"]", a.get(k), b.get(k), changes);
        }
        return new Section(title, changes);
    }

    private static Map<String, JsonNode> byKey(JsonNode list, String key) {
        Map<String, JsonNode> m = new LinkedHashMap<>();
        if (list != null && list.isArray()) {
            int i = 0;
            for (JsonNode item : list) {
                JsonNode k = item.get(key);
                m.put(k != null && k.isString() ? k.stringValue() : "#" + i, item);
                i++;
            }
        }
        return m;
    }

    private static void diff(String path, JsonNode a, JsonNode b, List<Change> out) {
        boolean hasA = a != null && !a.isMissingNode();
        boolean hasB = b != null && !b.isMissingNode();
        if (!hasA && !hasB) {
            return;
        }
        if (!hasA) {
            out.add(new Change(Kind.ADDED, path, "", text(b)));
        } else if (!hasB) {
            out.add(new Change(Kind.REMOVED, path, text(a), ""));
        } else if (a.equals(b)) {
            return;
        } else if (a.isObject() && b.isObject()) {
            Set<String> keys = new LinkedHashSet<>(a.propertyNames());
            keys.addAll(b.propertyNames());
            for (String k : keys) {
                diff(path + "." + k, a.get(k), b.get(k), out);
            }
        } else if (a.isArray() && b.isArray() && (containsObjects(a) || containsObjects(b))) {
            for (int i = 0; i < Math.max(a.size(), b.size()); i++) {
                diff(path + "[" + i + "]", a.get(i), b.get(i), out);
            }
        } else {
            // outlines and other lists of plain values read best as one before/after pair
            out.add(new Change(Kind.CHANGED, path, text(a), text(b)));
        }
    }

    private static boolean containsObjects(JsonNode array) {
        for (JsonNode n : array) {
            if (n.isObject()) {
                return true;
            }
        }
        return false;
    }

    private static String text(JsonNode n) {
        String s = n.isString() ? n.stringValue() : MAPPER.writeValueAsString(n);
        return s.length() <= MAX_VALUE_TEXT ? s : s.substring(0, MAX_VALUE_TEXT) + " ...";
    }
}
