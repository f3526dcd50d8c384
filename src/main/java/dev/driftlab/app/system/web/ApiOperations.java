package dev.driftlab.app.system.web;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import tools.jackson.databind.JsonNode;

/**
 * The operations of an OpenAPI document, grouped by tag, as the API page lists them: method, path,
 * summary, parameters and answers. Only what a reader needs to find an operation; the document
 * itself stays the reference.
 *
 * @param title the document's title
 * @param version the API's version
 * @param description the document's description, its Markdown emphasis removed
 * @param groups the operations by tag, tags in the document's order
 */
record ApiOperations(String title, String version, String description, List<Group> groups) {

    /** HTTP methods in the order an OpenAPI path item lists them. */
    private static final List<String> METHODS = List.of("get", "put", "post", "delete", "options", "head", "patch");

    /** The operations under one tag. */
    record Group(String name, String description, List<Operation> operations) {}

    /**
     * One operation.
     *
     * @param method upper-case HTTP method
     * @param path the path, with its {@code {placeholders}}
     * @param summary what it does
     * @param parameters each as "name (in)" plus ", required" when required
     * @param answers the response codes with their descriptions ("200 OK")
     */
    record Operation(String method, String path, String summary, List<String> parameters, List<String> answers) {

        /** An id for the page's anchors: method and path in letters, digits and hyphens. */
        public String anchor() {
            return (method + path).toLowerCase(java.util.Locale.ROOT).replaceAll("[^a-z0-9]+", "-");
        }
    }

    /** The operations of an OpenAPI 3 document. */
    static ApiOperations of(JsonNode doc) {
        JsonNode info = doc.path("info");
        Map<String, String> tagText = new LinkedHashMap<>();
        for (JsonNode t : doc.path("tags")) {
            tagText.put(t.path("name").asString(""), t.path("description").asString(""));
        }
        Map<String, List<Operation>> byTag = new LinkedHashMap<>();
        tagText.keySet().forEach(t -> byTag.put(t, new ArrayList<>()));
        for (Map.Entry<String, JsonNode> path : doc.path("paths").properties()) {
            for (String method : METHODS) {
                JsonNode op = path.getValue().path(method);
                if (!op.isObject()) {
                    continue;
                }
                List<String> parameters = new ArrayList<>();
                for (JsonNode p : op.path("parameters")) {
                    parameters.add(
                            p.path("name").asString("") + " (" + p.path("in").asString("") + ")"
                                    + (p.path("required").asBoolean(false) ? ", required" : ""));
                }
                if (op.has("requestBody")) {
                    parameters.add("request body"
                            + (op.path("requestBody").path("required").asBoolean(false) ? ", required" : ""));
                }
                List<String> answers = new ArrayList<>();
                for (Map.Entry<String, JsonNode> r : op.path("responses").properties()) {
                    answers.add(
                            (r.getKey() + " " + r.getValue().path("description").asString("")).strip());
                }
                String tag = op.path("tags").path(0).asString("Other");
                byTag.computeIfAbsent(tag, t -> new ArrayList<>())
                        .add(new Operation(
                                method.toUpperCase(java.util.Locale.ROOT),
                                path.getKey(),
                                op.path("summary").asString(""),
                                parameters,
                                answers));
            }
        }
        List<Group> groups = new ArrayList<>();
        byTag.forEach((tag, ops) -> {
            if (!ops.isEmpty()) {
                groups.add(new Group(tag, tagText.getOrDefault(tag, ""), ops));
            }
        });
        return new ApiOperations(
                info.path("title").asString(""),
                info.path("version").asString(""),
                info.path("description").asString("").replace("**", ""),
                groups);
    }

    /** The number of operations on the page. */
    public int count() {
        return groups.stream().mapToInt(g -> g.operations().size()).sum();
    }
}
