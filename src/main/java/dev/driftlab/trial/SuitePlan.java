package dev.driftlab.trial;

import dev.driftlab.scenario.Problem;
import dev.driftlab.scenario.Profile;
import dev.driftlab.scenario.Scenario;
import dev.driftlab.scenario.ScenarioException;
import dev.driftlab.scenario.ScenarioFiles;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Optional;
import java.util.Set;

/**
 * What a suite run will do: for every scenario, the scenario as it is and the scenario under each
 * profile (or, where a profile makes it invalid, the validator's problems instead), all on the
 * scenario's seeds. Building the plan runs nothing, so bad input is refused before any trial.
 *
 * @param profiles the profiles, in column order
 * @param rows one per scenario, in suite order
 */
public record SuitePlan(List<Profile> profiles, List<Row> rows) {

    /** Name of the column of scenarios as they are, before every profile's column. */
    public static final String AS_IS = "as is";

    /**
     * One scenario of the suite.
     *
     * @param name the scenario's name in the suite (its own name; made unique with its source)
     * @param source where it came from (file name, or scenario and revision)
     * @param scenario the scenario as it is
     * @param seeds the seeds every column of this scenario runs
     */
    public record Entry(String name, String source, Scenario scenario, long[] seeds) {
        /** Copies the seeds. */
        public Entry {
            if (seeds.length == 0) {
                throw new IllegalArgumentException("scenario " + name + " needs at least one seed");
            }
            seeds = seeds.clone();
        }

        @Override
        public long[] seeds() {
            return seeds.clone();
        }
    }

    /**
     * One column of a row: the scenario to run, or the problems that keep it from running.
     *
     * @param name {@link #AS_IS} or the profile's name
     * @param scenario the scenario to run, empty when invalid
     * @param problems the validator's errors and warnings under the profile (errors only when invalid)
     */
    public record Cell(String name, Optional<Scenario> scenario, List<Problem> problems) {
        /** Copies the list. */
        public Cell {
            problems = List.copyOf(problems);
        }

        /** Whether the profile makes the scenario invalid, so this cell does not run. */
        public boolean invalid() {
            return scenario.isEmpty();
        }
    }

    /**
     * A scenario and its cells.
     *
     * @param entry the scenario
     * @param cells as it is, then one per profile
     */
    public record Row(Entry entry, List<Cell> cells) {
        /** Copies the list. */
        public Row {
            cells = List.copyOf(cells);
        }
    }

    /** Copies the lists. */
    public SuitePlan {
        profiles = List.copyOf(profiles);
        rows = List.copyOf(rows);
    }

    /** Column names: {@link #AS_IS}, then the profiles' names. */
    public List<String> columns() {
        List<String> out = new ArrayList<>();
        out.add(AS_IS);
        profiles.forEach(p -> out.add(p.name()));
        return out;
    }

    /** Trials the plan runs: seeds of every cell that is not invalid. */
    public int trials() {
        int n = 0;
        for (Row r : rows) {
            n += r.entry().seeds.length
                    * (int) r.cells().stream().filter(c -> !c.invalid()).count();
        }
        return n;
    }

    /**
     * Applies every profile to every scenario.
     *
     * @param entries the scenarios, each valid as it is
     * @param profiles the profiles
     * @throws ScenarioException when the suite is empty, two scenarios or profiles share a name, or
     *     a profile sets a field that does not exist or gives a value of the wrong type; each
     *     problem's path starts with {@code profile "NAME": } and names the field as in the file
     */
    public static SuitePlan of(List<Entry> entries, List<Profile> profiles) {
        List<Problem> problems = new ArrayList<>();
        if (entries.isEmpty()) {
            problems.add(Problem.error("scenarios", "is empty: a suite needs at least one scenario"));
        }
        Set<String> names = new HashSet<>();
        for (Entry e : entries) {
            if (!names.add(e.name())) {
                problems.add(Problem.error("scenarios", "two scenarios are named \"" + e.name() + "\""));
            }
        }
        Set<String> columns = new HashSet<>(Set.of(AS_IS));
        for (Profile p : profiles) {
            if (!columns.add(p.name())) {
                problems.add(Problem.error(
                        "profile \"" + p.name() + "\"",
                        p.name().equals(AS_IS)
                                ? "is named like the column of scenarios as they are; choose another name"
                                : "is given twice (profile names must differ)"));
            }
        }
        // a key that does not exist is the profile's fault whatever the scenario: report it once
        if (!entries.isEmpty()) {
            for (Profile p : profiles) {
                for (Problem x : p.formatProblems(entries.get(0).scenario())) {
                    problems.add(Problem.error("profile \"" + p.name() + "\": " + x.path(), x.message()));
                }
            }
        }
        if (!problems.isEmpty()) {
            throw new ScenarioException(problems);
        }
        List<Row> rows = new ArrayList<>();
        for (Entry e : entries) {
            List<Cell> cells = new ArrayList<>();
            cells.add(new Cell(AS_IS, Optional.of(e.scenario()), List.of()));
            for (Profile p : profiles) {
                ScenarioFiles.Checked checked = p.apply(e.scenario());
                cells.add(
                        checked.ok()
                                ? new Cell(
                                        p.name(),
                                        checked.scenario(),
                                        checked.report().problems())
                                : new Cell(
                                        p.name(),
                                        Optional.empty(),
                                        checked.report().errors()));
            }
            rows.add(new Row(e, cells));
        }
        return new SuitePlan(profiles, rows);
    }
}
