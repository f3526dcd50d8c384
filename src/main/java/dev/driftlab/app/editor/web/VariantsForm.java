package dev.driftlab.app.editor.web;

import dev.driftlab.scenario.Limits;
import dev.driftlab.scenario.Problem;
import dev.driftlab.scenario.ScenarioFiles;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;
import tools.jackson.databind.node.ArrayNode;
import tools.jackson.databind.node.ObjectNode;

/**
 * The settings variants form: one block per variant (a name and the localizer settings it changes;
 * an empty input keeps the base value) plus an empty block for a new one. A block whose name is
 * cleared is dropped. Checked like the other settings forms, by the scenario reader and validator,
 * with each message placed beside the input it is about.
 *
 * @param rows the variants as typed in
 */
public record VariantsForm(List<Row> rows) {

    private static final JsonMapper JSON = JsonMapper.builder().build();

    private static final Pattern VARIANT_PATH = Pattern.compile("^variants\\[(\\d+)](.*)$");

    private static final String LOCALIZER = ".localizer.";

    /**
     * One variant as typed in.
     *
     * @param name variant name, empty to drop it
     * @param values text of each localizer input, by the input name of {@link SettingsSection#LOCALIZER}
     */
    public record Row(String name, Map<String, String> values) {

        /** Text of an input, empty when it keeps the base value. */
        public String value(String inputName) {
            return values.getOrDefault(inputName, "");
        }
    }

    /**
     * The outcome of checking the form.
     *
     * @param messages messages by input name ({@link #inputName}); {@code variant_N} holds those
     *     about the variant as a whole
     * @param variantsJson the variants as a file fragment, present only when they have no errors
     */
    public record Outcome(Map<String, String> messages, Optional<String> variantsJson) {

        /** No messages, nothing taken over: how the form first shows. */
        static Outcome none() {
            return new Outcome(Map.of(), Optional.empty());
        }
    }

    /** The HTML name of a variant's input: {@code variant_N_name} or {@code variant_N_<field>}. */
    public static String inputName(int row, String part) {
        return "variant_" + row + "_" + part;
    }

    /** The localizer inputs a variant can change. */
    public List<SettingsSection.Field> fields() {
        return SettingsSection.LOCALIZER.fields();
    }

    /** The variants of a document, plus one empty block while there is room for another. */
    static VariantsForm fromDocument(String document) {
        List<Row> rows = new ArrayList<>();
        JsonNode root = SettingsForm.parse(document).orElse(JSON.createObjectNode());
        for (JsonNode v : root.path("variants")) {
            Map<String, String> values = new LinkedHashMap<>();
            for (SettingsSection.Field f : SettingsSection.LOCALIZER.fields()) {
                values.put(f.inputName(), SettingsForm.read(v.path("localizer"), f));
            }
            JsonNode name = v.path("name");
            rows.add(new Row(name.isMissingNode() || name.isNull() ? "" : name.asString(), values));
        }
        if (rows.size() < Limits.MAX_VARIANTS) {
            rows.add(new Row("", Map.of()));
        }
        return new VariantsForm(rows);
    }

    /** The variants from request parameters {@code variant_N_name}, {@code variant_N_<field>}. */
    static VariantsForm fromRequest(Map<String, String> params) {
        List<Row> rows = new ArrayList<>();
        for (int i = 0; i <= Limits.MAX_VARIANTS; i++) {
            String name = params.get(inputName(i, "name"));
            if (name == null) {
                break;
            }
            Map<String, String> values = new LinkedHashMap<>();
            for (SettingsSection.Field f : SettingsSection.LOCALIZER.fields()) {
                values.put(
                        f.inputName(),
                        params.getOrDefault(inputName(i, f.inputName()), "").trim());
            }
            rows.add(new Row(name.trim(), values));
        }
        return new VariantsForm(rows);
    }

    /**
     * Checks the variants in the context of the document being edited. A variant keeps whatever
     * its file object holds beyond the form's inputs.
     */
    Outcome check(String document) {
        Map<String, String> messages = new LinkedHashMap<>();
        Optional<JsonNode> parsed = SettingsForm.parse(document);
        if (parsed.isEmpty() || !parsed.get().isObject()) {
            messages.put("variant_0", "the scenario being edited could not be read; reload the editor");
            return new Outcome(messages, Optional.empty());
        }
        ObjectNode root = (ObjectNode) parsed.get();
        JsonNode before = root.path("variants");
        ArrayNode variants = JSON.createArrayNode();
        List<Integer> rowOfVariant = new ArrayList<>();
        for (int i = 0; i < rows.size(); i++) {
            Row r = rows.get(i);
            if (r.name().isEmpty()) {
                continue;
            }
            ObjectNode v =
                    before.path(i).isObject() ? ((ObjectNode) before.get(i)).deepCopy() : JSON.createObjectNode();
            v.put("name", r.name());
            ObjectNode localizer =
                    v.path("localizer").isObject() ? (ObjectNode) v.get("localizer") : v.putObject("localizer");
            String path = "variants[" + variants.size() + "].localizer.";
            for (SettingsSection.Field f : SettingsSection.LOCALIZER.fields()) {
                SettingsForm.place(
                        localizer, f, r.value(f.inputName()), path + f.key(), inputName(i, f.inputName()), messages);
            }
            dropEmpty(localizer);
            if (localizer.isEmpty()) {
                v.remove("localizer");
            }
            variants.add(v);
            rowOfVariant.add(i);
        }
        if (!messages.isEmpty()) {
            return new Outcome(messages, Optional.empty());
        }
        root.set("variants", variants);
        boolean errors = false;
        for (Problem p :
                ScenarioFiles.check(JSON.writeValueAsString(root)).report().problems()) {
            Matcher m = VARIANT_PATH.matcher(p.path());
            if (!p.path().startsWith("variants")) {
                continue;
            }
            errors |= p.isError();
            String key = "variant_0";
            if (m.matches() && Integer.parseInt(m.group(1)) < rowOfVariant.size()) {
                int row = rowOfVariant.get(Integer.parseInt(m.group(1)));
                key = keyFor(row, m.group(2));
            }
            messages.merge(key, p.path() + ": " + p.message(), (a, b) -> a + "; " + b);
        }
        return new Outcome(messages, errors ? Optional.empty() : Optional.of(JSON.writeValueAsString(variants)));
    }

    /** The input a problem at {@code rest} (the path after {@code variants[N]}) belongs beside. */
    private static String keyFor(int row, String rest) {
        if (rest.equals(".name")) {
            return inputName(row, "name");
        }
        if (rest.startsWith(LOCALIZER)) {
            String key = rest.substring(LOCALIZER.length());
            for (SettingsSection.Field f : SettingsSection.LOCALIZER.fields()) {
                if (f.key().equals(key)) {
                    return inputName(row, f.inputName());
                }
            }
        }
        return "variant_" + row;
    }

    /** Removes objects left empty once their inputs were cleared, so the file stays tidy. */
    private static void dropEmpty(ObjectNode node) {
        List<String> empty = new ArrayList<>();
        for (Map.Entry<String, JsonNode> e : node.properties()) {
            if (e.getValue() instanceof ObjectNode child) {
                dropEmpty(child);
                if (child.isEmpty()) {
                    empty.add(e.getKey());
                }
            }
        }
        empty.forEach(node::remove);
    }
}
