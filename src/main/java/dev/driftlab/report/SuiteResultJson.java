package dev.driftlab.report;

import dev.driftlab.evaluation.BatchSummary;
import dev.driftlab.evaluation.GateChange;
import dev.driftlab.evaluation.GateTally;
import dev.driftlab.evaluation.GateVerdict;
import dev.driftlab.evaluation.Gates;
import dev.driftlab.evaluation.PairedComparison;
import dev.driftlab.evaluation.TrialOutcome;
import dev.driftlab.scenario.Gate;
import dev.driftlab.scenario.Problem;
import dev.driftlab.scenario.Profile;
import dev.driftlab.scenario.Scenario;
import dev.driftlab.scenario.ScenarioException;
import dev.driftlab.trial.SuitePlan;
import dev.driftlab.trial.SuiteResult;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import tools.jackson.core.JacksonException;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.SerializationFeature;
import tools.jackson.databind.json.JsonMapper;
import tools.jackson.databind.node.ArrayNode;
import tools.jackson.databind.node.ObjectNode;

/**
 * The machine-readable result of a suite run ({@code "format": "driftlab-suite-result/1"}). Per
 * scenario and column (the scenario as it is, then each profile): whether it ran or the profile
 * made it invalid (with the validator's problems), each gate's verdict with every trial's mark
 * (seed, exercised, passed) so that a later run can pair with it seed by seed, and every trial in
 * the form of {@link ResultJson#trialNode}. Also the changes against the baseline and against the
 * scenarios as they are, and the history of passing shares that a later run's trend continues.
 * Shares are fractions 0 to 1; a missing figure is {@code null}.
 */
public final class SuiteResultJson {

    /** Value of the {@code format} key. */
    public static final String FORMAT = "driftlab-suite-result/1";

    private static final JsonMapper MAPPER =
            JsonMapper.builder().enable(SerializationFeature.INDENT_OUTPUT).build();

    private SuiteResultJson() {}

    /** The document as text. */
    public static String render(SuiteReport r) {
        return MAPPER.writeValueAsString(tree(r));
    }

    /** The document as a tree. */
    public static ObjectNode tree(SuiteReport r) {
        SuiteResult res = r.result();
        ObjectNode o = MAPPER.createObjectNode();
        o.put("format", FORMAT);
        o.put("suite", r.name());
        o.put("description", r.description());
        o.put("source", r.source());
        o.put("generatedAt", r.generatedAt());
        o.put("localizer", r.localizer());
        o.put("passed", r.passed());
        o.put("verdict", r.verdict().fileName());
        o.put("cancelled", res.cancelled());
        o.put("trialsPlanned", res.planned());
        o.put("trialsFinished", res.finished());
        o.put("gatesPlanned", res.gatesPlanned());
        o.put("gatesPassing", res.gatesPassing());
        o.put("seconds", Math.round(res.seconds() * 1000) / 1000.0);
        o.put("caution", Report.CAUTION);
        ArrayNode columns = o.putArray("columns");
        res.plan().columns().forEach(columns::add);
        ArrayNode profiles = o.putArray("profiles");
        for (Profile p : res.plan().profiles()) {
            ObjectNode pn = profiles.addObject();
            pn.put("name", p.name());
            pn.put("description", p.description());
            ArrayNode ch = pn.putArray("changes");
            p.changedFields().forEach(ch::add);
        }
        ArrayNode scenarios = o.putArray("scenarios");
        for (SuiteResult.Row row : res.rows()) {
            scenarios.add(scenario(row));
        }
        r.baseline()
                .ifPresentOrElse(
                        b -> {
                            ObjectNode bn = o.putObject("baseline");
                            bn.put("suite", b.suite());
                            bn.put("generatedAt", b.generatedAt());
                        },
                        () -> o.putNull("baseline"));
        changes(o.putArray("sinceBaseline"), r.baselineChanges());
        changes(o.putArray("underProfiles"), r.profileChanges());
        ArrayNode history = o.putArray("history");
        for (SuiteReport.TrendPoint p : r.history()) {
            point(history.addObject(), p);
        }
        return o;
    }

    private static ObjectNode scenario(SuiteResult.Row row) {
        ObjectNode s = MAPPER.createObjectNode();
        s.put("name", row.name());
        s.put("source", row.plan().entry().source());
        ArrayNode seeds = s.putArray("seeds");
        for (long seed : row.plan().entry().seeds()) {
            seeds.add(seed);
        }
        ArrayNode cells = s.putArray("cells");
        for (SuitePlan.Cell c : row.plan().cells()) {
            ObjectNode cn = cells.addObject();
            cn.put("column", c.name());
            cn.put("status", c.invalid() ? "invalid" : "ran");
            ArrayNode problems = cn.putArray("problems");
            for (Problem p : c.problems()) {
                ObjectNode pn = problems.addObject();
                pn.put("severity", p.isError() ? "error" : "warning");
                pn.put("path", p.path());
                pn.put("message", p.message());
            }
            ArrayNode gates = cn.putArray("gates");
            ArrayNode trials = cn.putArray("trials");
            if (c.invalid()) {
                continue;
            }
            List<TrialOutcome> ts = row.trials(c.name());
            row.column(c.name()).ifPresent(v -> {
                for (GateVerdict g : v.gates()) {
                    gates.add(gate(GateTally.of(row.name(), c.name(), g, ts), g));
                }
            });
            for (TrialOutcome t : ts) {
                ResultJson.trialNode(trials.addObject(), t);
            }
        }
        ArrayNode comparisons = s.putArray("pairedWithAsIs");
        for (PairedComparison p : row.summary().comparisons()) {
            ObjectNode pn = comparisons.addObject();
            pn.put("profile", p.variant());
            pn.put("pairs", p.pairs());
            put(pn, "rmseDifference", p.rmseDifference());
            put(pn, "rmseLow", p.rmseLow());
            put(pn, "rmseHigh", p.rmseHigh());
            put(pn, "recoveryShareDifference", p.recoveryShareDifference());
            put(pn, "recoveryShareLow", p.recoveryShareLow());
            put(pn, "recoveryShareHigh", p.recoveryShareHigh());
        }
        return s;
    }

    private static ObjectNode gate(GateTally t, GateVerdict g) {
        ObjectNode n = MAPPER.createObjectNode();
        n.put("id", g.gate().id());
        n.put("metric", Gates.metricName(g.gate().metric()));
        n.put("bound", g.gate().bound());
        n.put("requiredShare", g.gate().share());
        n.put("judgedBy", g.gate().rule().fileName());
        n.put("byDefault", g.byDefault());
        n.put("pass", g.pass());
        n.put("notExercised", g.notExercised());
        n.put("passedTrials", g.passed());
        n.put("exercisedTrials", g.exercised());
        n.put("trials", g.trials());
        put(n, "share", g.share());
        ObjectNode ci = n.putObject("interval");
        ci.put("lower", g.interval().lower());
        ci.put("upper", g.interval().upper());
        ci.put("confidence", g.interval().confidence());
        n.put("reason", g.reason());
        ArrayNode marks = n.putArray("marks");
        for (GateTally.Mark m : t.marks()) {
            ObjectNode mn = marks.addObject();
            mn.put("seed", m.seed());
            mn.put("exercised", m.exercised());
            mn.put("passed", m.passed());
        }
        return n;
    }

    private static void changes(ArrayNode out, List<GateChange> changes) {
        for (GateChange c : changes) {
            ObjectNode n = out.addObject();
            n.put("kind", c.regression() ? "regression" : "improvement");
            n.put("scenario", c.after().scenario());
            n.put("column", c.after().column());
            n.put("against", c.before().column());
            n.put("gate", c.after().gate());
            n.put("passedBefore", c.before().pass());
            n.put("passedNow", c.after().pass());
            n.put("before", c.before().counts());
            n.put("now", c.after().counts());
            n.put("pairs", c.pairs());
            put(n, "difference", c.difference());
            put(n, "low", c.low());
            put(n, "high", c.high());
        }
    }

    private static void point(ObjectNode n, SuiteReport.TrendPoint p) {
        n.put("generatedAt", p.generatedAt());
        n.put("gatesPassing", p.passing());
        n.put("gatesPlanned", p.gates());
    }

    private static void put(ObjectNode n, String key, double v) {
        if (Double.isFinite(v)) {
            n.put(key, v);
        } else {
            n.putNull(key);
        }
    }

    /**
     * Reads a suite result document as the baseline of a later run.
     *
     * @throws ScenarioException naming the field, when the document is not a suite result this
     *     build reads
     */
    public static SuiteReport.Baseline baseline(String json) {
        JsonNode root;
        try {
            root = MAPPER.readTree(json == null ? "" : json);
        } catch (JacksonException e) {
            throw new ScenarioException(List.of(Problem.error("(document)", "is not JSON: " + e.getOriginalMessage())));
        }
        if (root == null || !root.isObject()) {
            throw new ScenarioException(List.of(Problem.error("(document)", "must be a suite result object")));
        }
        String format = root.path("format").asString("");
        if (!format.equals(FORMAT)) {
            String hint = format.startsWith("driftlab-result/")
                    ? " (this is the result of a run, batch or sweep, not of a suite)"
                    : "";
            throw new ScenarioException(List.of(Problem.error(
                    "format", String.format(Locale.ROOT, "must be \"%s\", got \"%s\"%s", FORMAT, format, hint))));
        }
        List<GateTally> tallies = new ArrayList<>();
        List<Problem> problems = new ArrayList<>();
        JsonNode scenarios = root.path("scenarios");
        for (int i = 0; i < scenarios.size(); i++) {
            JsonNode s = scenarios.get(i);
            String name = s.path("name").asString("");
            JsonNode cells = s.path("cells");
            for (int j = 0; j < cells.size(); j++) {
                JsonNode c = cells.get(j);
                JsonNode gates = c.path("gates");
                for (int k = 0; k < gates.size(); k++) {
                    JsonNode g = gates.get(k);
                    String at = "scenarios[" + i + "].cells[" + j + "].gates[" + k + "]";
                    List<GateTally.Mark> marks = new ArrayList<>();
                    for (JsonNode m : g.path("marks")) {
                        marks.add(new GateTally.Mark(
                                m.path("seed").asLong(),
                                m.path("exercised").asBoolean(false),
                                m.path("passed").asBoolean(false)));
                    }
                    try {
                        tallies.add(new GateTally(
                                name,
                                c.path("column").asString(""),
                                g.path("id").asString(""),
                                g.path("pass").asBoolean(false),
                                g.path("passedTrials").asInt(0),
                                g.path("exercisedTrials").asInt(0),
                                marks));
                    } catch (IllegalArgumentException e) {
                        problems.add(Problem.error(at, e.getMessage()));
                    }
                }
            }
        }
        if (!problems.isEmpty()) {
            throw new ScenarioException(problems);
        }
        List<SuiteReport.TrendPoint> history = new ArrayList<>();
        for (JsonNode p : root.path("history")) {
            history.add(point(p));
        }
        return new SuiteReport.Baseline(
                root.path("suite").asString(""), root.path("generatedAt").asString(""), tallies, history, point(root));
    }

    /**
     * Reads a suite result document back into the run it reports, so that it can be compared with
     * another baseline than the one it was made against. The scenarios and profiles are those the
     * run ran (the document carries their names, seeds and trials, not their contents), in the
     * document's order; each scenario's gates are judged again from the document's trials.
     *
     * @param json a {@value #FORMAT} document
     * @param scenarios the scenario of each of the document's rows, in order
     * @param profiles the profiles of its columns after the first, in order
     * @throws ScenarioException naming the field, when the document is not a suite result or does
     *     not match the scenarios and profiles given
     */
    public static SuiteResult result(String json, List<Scenario> scenarios, List<Profile> profiles) {
        JsonNode root;
        try {
            root = MAPPER.readTree(json == null ? "" : json);
        } catch (JacksonException e) {
            throw new ScenarioException(List.of(Problem.error("(document)", "is not JSON: " + e.getOriginalMessage())));
        }
        if (root == null || !FORMAT.equals(root.path("format").asString(""))) {
            throw new ScenarioException(List.of(Problem.error("format", "must be \"" + FORMAT + "\"")));
        }
        JsonNode rows = root.path("scenarios");
        if (rows.size() != scenarios.size()) {
            throw new ScenarioException(List.of(Problem.error(
                    "scenarios", rows.size() + " scenarios in the document, " + scenarios.size() + " in the suite")));
        }
        List<SuitePlan.Entry> entries = new ArrayList<>();
        for (int i = 0; i < rows.size(); i++) {
            JsonNode s = rows.get(i);
            List<Long> seeds = new ArrayList<>();
            s.path("seeds").forEach(n -> seeds.add(n.asLong()));
            entries.add(new SuitePlan.Entry(
                    s.path("name").asString(""),
                    s.path("source").asString(""),
                    scenarios.get(i),
                    seeds.stream().mapToLong(Long::longValue).toArray()));
        }
        SuitePlan plan = SuitePlan.of(entries, profiles);
        List<SuiteResult.Row> out = new ArrayList<>();
        for (int i = 0; i < plan.rows().size(); i++) {
            SuitePlan.Row row = plan.rows().get(i);
            JsonNode cells = rows.get(i).path("cells");
            List<String> order = plan.columns();
            if (cells.size() != order.size()) {
                throw new ScenarioException(List.of(Problem.error(
                        "scenarios[" + i + "].cells",
                        cells.size() + " columns in the document, " + order.size() + " in the suite")));
            }
            List<Gate> gates = Gates.effective(row.entry().scenario());
            List<TrialOutcome> trials = new ArrayList<>();
            for (int j = 0; j < cells.size(); j++) {
                String column = cells.get(j).path("column").asString("");
                if (!column.equals(order.get(j))) {
                    throw new ScenarioException(List.of(Problem.error(
                            "scenarios[" + i + "].cells[" + j + "].column",
                            "is \"" + column + "\", the suite's column is \"" + order.get(j) + "\"")));
                }
                ResultJson.trials(cells.get(j)).forEach(t -> trials.add(t.withVariant(column)));
            }
            BatchSummary summary =
                    trials.isEmpty() ? new BatchSummary(List.of(), List.of()) : BatchSummary.of(trials, gates);
            out.add(new SuiteResult.Row(row, trials, summary, gates));
        }
        return new SuiteResult(
                plan,
                out,
                root.path("trialsPlanned").asInt(plan.trials()),
                root.path("cancelled").asBoolean(false),
                root.path("seconds").asDouble(0));
    }

    private static SuiteReport.TrendPoint point(JsonNode n) {
        return new SuiteReport.TrendPoint(
                n.path("generatedAt").asString(""),
                n.path("gatesPassing").asInt(0),
                n.path("gatesPlanned").asInt(0));
    }
}
