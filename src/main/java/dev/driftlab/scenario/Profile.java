package dev.driftlab.scenario;

import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import tools.jackson.core.JacksonException;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.node.ObjectNode;

/**
 * A named set of changes to the robot, the rangefinder and the localizer settings, applied on top
 * of every scenario of a suite ("noisier rangefinder", "fewer particles"). Unlike a settings
 * variant, a profile may change the robot and the rangefinder, so it changes the simulated world:
 * it is applied to the scenario document and the result is read and validated as a scenario of its
 * own ({@link #apply}). The file format, {@code {"format": "driftlab-profile/1", "name": ...,
 * "robot": {...}, "rangefinder": {...}, "localizer": {...}}}, holds the changed keys only, at the
 * same paths as in a scenario file.
 */
public final class Profile {

    /** Name and version of a profile document. */
    public static final String FORMAT = "driftlab-profile/1";

    /** The parts of a scenario a profile may change. */
    public static final List<String> PARTS = List.of("robot", "rangefinder", "localizer");

    private final String name;
    private final String description;
    private final ObjectNode changes;

    private Profile(String name, String description, ObjectNode changes) {
        this.name = name;
        this.description = description;
        this.changes = changes;
    }

    /** The profile's name, the column heading of a suite report. */
    public String name() {
        return name;
    }

    /** What the profile is for, in words; may be empty. */
    public String description() {
        return description;
    }

    /** Every changed field by its path in a scenario file with its new value: {@code rangefinder.rangeSigma = 0.1}. */
    public List<String> changedFields() {
        List<String> out = new ArrayList<>();
        leaves(changes, "", out);
        return out;
    }

    /** The profile as a document that {@link #read} reads back equal. */
    public String toJson() {
        ObjectNode o = ScenarioJson.MAPPER.createObjectNode();
        o.put("format", FORMAT);
        o.put("name", name);
        if (!description.isEmpty()) {
            o.put("description", description);
        }
        o.setAll(changes.deepCopy());
        return ScenarioJson.MAPPER.writeValueAsString(o);
    }

    /**
     * Reads a profile document. Only the shape is checked here (format, name, the three parts as
     * objects, at least one change); whether each changed key exists and its value is allowed is
     * found when the profile is applied to a scenario.
     *
     * @throws ScenarioException with every problem found, each with its path in the file
     */
    public static Profile read(String json) {
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
        if (f.has("name") && name.isBlank()) {
            problems.add(Problem.error("name", "must not be blank"));
        }
        String description = f.text("description", "", JsonFields.MAX_TEXT);
        ObjectNode changes = ScenarioJson.MAPPER.createObjectNode();
        for (String part : PARTS) {
            JsonNode n = f.raw(part);
            if (n == null || n.isNull()) {
                continue;
            }
            if (!n.isObject()) {
                problems.add(Problem.error(part, "must be an object { ... }, got " + JsonFields.describe(n)));
            } else if (!n.isEmpty()) {
                changes.set(part, n.deepCopy());
            }
        }
        f.finish();
        if (problems.isEmpty() && changes.isEmpty()) {
            problems.add(
                    Problem.error("(document)", "changes nothing: give at least one of " + String.join(", ", PARTS)));
        }
        if (problems.stream().anyMatch(Problem::isError)) {
            throw new ScenarioException(problems);
        }
        return new Profile(name.strip(), description, changes);
    }

    /**
     * The scenario with this profile's changes merged into its robot, rangefinder and localizer
     * settings (objects merge key by key, anything else is replaced), read and validated. The
     * scenario's settings variants are left out: a suite runs each scenario's base settings only.
     *
     * <p>Problems the reader finds (an unknown key, a value of the wrong type) are the profile's
     * fault whatever the scenario, see {@link #formatProblems}; the validator's problems (a value out
     * of range, settings that contradict the scenario) are about this scenario under this profile.
     *
     * @return the outcome of reading and validating the changed document; never throws
     */
    public ScenarioFiles.Checked apply(Scenario scenario) {
        return ScenarioFiles.check(changedDocument(scenario));
    }

    /**
     * The problems of reading this profile's changes over the scenario, without validating: an
     * unknown key or a mistyped value, at its path in the profile file. Empty when the changes read.
     */
    public List<Problem> formatProblems(Scenario scenario) {
        try {
            ScenarioJson.read(changedDocument(scenario));
            return List.of();
        } catch (ScenarioException e) {
            return e.problems().stream().filter(Problem::isError).toList();
        }
    }

    private String changedDocument(Scenario scenario) {
        ObjectNode doc = ScenarioWriter.scenario(scenario);
        doc.remove("variants");
        for (Map.Entry<String, JsonNode> e : changes.properties()) {
            doc.set(e.getKey(), SettingsMerge.merge(doc.get(e.getKey()), e.getValue()));
        }
        return ScenarioJson.MAPPER.writeValueAsString(doc);
    }

    private static void leaves(JsonNode n, String path, List<String> out) {
        if (n.isObject()) {
            for (Map.Entry<String, JsonNode> e : n.properties()) {
                leaves(e.getValue(), path.isEmpty() ? e.getKey() : path + "." + e.getKey(), out);
            }
        } else {
            out.add(path + " = " + n);
        }
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof Profile p
                && p.name.equals(name)
                && p.description.equals(description)
                && p.changes.equals(changes);
    }

    @Override
    public int hashCode() {
        return name.hashCode() * 31 + changes.hashCode();
    }

    @Override
    public String toString() {
        return "profile " + name + " " + changedFields();
    }
}
