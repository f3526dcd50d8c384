package dev.driftlab.scenario;

import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;
import tools.jackson.databind.node.ArrayNode;
import tools.jackson.databind.node.ObjectNode;

/** Edits a scenario document by path ({@code site.doors[0].width}) for tests of messages and paths. */
final class Docs {

    private static final JsonMapper MAPPER = JsonMapper.builder().build();

    private final ObjectNode root;

    private Docs(String json) {
        this.root = (ObjectNode) MAPPER.readTree(json);
    }

    static Docs of(String json) {
        return new Docs(json);
    }

    static Docs corridor() {
        return new Docs(Scenarios.corridor().json());
    }

    /** Sets the value at a path; the value is parsed as JSON ({@code "1.6"}, {@code "\"open\""}). */
    Docs set(String path, String jsonValue) {
        JsonNode value = MAPPER.readTree(jsonValue);
        int dot = lastSeparator(path);
        JsonNode parent = dot < 0 ? root : resolve(path.substring(0, dot));
        String last = path.substring(dot + 1);
        if (last.endsWith("]")) {
            int open = last.indexOf('[');
            ArrayNode arr = (ArrayNode) parent.get(last.substring(0, open));
            arr.set(Integer.parseInt(last.substring(open + 1, last.length() - 1)), value);
        } else {
            ((ObjectNode) parent).set(last, value);
        }
        return this;
    }

    /** Adds an empty object at a path of objects unless something is there already. */
    Docs ensureObject(String path) {
        int dot = lastSeparator(path);
        JsonNode parent = dot < 0 ? root : resolve(path.substring(0, dot));
        String last = path.substring(dot + 1);
        if (!parent.has(last)) {
            ((ObjectNode) parent).putObject(last);
        }
        return this;
    }

    /** Removes the key at a path. */
    Docs remove(String path) {
        int dot = lastSeparator(path);
        JsonNode parent = dot < 0 ? root : resolve(path.substring(0, dot));
        ((ObjectNode) parent).remove(path.substring(dot + 1));
        return this;
    }

    String json() {
        return root.toString();
    }

    private static int lastSeparator(String path) {
        return path.lastIndexOf('.');
    }

    private JsonNode resolve(String path) {
        JsonNode n = root;
        for (String part : path.split("\\.")) {
            int open = part.indexOf('[');
            if (open < 0) {
                n = n.get(part);
            } else {
                n = n.get(part.substring(0, open));
                for (String idx : part.substring(open + 1, part.length() - 1).split("\\]\\[")) {
                    n = n.get(Integer.parseInt(idx));
                }
            }
        }
        return n;
    }
}
