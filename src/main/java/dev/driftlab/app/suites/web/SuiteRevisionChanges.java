package dev.driftlab.app.suites.web;

import dev.driftlab.app.suites.SuiteDocument;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;

/**
 * What changed between two revisions of a suite, in the rows the scenario comparison shows
 * (change, field, before, after): the name, description, seeds and first seed, each scenario
 * (matched by its link, so reordering is not a change) and each profile (matched by its name, the
 * column it makes).
 */
final class SuiteRevisionChanges {

    /** One difference; before is empty when added, after empty when removed. */
    record Change(String kind, String field, String before, String after) {}

    private SuiteRevisionChanges() {}

    /** The differences from {@code older} to {@code newer}, in document order. */
    static List<Change> between(
            SuiteDocument older,
            List<SuiteEntries.EntryRow> olderEntries,
            SuiteDocument newer,
            List<SuiteEntries.EntryRow> newerEntries) {
        List<Change> out = new ArrayList<>();
        value(out, "name", older.name(), newer.name());
        value(out, "description", text(older.description()), text(newer.description()));
        value(out, "seeds", seeds(older.seeds()), seeds(newer.seeds()));
        value(out, "firstSeed", Long.toString(older.first()), Long.toString(newer.first()));
        Map<String, SuiteEntries.EntryRow> before = byLink(olderEntries);
        Map<String, SuiteEntries.EntryRow> after = byLink(newerEntries);
        before.forEach((link, e) -> {
            SuiteEntries.EntryRow now = after.get(link);
            if (now == null) {
                out.add(new Change("removed", "scenario " + e.name(), entry(older, e), ""));
            } else if (!entry(older, e).equals(entry(newer, now))) {
                out.add(new Change("changed", "scenario " + e.name(), entry(older, e), entry(newer, now)));
            }
        });
        after.forEach((link, e) -> {
            if (!before.containsKey(link)) {
                out.add(new Change("added", "scenario " + e.name(), "", entry(newer, e)));
            }
        });
        Map<String, String> pb = byName(SuiteEntries.profiles(older));
        Map<String, String> pa = byName(SuiteEntries.profiles(newer));
        pb.forEach((name, fields) -> {
            String now = pa.get(name);
            if (now == null) {
                out.add(new Change("removed", "profile " + name, fields, ""));
            } else if (!now.equals(fields)) {
                out.add(new Change("changed", "profile " + name, fields, now));
            }
        });
        pa.forEach((name, fields) -> {
            if (!pb.containsKey(name)) {
                out.add(new Change("added", "profile " + name, "", fields));
            }
        });
        return out;
    }

    private static void value(List<Change> out, String field, String before, String after) {
        if (!Objects.equals(before, after)) {
            out.add(new Change("changed", field, before, after));
        }
    }

    private static String entry(SuiteDocument d, SuiteEntries.EntryRow e) {
        String revision = e.revision().isEmpty() ? "latest revision" : "revision " + e.revision() + " (pinned)";
        String seeds = e.seeds().isEmpty() ? seeds(d.seeds()) + " seeds (the suite's)" : e.seeds() + " seeds";
        return revision + ", " + seeds;
    }

    private static String seeds(Integer seeds) {
        return Integer.toString(seeds == null ? SuiteDocument.DEFAULT_SEEDS : seeds);
    }

    private static String text(String s) {
        return s == null ? "" : s;
    }

    private static Map<String, SuiteEntries.EntryRow> byLink(List<SuiteEntries.EntryRow> rows) {
        Map<String, SuiteEntries.EntryRow> out = new LinkedHashMap<>();
        rows.forEach(r -> out.putIfAbsent(r.link(), r));
        return out;
    }

    private static Map<String, String> byName(List<SuiteEntries.ProfileRow> rows) {
        Map<String, String> out = new LinkedHashMap<>();
        rows.forEach(r -> out.putIfAbsent(r.name(), String.join("; ", r.changes())));
        return out;
    }
}
