package dev.driftlab.scenario;

import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.OptionalInt;
import java.util.Set;
import tools.jackson.core.JacksonException;
import tools.jackson.databind.JsonNode;

/**
 * A suite document: a named list of scenario files, each with how many seeds it runs, and the
 * profile files run on top of every one of them. File names are as written in the document
 * (relative to the document's folder); reading the files is the caller's job.
 *
 * <pre>{@code
 * {"format": "driftlab-suite/1", "name": "Every site", "seeds": 10,
 *  "scenarios": [{"file": "ward.json"}, {"file": "hall.json", "seeds": 20}],
 *  "profiles": ["noisier-rangefinder.profile.json"]}
 * }</pre>
 *
 * @param name the suite's name
 * @param description what the suite is for; may be empty
 * @param seeds seeds per scenario where an entry sets none
 * @param scenarios the scenarios, in report order
 * @param profiles profile files, in column order
 */
public record SuiteFile(String name, String description, int seeds, List<Entry> scenarios, List<String> profiles) {

    /** Name and version of a suite document. */
    public static final String FORMAT = "driftlab-suite/1";

    /** Seeds per scenario when neither the suite nor the entry says. */
    public static final int DEFAULT_SEEDS = 20;

    /** Most seeds a scenario may run in one suite. */
    public static final int MAX_SEEDS = 100_000;

    /** Most scenarios in one suite. */
    public static final int MAX_SCENARIOS = 1_000;

    /** Most profiles in one suite. */
    public static final int MAX_PROFILES = 20;

    /**
     * One scenario of the suite.
     *
     * @param file the scenario file, relative to the suite document's folder
     * @param seeds seeds it runs, when the entry sets them
     */
    public record Entry(String file, OptionalInt seeds) {
        /** Checks presence. */
        public Entry {
            Checks.present(file, "file");
            Checks.present(seeds, "seeds");
        }

        /** The entry's seeds, else the suite's. */
        public int seedsOr(int suiteSeeds) {
            return seeds.orElse(suiteSeeds);
        }
    }

    /** Copies the lists. */
    public SuiteFile {
        Checks.present(name, "name");
        Checks.present(description, "description");
        scenarios = List.copyOf(scenarios);
        profiles = List.copyOf(profiles);
    }

    /**
     * Reads a suite document.
     *
     * @throws ScenarioException with every problem found, each with its path in the file: a
     *     missing or empty scenario list, a scenario listed twice, seeds out of range, unknown keys
     */
    public static SuiteFile read(String json) {
        JsonNode root;
        try {
            root = ScenarioJson.MAPPER.readTree(json == null ? "" : json);
        } catch (JacksonException e) {
            throw new ScenarioException(List.of(Problem.error("(document)", JsonTrouble.describe(e))));
        }
        if (root == null || root.isMissingNode()) {
            throw new ScenarioException(List.of(Problem.error("(document)", "is empty")));
        }
        List<Problem> problems = new ArrayList<>();
        JsonFields f = JsonFields.of(root, "", problems);
        String format = f.requiredText("format", JsonFields.MAX_NAME);
        if (f.has("format") && !format.equals(FORMAT)) {
            problems.add(Problem.error("format", "must be \"" + FORMAT + "\", got \"" + format + "\""));
        }
        String name = f.requiredText("name", JsonFields.MAX_NAME);
        String description = f.text("description", "", JsonFields.MAX_TEXT);
        int seeds = seeds(f, "seeds", DEFAULT_SEEDS, problems);
        List<Entry> entries = f.list("scenarios", (n, p) -> entry(n, p, problems));
        if (!f.has("scenarios")) {
            f.missing("scenarios");
        } else if (entries.isEmpty() && problems.isEmpty()) {
            problems.add(Problem.error("scenarios", "is empty: a suite needs at least one scenario"));
        } else if (entries.size() > MAX_SCENARIOS) {
            problems.add(Problem.error("scenarios", "has " + entries.size() + " entries; at most " + MAX_SCENARIOS));
        }
        Set<String> seen = new HashSet<>();
        for (int i = 0; i < entries.size(); i++) {
            if (!seen.add(entries.get(i).file())) {
                problems.add(Problem.error(
                        "scenarios[" + i + "].file", "lists \"" + entries.get(i).file() + "\" a second time"));
            }
        }
        List<String> profiles = f.list("profiles", (n, p) -> {
            if (n == null || !n.isString() || n.stringValue().isBlank()) {
                problems.add(Problem.error(p, "must be a profile file name, got " + JsonFields.describe(n)));
                return null;
            }
            return n.stringValue();
        });
        if (profiles.size() > MAX_PROFILES) {
            problems.add(Problem.error("profiles", "has " + profiles.size() + " entries; at most " + MAX_PROFILES));
        }
        f.finish();
        if (problems.stream().anyMatch(Problem::isError)) {
            throw new ScenarioException(problems);
        }
        return new SuiteFile(name, description, seeds, entries, profiles);
    }

    private static Entry entry(JsonNode n, String p, List<Problem> problems) {
        JsonFields f = JsonFields.of(n, p, problems);
        String file = f.requiredText("file", JsonFields.MAX_TEXT);
        if (f.has("file") && file.isBlank()) {
            problems.add(Problem.error(f.at("file"), "must name a scenario file"));
        }
        OptionalInt seeds = f.has("seeds") ? OptionalInt.of(seeds(f, "seeds", 1, problems)) : OptionalInt.empty();
        f.finish();
        return new Entry(file, seeds);
    }

    private static int seeds(JsonFields f, String key, int fallback, List<Problem> problems) {
        int n = f.integer(key, fallback);
        if (n < 1 || n > MAX_SEEDS) {
            problems.add(Problem.error(f.at(key), "must be from 1 to " + MAX_SEEDS + ", got " + n));
            return fallback;
        }
        return n;
    }
}
