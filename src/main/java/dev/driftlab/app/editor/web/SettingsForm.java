package dev.driftlab.app.editor.web;

import dev.driftlab.scenario.Problem;
import dev.driftlab.scenario.ScenarioFiles;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import tools.jackson.core.JacksonException;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;
import tools.jackson.databind.node.ObjectNode;

/**
 * The data of one settings form as typed in, by input name. It is converted to core types by
 * placing the values into the document being edited and reading that through the scenario reader
 * and validator, so the form and a saved file can never disagree about what is allowed.
 *
 * @param section which form
 * @param values text of each input, by input name
 */
public record SettingsForm(SettingsSection section, Map<String, String> values) {

    private static final JsonMapper JSON = JsonMapper.builder().build();

    /**
     * The outcome of checking a form against the document.
     *
     * @param messages a message per input name; empty when the section is fine
     * @param general messages that belong to no single input
     * @param sectionJson the section as a file fragment, present only when it has no errors
     */
    public record Outcome(Map<String, String> messages, List<String> general, Optional<String> sectionJson) {}

    /** The form's values as they stand in a document (empty text where a key is absent). */
    static SettingsForm fromDocument(SettingsSection section, String document) {
        Map<String, String> values = new LinkedHashMap<>();
        JsonNode root = parse(document).orElse(JSON.createObjectNode());
        JsonNode sec = root.path(section.key());
        for (SettingsSection.Field f : section.fields()) {
            values.put(f.inputName(), read(sec, f));
        }
        return new SettingsForm(section, values);
    }

    /** The form's values from request parameters; a missing input means "the default". */
    static SettingsForm fromRequest(SettingsSection section, Map<String, String> params) {
        Map<String, String> values = new LinkedHashMap<>();
        for (SettingsSection.Field f : section.fields()) {
            values.put(f.inputName(), params.getOrDefault(f.inputName(), "").trim());
        }
        return new SettingsForm(section, values);
    }

    /** Text of an input. */
    public String value(String inputName) {
        return values.getOrDefault(inputName, "");
    }

    /** Checks the form in the context of the document being edited. */
    Outcome check(String document) {
        Map<String, String> messages = new LinkedHashMap<>();
        List<String> general = new ArrayList<>();
        Optional<JsonNode> parsed = parse(document);
        if (parsed.isEmpty() || !parsed.get().isObject()) {
            general.add("the scenario being edited could not be read; reload the editor");
            return new Outcome(messages, general, Optional.empty());
        }
        ObjectNode root = (ObjectNode) parsed.get();
        ObjectNode sec = root.path(section.key()).isObject()
                ? (ObjectNode) root.get(section.key())
                : root.putObject(section.key());
        for (SettingsSection.Field f : section.fields()) {
            place(sec, f, value(f.inputName()), section.key() + "." + f.key(), f.inputName(), messages);
        }
        if (!messages.isEmpty()) {
            return new Outcome(messages, general, Optional.empty());
        }
        ScenarioFiles.Checked checked = ScenarioFiles.check(JSON.writeValueAsString(root));
        boolean errors = false;
        for (Problem p : checked.report().problems()) {
            if (!p.path().equals(section.key()) && !p.path().startsWith(section.key() + ".")) {
                continue;
            }
            errors |= p.isError();
            String text = p.path() + ": " + p.message();
            Optional<SettingsSection.Field> field = section.fields().stream()
                    .filter(f -> p.path().equals(section.key() + "." + f.key()))
                    .findFirst();
            if (field.isPresent()) {
                messages.merge(field.get().inputName(), text, (a, b) -> a + "; " + b);
            } else {
                general.add(text);
            }
        }
        return new Outcome(messages, general, errors ? Optional.empty() : Optional.of(JSON.writeValueAsString(sec)));
    }

    /**
     * Writes one input into a section object of the file, at the field's key path: left out when
     * empty (the default, or for a variant the base value), else converted by the field's kind. A
     * conversion problem goes into {@code messages} under {@code messageKey}, naming {@code path}.
     */
    static void place(
            ObjectNode section,
            SettingsSection.Field f,
            String text,
            String path,
            String messageKey,
            Map<String, String> messages) {
        String[] parts = f.key().split("\\.");
        ObjectNode parent = section;
        for (int i = 0; i < parts.length - 1; i++) {
            parent = parent.path(parts[i]).isObject() ? (ObjectNode) parent.get(parts[i]) : parent.putObject(parts[i]);
        }
        String leaf = parts[parts.length - 1];
        if (text.isEmpty()) {
            parent.remove(leaf);
            return;
        }
        switch (f.kind()) {
            // a flag is yes, no or the default: a plain checkbox could not tell "off" from
            // "not set", and some defaults (injection) are on
            case FLAG -> {
                if (text.equals("true") || text.equals("false")) {
                    parent.put(leaf, Boolean.parseBoolean(text));
                } else {
                    messages.put(messageKey, path + ": choose yes, no or the default");
                }
            }
            case CHOICE -> {
                if (f.choices().contains(text)) {
                    parent.put(leaf, text);
                } else {
                    messages.put(messageKey, path + ": choose one of " + String.join(", ", f.choices()));
                }
            }
            case INTEGER -> {
                try {
                    parent.put(leaf, Long.parseLong(text));
                } catch (NumberFormatException e) {
                    messages.put(messageKey, path + ": " + quote(text) + " is not a whole number");
                }
            }
            case NUMBER -> {
                try {
                    double d = Double.parseDouble(text);
                    if (!Double.isFinite(d)) {
                        throw new NumberFormatException();
                    }
                    parent.put(leaf, d);
                } catch (NumberFormatException e) {
                    messages.put(messageKey, path + ": " + quote(text) + " is not a number");
                }
            }
        }
    }

    /** The text of a field in a section object of the file, empty when the key is absent. */
    static String read(JsonNode section, SettingsSection.Field f) {
        JsonNode n = section;
        for (String part : f.key().split("\\.")) {
            n = n.path(part);
        }
        return n.isMissingNode() || n.isNull() ? "" : n.asString();
    }

    private static String quote(String text) {
        String shown = text.length() > 40 ? text.substring(0, 40) + "..." : text;
        return "\"" + shown + "\"";
    }

    static Optional<JsonNode> parse(String document) {
        try {
            return Optional.ofNullable(JSON.readTree(document));
        } catch (JacksonException e) {
            return Optional.empty();
        }
    }
}
