package dev.driftlab.scenario;

import java.util.ArrayList;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Locale;
import java.util.Set;
import java.util.function.BiFunction;
import tools.jackson.databind.JsonNode;

/**
 * Reads one JSON object field by field, recording a problem with the field's path for every
 * missing, mistyped or unknown key instead of stopping at the first. Getters always return a value
 * (the default, or a harmless placeholder after a problem) so reading can go on.
 */
final class JsonFields {

    /** Longest name or id, in characters. */
    static final int MAX_NAME = 200;
    /** Longest free text, in characters. */
    static final int MAX_TEXT = 10_000;
    /** Longest list of anything in a scenario file. */
    static final int MAX_LIST = 10_000;

    private final JsonNode node;
    private final String path;
    private final List<Problem> problems;
    private final Set<String> known = new LinkedHashSet<>();

    private JsonFields(JsonNode node, String path, List<Problem> problems) {
        this.node = node;
        this.path = path;
        this.problems = problems;
    }

    /** Wraps a node expected to be an object; records a problem and reads as empty if it is not. */
    static JsonFields of(JsonNode node, String path, List<Problem> problems) {
        if (node == null || !node.isObject()) {
            problems.add(Problem.error(path, "must be an object { ... }, got " + describe(node)));
            return new JsonFields(null, path, problems);
        }
        return new JsonFields(node, path, problems);
    }

    String path() {
        return path;
    }

    String at(String key) {
        return path.isEmpty() ? key : path + "." + key;
    }

    boolean has(String key) {
        known.add(key);
        return node != null && node.get(key) != null && !node.get(key).isNull();
    }

    JsonNode raw(String key) {
        known.add(key);
        return node == null ? null : node.get(key);
    }

    double number(String key, double fallback) {
        return has(key) ? numberValue(raw(key), at(key)) : fallback;
    }

    double requiredNumber(String key) {
        if (!has(key)) {
            missing(key);
            return 0;
        }
        return numberValue(raw(key), at(key));
    }

    int integer(String key, int fallback) {
        return has(key) ? intValue(raw(key), at(key)) : fallback;
    }

    int requiredInteger(String key) {
        if (!has(key)) {
            missing(key);
            return 0;
        }
        return intValue(raw(key), at(key));
    }

    boolean bool(String key, boolean fallback) {
        if (!has(key)) {
            return fallback;
        }
        JsonNode v = raw(key);
        if (!v.isBoolean()) {
            problems.add(Problem.error(at(key), "must be true or false, got " + describe(v)));
            return fallback;
        }
        return v.booleanValue();
    }

    String text(String key, String fallback, int maxLength) {
        if (!has(key)) {
            return fallback;
        }
        return textValue(raw(key), at(key), maxLength);
    }

    String requiredText(String key, int maxLength) {
        if (!has(key)) {
            missing(key);
            return "";
        }
        return textValue(raw(key), at(key), maxLength);
    }

    <E extends Enum<E>> E choice(String key, Class<E> type, E fallback) {
        if (!has(key)) {
            return fallback;
        }
        return enumValue(raw(key), at(key), type, fallback);
    }

    <E extends Enum<E>> E requiredChoice(String key, Class<E> type, E placeholder) {
        if (!has(key)) {
            missing(key);
            return placeholder;
        }
        return enumValue(raw(key), at(key), type, placeholder);
    }

    /** Reads a list of items; a missing key reads as an empty list. */
    <T> List<T> list(String key, BiFunction<JsonNode, String, T> item) {
        if (!has(key)) {
            return List.of();
        }
        JsonNode v = raw(key);
        String p = at(key);
        if (!v.isArray()) {
            problems.add(Problem.error(p, "must be a list [ ... ], got " + describe(v)));
            return List.of();
        }
        if (v.size() > MAX_LIST) {
            problems.add(Problem.error(p, "has " + v.size() + " entries; at most " + MAX_LIST + " are allowed"));
            return List.of();
        }
        List<T> out = new ArrayList<>(v.size());
        for (int i = 0; i < v.size(); i++) {
            T t = item.apply(v.get(i), p + "[" + i + "]");
            if (t != null) {
                out.add(t);
            }
        }
        return out;
    }

    JsonFields object(String key) {
        if (!has(key)) {
            return new JsonFields(null, at(key), problems);
        }
        return of(raw(key), at(key), problems);
    }

    JsonFields requiredObject(String key) {
        if (!has(key)) {
            missing(key);
            return new JsonFields(null, at(key), problems);
        }
        return of(raw(key), at(key), problems);
    }

    void missing(String key) {
        problems.add(Problem.error(at(key), "is required"));
    }

    /** Reports every key that none of the getters asked for. Call after reading all fields. */
    void finish() {
        if (node == null) {
            return;
        }
        for (String name : node.propertyNames()) {
            if (!known.contains(name)) {
                problems.add(Problem.error(at(name), "unknown key; this object takes " + String.join(", ", known)));
            }
        }
    }

    double numberValue(JsonNode v, String p) {
        if (v == null || !v.isNumber()) {
            problems.add(Problem.error(p, "must be a number, got " + describe(v)));
            return 0;
        }
        double d = v.doubleValue(Double.NaN);
        if (!Double.isFinite(d)) {
            problems.add(Problem.error(p, "must be a finite number, got " + v));
            return 0;
        }
        return d;
    }

    int intValue(JsonNode v, String p) {
        double d = numberValue(v, p);
        if (d != Math.rint(d)) {
            problems.add(Problem.error(p, "must be a whole number, got " + v));
            return 0;
        }
        if (d > Integer.MAX_VALUE || d < Integer.MIN_VALUE) {
            problems.add(Problem.error(p, "is far too large: " + v));
            return 0;
        }
        return (int) d;
    }

    String textValue(JsonNode v, String p, int maxLength) {
        if (v == null || !v.isString()) {
            problems.add(Problem.error(p, "must be text in quotes, got " + describe(v)));
            return "";
        }
        String s = v.stringValue();
        if (s.length() > maxLength) {
            problems.add(Problem.error(p, "is " + s.length() + " characters long; at most " + maxLength + " allowed"));
            return s.substring(0, maxLength);
        }
        return s;
    }

    <E extends Enum<E>> E enumValue(JsonNode v, String p, Class<E> type, E fallback) {
        String s = v != null && v.isString() ? v.stringValue() : null;
        for (E e : type.getEnumConstants()) {
            if (fileName(e).equals(s)) {
                return e;
            }
        }
        List<String> names = new ArrayList<>();
        for (E e : type.getEnumConstants()) {
            names.add(fileName(e));
        }
        problems.add(Problem.error(p, "must be one of " + String.join(", ", names) + ", got " + describe(v)));
        return fallback;
    }

    /** How an enum constant is spelled in the file: lower case with hyphens. */
    static String fileName(Enum<?> e) {
        return e.name().toLowerCase(Locale.ROOT).replace('_', '-');
    }

    static String describe(JsonNode v) {
        if (v == null || v.isMissingNode()) {
            return "nothing";
        }
        if (v.isNull()) {
            return "null";
        }
        if (v.isObject()) {
            return "an object";
        }
        if (v.isArray()) {
            return "a list";
        }
        String s = v.toString();
        return s.length() > 40 ? s.substring(0, 40) + "..." : s;
    }
}
