package dev.driftlab.trial;

import dev.driftlab.evaluation.Episode;
import dev.driftlab.evaluation.KidnapOutcome;
import dev.driftlab.evaluation.RunTrace;
import dev.driftlab.evaluation.TrialEnd;
import dev.driftlab.evaluation.TrialOutcome;
import dev.driftlab.sim.FaultFiring;
import java.util.ArrayList;
import java.util.List;
import tools.jackson.core.JacksonException;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;
import tools.jackson.databind.node.ArrayNode;
import tools.jackson.databind.node.ObjectNode;

/**
 * Lossless text for one finished trial, so that a trial run by one process can be stored and
 * assembled into a run's result by another with exactly the figures it had: every double is
 * written in the shortest form that reads back to the same value, and NaN and the infinities as
 * the strings {@code "NaN"}, {@code "Infinity"} and {@code "-Infinity"}. Unlike the result
 * document ({@code report.ResultJson}), nothing is rounded or converted.
 */
public final class TrialRecords {

    /** Format name written into every record; read back to refuse anything else. */
    public static final String OUTCOME_FORMAT = "driftlab-trial/1";

    /** Format name of a stored per-frame trace. */
    public static final String TRACE_FORMAT = "driftlab-trace/1";

    private static final JsonMapper MAPPER = JsonMapper.builder().build();

    private TrialRecords() {}

    /** One trial's outcome as text. */
    public static String outcome(TrialOutcome t) {
        ObjectNode n = MAPPER.createObjectNode();
        n.put("format", OUTCOME_FORMAT);
        n.put("variant", t.variant());
        n.put("seed", t.seed());
        num(n, "duration", t.duration());
        num(n, "rmse", t.rmse());
        num(n, "alignedAte", t.alignedAte());
        num(n, "finalPositionError", t.finalPositionError());
        num(n, "finalHeadingError", t.finalHeadingError());
        num(n, "convergenceTime", t.convergenceTime());
        ArrayNode lost = n.putArray("lost");
        for (Episode e : t.lost()) {
            ObjectNode en = lost.addObject();
            num(en, "start", e.start());
            num(en, "end", e.end());
            en.put("ended", e.ended());
        }
        ArrayNode kidnaps = n.putArray("kidnaps");
        for (KidnapOutcome k : t.kidnaps()) {
            ObjectNode kn = kidnaps.addObject();
            num(kn, "at", k.at());
            num(kn, "noticedAfter", k.noticedAfter());
            num(kn, "recoveredAfter", k.recoveredAfter());
        }
        n.put("collisions", t.collisions());
        num(n, "meanParticles", t.meanParticles());
        ObjectNode end = n.putObject("end");
        end.put("kind", t.end().kind().fileName());
        num(end, "time", t.end().time());
        num(end, "x", t.end().x());
        num(end, "y", t.end().y());
        ArrayNode faults = n.putArray("faults");
        for (FaultFiring f : t.faults()) {
            ObjectNode fn = faults.addObject();
            fn.put("id", f.id());
            fn.put("fired", f.fired());
            num(fn, "time", f.time());
            fn.put("reason", f.reason());
        }
        num(n, "rpe1", t.rpe1());
        num(n, "rpe5", t.rpe5());
        num(n, "answerP50", t.answerP50());
        num(n, "answerP99", t.answerP99());
        n.put("localizerTrouble", t.localizerTrouble());
        return MAPPER.writeValueAsString(n);
    }

    /**
     * Reads an outcome written by {@link #outcome(TrialOutcome)}.
     *
     * @throws IllegalArgumentException when the text is not such a record
     */
    public static TrialOutcome readOutcome(String text) {
        JsonNode n = tree(text, OUTCOME_FORMAT);
        List<Episode> lost = new ArrayList<>();
        for (JsonNode e : n.path("lost")) {
            lost.add(new Episode(num(e, "start"), num(e, "end"), e.path("ended").asBoolean()));
        }
        List<KidnapOutcome> kidnaps = new ArrayList<>();
        for (JsonNode k : n.path("kidnaps")) {
            kidnaps.add(new KidnapOutcome(num(k, "at"), num(k, "noticedAfter"), num(k, "recoveredAfter")));
        }
        JsonNode e = n.path("end");
        TrialEnd end = new TrialEnd(
                TrialEnd.Kind.byFileName(e.path("kind").asString()), num(e, "time"), num(e, "x"), num(e, "y"));
        List<FaultFiring> faults = new ArrayList<>();
        for (JsonNode f : n.path("faults")) {
            faults.add(new FaultFiring(
                    f.path("id").asString(),
                    f.path("fired").asBoolean(),
                    num(f, "time"),
                    f.path("reason").asString()));
        }
        return new TrialOutcome(
                n.path("variant").asString(),
                n.path("seed").asLong(),
                num(n, "duration"),
                num(n, "rmse"),
                num(n, "alignedAte"),
                num(n, "finalPositionError"),
                num(n, "finalHeadingError"),
                num(n, "convergenceTime"),
                lost,
                kidnaps,
                n.path("collisions").asInt(),
                num(n, "meanParticles"),
                end,
                faults,
                num(n, "rpe1"),
                num(n, "rpe5"),
                n.has("answerP50") ? num(n, "answerP50") : Double.NaN,
                n.has("answerP99") ? num(n, "answerP99") : Double.NaN,
                n.path("localizerTrouble").asString(""));
    }

    /** A run's per-frame trace as text (the report of a single-seed run plots it). */
    public static String trace(RunTrace tr) {
        ObjectNode n = MAPPER.createObjectNode();
        n.put("format", TRACE_FORMAT);
        int size = tr.size();
        ArrayNode[] cols = new ArrayNode[13];
        String[] names = {
            "time",
            "trueX",
            "trueY",
            "trueHeading",
            "estX",
            "estY",
            "estHeading",
            "meanLikelihood",
            "effectiveSize",
            "particles",
            "injected",
            "slowAverage",
            "fastAverage"
        };
        for (int c = 0; c < cols.length; c++) {
            cols[c] = n.putArray(names[c]);
        }
        for (int i = 0; i < size; i++) {
            add(cols[0], tr.time(i));
            add(cols[1], tr.trueX(i));
            add(cols[2], tr.trueY(i));
            add(cols[3], tr.trueHeading(i));
            add(cols[4], tr.estX(i));
            add(cols[5], tr.estY(i));
            add(cols[6], tr.estHeading(i));
            add(cols[7], tr.meanLikelihood(i));
            add(cols[8], tr.effectiveSize(i));
            cols[9].add(tr.particles(i));
            cols[10].add(tr.injected(i));
            add(cols[11], tr.slowAverage(i));
            add(cols[12], tr.fastAverage(i));
        }
        ArrayNode k = n.putArray("kidnaps");
        for (double v : tr.kidnapTimes()) {
            add(k, v);
        }
        ArrayNode j = n.putArray("jumps");
        for (double v : tr.jumpTimes()) {
            add(j, v);
        }
        return MAPPER.writeValueAsString(n);
    }

    /**
     * Reads a trace written by {@link #trace(RunTrace)}.
     *
     * @throws IllegalArgumentException when the text is not such a record
     */
    public static RunTrace readTrace(String text) {
        JsonNode n = tree(text, TRACE_FORMAT);
        RunTrace tr = new RunTrace();
        JsonNode time = n.path("time");
        for (int i = 0; i < time.size(); i++) {
            tr.add(
                    at(time, i),
                    at(n.path("trueX"), i),
                    at(n.path("trueY"), i),
                    at(n.path("trueHeading"), i),
                    at(n.path("estX"), i),
                    at(n.path("estY"), i),
                    at(n.path("estHeading"), i),
                    at(n.path("meanLikelihood"), i),
                    at(n.path("effectiveSize"), i),
                    n.path("particles").get(i).asInt(),
                    n.path("injected").get(i).asInt(),
                    at(n.path("slowAverage"), i),
                    at(n.path("fastAverage"), i));
        }
        for (JsonNode v : n.path("kidnaps")) {
            tr.addKidnap(value(v));
        }
        for (JsonNode v : n.path("jumps")) {
            tr.addJump(value(v));
        }
        return tr;
    }

    private static JsonNode tree(String text, String format) {
        JsonNode n;
        try {
            n = MAPPER.readTree(text);
        } catch (JacksonException e) {
            throw new IllegalArgumentException("a stored trial record is not JSON");
        }
        if (!format.equals(n.path("format").asString(""))) {
            throw new IllegalArgumentException(
                    "a stored trial record has format \"" + n.path("format").asString("") + "\"; expected " + format);
        }
        return n;
    }

    private static void num(ObjectNode n, String key, double v) {
        if (Double.isFinite(v)) {
            n.put(key, v);
        } else {
            n.put(key, Double.toString(v));
        }
    }

    private static void add(ArrayNode a, double v) {
        if (Double.isFinite(v)) {
            a.add(v);
        } else {
            a.add(Double.toString(v));
        }
    }

    private static double num(JsonNode n, String key) {
        return value(n.path(key));
    }

    private static double at(JsonNode a, int i) {
        return value(a.get(i));
    }

    private static double value(JsonNode v) {
        if (v == null || v.isMissingNode() || v.isNull()) {
            throw new IllegalArgumentException("a stored trial record misses a number");
        }
        if (v.isNumber()) {
            return v.asDouble();
        }
        return Double.parseDouble(v.asString());
    }
}
