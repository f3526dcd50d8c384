package dev.driftlab.app.editor.web;

import dev.driftlab.scenario.GateMetric;
import dev.driftlab.scenario.GateRule;
import dev.driftlab.scenario.Problem;
import dev.driftlab.scenario.ScenarioFiles;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import tools.jackson.core.JacksonException;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;
import tools.jackson.databind.node.ArrayNode;
import tools.jackson.databind.node.ObjectNode;

/**
 * The gates form: one row per pass/fail gate plus an empty row for a new one. A row whose id is
 * cleared is dropped. Checked like the settings forms, by the scenario reader and validator.
 *
 * @param rows the rows as typed in
 */
public record GatesForm(List<Row> rows) {

    /** What each trial can be measured by, with the unit of its bound. */
    public static final Map<String, String> METRICS = metrics();

    private static final JsonMapper JSON = JsonMapper.builder().build();

    private static final Pattern GATE_PATH = Pattern.compile("^gates\\[(\\d+)]");

    /** Most gates the form offers (the file allows 50). */
    static final int MAX_ROWS = 50;

    /**
     * One gate as typed in.
     *
     * @param id gate id, empty to drop the row
     * @param metric metric word
     * @param bound limit in seconds or metres
     * @param share required share of passing trials, 0 to 1, empty for the default
     * @param judgedBy how the share is judged, empty for the default (observed share)
     */
    public record Row(String id, String metric, String bound, String share, String judgedBy) {}

    /**
     * The outcome of checking the form.
     *
     * @param messages messages per row number
     * @param gatesJson the gates as a file fragment, present only when they have no errors
     */
    public record Outcome(Map<Integer, String> messages, Optional<String> gatesJson) {}

    /** How a gate may be judged: file name to words. */
    public static final Map<String, String> RULES = rules();

    private static Map<String, String> metrics() {
        Map<String, String> m = new LinkedHashMap<>();
        for (GateMetric metric : GateMetric.values()) {
            m.put(metric.fileName(), metric.takesBound() ? metric.unit() : "no bound");
        }
        return m;
    }

    private static Map<String, String> rules() {
        Map<String, String> m = new LinkedHashMap<>();
        m.put(GateRule.OBSERVED_SHARE.fileName(), "observed share");
        m.put(GateRule.INTERVAL_LOWER_END.fileName(), "95 % interval's lower end");
        return m;
    }

    /** The gates of a document, plus one empty row. */
    static GatesForm fromDocument(String document) {
        List<Row> rows = new ArrayList<>();
        try {
            for (JsonNode g : JSON.readTree(document).path("gates")) {
                rows.add(new Row(
                        text(g, "id"), text(g, "metric"), text(g, "bound"), text(g, "share"), text(g, "judgedBy")));
            }
        } catch (JacksonException e) {
            // an unreadable document shows no gates; the live check reports the document itself
        }
        return new GatesForm(withBlank(rows));
    }

    /** The rows from request parameters {@code gate_N_id}, {@code gate_N_metric}, ... */
    static GatesForm fromRequest(Map<String, String> params) {
        List<Row> rows = new ArrayList<>();
        for (int i = 0; i < MAX_ROWS + 1; i++) {
            String id = params.get("gate_" + i + "_id");
            if (id == null) {
                break;
            }
            rows.add(new Row(
                    id.trim(),
                    params.getOrDefault("gate_" + i + "_metric", "").trim(),
                    params.getOrDefault("gate_" + i + "_bound", "").trim(),
                    params.getOrDefault("gate_" + i + "_share", "").trim(),
                    params.getOrDefault("gate_" + i + "_judgedBy", "").trim()));
        }
        return new GatesForm(rows);
    }

    private static List<Row> withBlank(List<Row> rows) {
        List<Row> out = new ArrayList<>(rows.subList(0, Math.min(rows.size(), MAX_ROWS)));
        if (out.size() < MAX_ROWS) {
            out.add(new Row("", GateMetric.RECOVERY_TIME.fileName(), "", "", ""));
        }
        return out;
    }

    private static String text(JsonNode g, String key) {
        JsonNode n = g.path(key);
        return n.isMissingNode() || n.isNull() ? "" : n.asString();
    }

    /** Checks the rows in the context of the document being edited. */
    Outcome check(String document) {
        Map<Integer, String> messages = new LinkedHashMap<>();
        JsonNode root;
        try {
            root = JSON.readTree(document);
        } catch (JacksonException e) {
            messages.put(0, "the scenario being edited could not be read; reload the editor");
            return new Outcome(messages, Optional.empty());
        }
        if (root == null || !root.isObject()) {
            messages.put(0, "the scenario being edited could not be read; reload the editor");
            return new Outcome(messages, Optional.empty());
        }
        ArrayNode gates = JSON.createArrayNode();
        List<Integer> rowOfGate = new ArrayList<>();
        for (int i = 0; i < rows.size(); i++) {
            Row r = rows.get(i);
            if (r.id().isEmpty()) {
                continue;
            }
            ObjectNode g = gates.addObject();
            g.put("id", r.id());
            g.put("metric", r.metric());
            if (!r.bound().isEmpty()) {
                number(g, "bound", r.bound(), i, messages);
            }
            if (!r.share().isEmpty()) {
                number(g, "share", r.share(), i, messages);
            }
            if (!r.judgedBy().isEmpty() && !r.judgedBy().equals(GateRule.OBSERVED_SHARE.fileName())) {
                g.put("judgedBy", r.judgedBy());
            }
            rowOfGate.add(i);
        }
        if (!messages.isEmpty()) {
            return new Outcome(messages, Optional.empty());
        }
        ((ObjectNode) root).set("gates", gates);
        boolean errors = false;
        for (Problem p :
                ScenarioFiles.check(JSON.writeValueAsString(root)).report().problems()) {
            if (!p.path().startsWith("gates")) {
                continue;
            }
            errors |= p.isError();
            int row = 0;
            Matcher m = GATE_PATH.matcher(p.path());
            if (m.find() && Integer.parseInt(m.group(1)) < rowOfGate.size()) {
                row = rowOfGate.get(Integer.parseInt(m.group(1)));
            }
            messages.merge(row, p.path() + ": " + p.message(), (a, b) -> a + "; " + b);
        }
        return new Outcome(messages, errors ? Optional.empty() : Optional.of(JSON.writeValueAsString(gates)));
    }

    private static void number(ObjectNode g, String key, String text, int row, Map<Integer, String> messages) {
        try {
            double d = Double.parseDouble(text);
            if (!Double.isFinite(d)) {
                throw new NumberFormatException();
            }
            g.put(key, d);
        } catch (NumberFormatException e) {
            String shown = text.length() > 40 ? text.substring(0, 40) + "..." : text;
            messages.merge(
                    row,
                    "gates row " + (row + 1) + " " + key + ": \"" + shown + "\" is not a number",
                    (a, b) -> a + "; " + b);
        }
    }
}
