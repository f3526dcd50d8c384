package dev.driftlab.report;

import dev.driftlab.evaluation.EarlyEnds;
import dev.driftlab.evaluation.Episode;
import dev.driftlab.evaluation.FaultTally;
import dev.driftlab.evaluation.GateVerdict;
import dev.driftlab.evaluation.Gates;
import dev.driftlab.evaluation.Interval;
import dev.driftlab.evaluation.KidnapOutcome;
import dev.driftlab.evaluation.PairedComparison;
import dev.driftlab.evaluation.RunTrace;
import dev.driftlab.evaluation.Spread;
import dev.driftlab.evaluation.TrialEnd;
import dev.driftlab.evaluation.TrialOutcome;
import dev.driftlab.evaluation.VariantSummary;
import dev.driftlab.sim.FaultFiring;
import java.util.ArrayList;
import java.util.List;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.SerializationFeature;
import tools.jackson.databind.json.JsonMapper;
import tools.jackson.databind.node.ArrayNode;
import tools.jackson.databind.node.ObjectNode;

/**
 * The machine-readable result of a run, batch or sweep ({@code "format": "driftlab-result/2"}).
 * Times in seconds, distances in metres, headings in degrees, shares as fractions 0 to 1. Missing
 * figures (never converged, never recovered) are {@code null}. Version 2 judges each gate over the
 * trials that exercised it and adds the verdict, how each trial ended and which faults fired;
 * {@link #trials} still reads version 1 documents (their trials count as having driven the whole
 * route, which is all version 1 knew).
 */
public final class ResultJson {

    /** Value of the {@code format} key. */
    public static final String FORMAT = "driftlab-result/2";

    /** The earlier format, still read. */
    public static final String FORMAT_1 = "driftlab-result/1";

    private static final JsonMapper MAPPER =
            JsonMapper.builder().enable(SerializationFeature.INDENT_OUTPUT).build();

    private ResultJson() {}

    /** The document as text. */
    public static String render(Report r) {
        return MAPPER.writeValueAsString(tree(r));
    }

    /** The document as a tree. */
    public static ObjectNode tree(Report r) {
        ObjectNode o = MAPPER.createObjectNode();
        o.put("format", FORMAT);
        o.put("kind", r.kind().name().toLowerCase(java.util.Locale.ROOT));
        o.put("scenario", r.scenario().name());
        o.put("source", r.source());
        o.put("generatedAt", r.generatedAt());
        o.put("passed", r.passed());
        o.put("verdict", r.verdict().fileName());
        o.put("cancelled", r.cancelled());
        o.put("trialsPlanned", r.planned());
        o.put("trialsFinished", r.trials().size());
        o.put("seconds", round(r.seconds(), 3));
        ArrayNode seeds = o.putArray("seeds");
        for (long s : r.seeds()) {
            seeds.add(s);
        }
        r.kldRequired().ifPresent(k -> o.put("kldRequiredParticles", k));
        o.put("caution", Report.CAUTION);
        ObjectNode loc = o.putObject("localizer");
        loc.put("name", r.localizer());
        dev.driftlab.evaluation.AnswerTimes at = dev.driftlab.evaluation.AnswerTimes.of(
                r.trials(), 1 / r.scenario().rangefinder().rate());
        put(loc, "scanPeriod", at.scanPeriod());
        loc.put("timedTrials", at.timed());
        put(loc, "answerTimeP50", at.p50());
        put(loc, "answerTimeWorstP99", at.worstP99());
        loc.put("trialsOverScanPeriod", at.overPeriod());
        ArrayNode gates = o.putArray("gates");
        for (GateVerdict v : r.verdicts()) {
            ObjectNode g = gates.addObject();
            g.put("id", v.gate().id());
            g.put("variant", v.variant());
            g.put("metric", Gates.metricName(v.gate().metric()));
            g.put("bound", v.gate().bound());
            g.put("requiredShare", v.gate().share());
            g.put("judgedBy", v.gate().rule().fileName());
            g.put("byDefault", v.byDefault());
            g.put("passedTrials", v.passed());
            g.put("exercisedTrials", v.exercised());
            g.put("trials", v.trials());
            put(g, "share", v.share());
            interval(g.putObject("interval"), v.interval());
            g.put("pass", v.pass());
            g.put("notExercised", v.notExercised());
            if (!v.pass() && v.morePassingNeeded() >= 0) {
                g.put("morePassingNeeded", v.morePassingNeeded());
            }
            g.put("reason", v.reason());
        }
        ArrayNode variants = o.putArray("variants");
        for (VariantSummary v : r.summary().variants()) {
            ObjectNode n = variants.addObject();
            n.put("name", v.variant());
            n.put("trials", v.trials());
            ObjectNode rec = n.putObject("recovery");
            rec.put("deadline", v.recoveryDeadline());
            rec.put("trialsWithKidnap", v.kidnapTrials());
            rec.put("recovered", v.recovered());
            put(rec, "share", v.recoveryShare());
            interval(rec.putObject("interval"), v.recoveryRate());
            spread(rec.putObject("times"), v.recoveryTimes());
            ObjectNode conv = n.putObject("convergence");
            conv.put("converged", v.converged());
            interval(conv.putObject("interval"), v.convergenceRate());
            spread(conv.putObject("times"), v.convergenceTimes());
            spread(n.putObject("rmse"), v.rmse());
            spread(n.putObject("finalError"), v.finalError());
            spread(n.putObject("longestLost"), v.longestLost());
            n.put("endedEarly", v.endedEarly());
            ArrayNode early = n.putArray("earlyEnds");
            for (EarlyEnds e : v.earlyEnds()) {
                ObjectNode en = early.addObject();
                en.put("why", e.kind().fileName());
                en.put("trials", e.count());
                spread(en.putObject("time"), e.time());
                put(en, "x", e.x());
                put(en, "y", e.y());
                en.put("summary", e.sentence());
            }
            ArrayNode faults = n.putArray("faults");
            for (FaultTally f : v.faults()) {
                ObjectNode fn = faults.addObject();
                fn.put("id", f.id());
                fn.put("firedInTrials", f.fired());
                fn.put("trials", f.trials());
                ArrayNode why = fn.putArray("notFiredBecause");
                f.reasons().forEach(why::add);
            }
        }
        ArrayNode comparisons = o.putArray("comparisons");
        for (PairedComparison c : r.summary().comparisons()) {
            ObjectNode n = comparisons.addObject();
            n.put("base", c.base());
            n.put("variant", c.variant());
            n.put("pairs", c.pairs());
            n.put("bothRecovered", c.bothRecovered());
            n.put("onlyBaseRecovered", c.onlyBaseRecovered());
            n.put("onlyVariantRecovered", c.onlyVariantRecovered());
            n.put("neitherRecovered", c.neitherRecovered());
            put(n, "recoveryShareDifference", c.recoveryShareDifference());
            put(n, "recoveryShareLow", c.recoveryShareLow());
            put(n, "recoveryShareHigh", c.recoveryShareHigh());
            put(n, "rmseDifference", c.rmseDifference());
            put(n, "rmseLow", c.rmseLow());
            put(n, "rmseHigh", c.rmseHigh());
            put(n, "medianRecoveryTimeDifference", c.medianRecoveryTimeDifference());
        }
        ArrayNode trials = o.putArray("trials");
        for (TrialOutcome t : r.trials()) {
            trial(trials.addObject(), t);
        }
        r.trace().ifPresent(tr -> o.set("series", series(tr)));
        return o;
    }

    /** Fills a node with one trial's figures (the same shape as the entries of {@code trials}). */
    public static void trialNode(ObjectNode n, TrialOutcome t) {
        trial(n, t);
    }

    static void trial(ObjectNode n, TrialOutcome t) {
        n.put("variant", t.variant());
        n.put("seed", t.seed());
        n.put("duration", round(t.duration(), 3));
        put(n, "rmse", t.rmse());
        put(n, "alignedAte", t.alignedAte());
        put(n, "finalPositionError", t.finalPositionError());
        put(n, "finalHeadingErrorDeg", Math.toDegrees(t.finalHeadingError()));
        put(n, "convergenceTime", t.convergenceTime());
        put(n, "longestLost", t.longestLost());
        n.put("collisions", t.collisions());
        put(n, "meanParticles", t.meanParticles());
        put(n, "rpe1s", t.rpe1());
        put(n, "rpe5s", t.rpe5());
        put(n, "answerTimeP50", t.answerP50());
        put(n, "answerTimeP99", t.answerP99());
        if (!t.localizerTrouble().isEmpty()) {
            n.put("localizerTrouble", t.localizerTrouble());
        }
        ObjectNode end = n.putObject("end");
        end.put("kind", t.end().kind().fileName());
        put(end, "time", t.end().time());
        put(end, "x", t.end().x());
        put(end, "y", t.end().y());
        end.put("summary", t.end().describe());
        ArrayNode faults = n.putArray("faults");
        for (FaultFiring f : t.faults()) {
            ObjectNode fn = faults.addObject();
            fn.put("id", f.id());
            fn.put("fired", f.fired());
            put(fn, "time", f.time());
            if (!f.fired()) {
                fn.put("reason", f.reason());
            }
        }
        ArrayNode lost = n.putArray("lost");
        for (Episode e : t.lost()) {
            ObjectNode en = lost.addObject();
            put(en, "start", e.start());
            put(en, "end", e.end());
            en.put("ended", e.ended());
        }
        ArrayNode kidnaps = n.putArray("kidnaps");
        for (KidnapOutcome k : t.kidnaps()) {
            ObjectNode kn = kidnaps.addObject();
            put(kn, "at", k.at());
            put(kn, "noticedAfter", k.noticedAfter());
            put(kn, "recoveredAfter", k.recoveredAfter());
            kn.put("recovered", k.recovered());
        }
    }

    /**
     * The trials of a result document, version 1 or 2, as written by {@link #trialNode}. Version 1
     * trials, which did not record how they ended, read as having driven the whole route.
     */
    public static List<TrialOutcome> trials(JsonNode doc) {
        List<TrialOutcome> out = new ArrayList<>();
        for (JsonNode t : doc.path("trials")) {
            List<Episode> lost = new ArrayList<>();
            for (JsonNode e : t.path("lost")) {
                lost.add(new Episode(
                        num(e, "start"), num(e, "end"), e.path("ended").asBoolean(false)));
            }
            List<KidnapOutcome> kidnaps = new ArrayList<>();
            for (JsonNode k : t.path("kidnaps")) {
                kidnaps.add(new KidnapOutcome(num(k, "at"), num(k, "noticedAfter"), num(k, "recoveredAfter")));
            }
            JsonNode e = t.path("end");
            TrialEnd end = e.isObject()
                    ? new TrialEnd(
                            TrialEnd.Kind.byFileName(e.path("kind").asString("completed")),
                            num(e, "time"),
                            num(e, "x"),
                            num(e, "y"))
                    : TrialEnd.completed(num(t, "duration"), Double.NaN, Double.NaN);
            List<FaultFiring> faults = new ArrayList<>();
            for (JsonNode f : t.path("faults")) {
                boolean fired = f.path("fired").asBoolean(false);
                faults.add(new FaultFiring(
                        f.path("id").asString(""),
                        fired,
                        num(f, "time"),
                        fired ? "" : f.path("reason").asString("")));
            }
            out.add(new TrialOutcome(
                    t.path("variant").asString("base"),
                    t.path("seed").asLong(),
                    num(t, "duration"),
                    num(t, "rmse"),
                    num(t, "alignedAte"),
                    num(t, "finalPositionError"),
                    Math.toRadians(num(t, "finalHeadingErrorDeg")),
                    num(t, "convergenceTime"),
                    lost,
                    kidnaps,
                    t.path("collisions").asInt(0),
                    num(t, "meanParticles"),
                    end,
                    faults,
                    num(t, "rpe1s"),
                    num(t, "rpe5s"),
                    num(t, "answerTimeP50"),
                    num(t, "answerTimeP99"),
                    t.path("localizerTrouble").asString("")));
        }
        return out;
    }

    private static double num(JsonNode n, String key) {
        JsonNode v = n.path(key);
        return v.isNumber() ? v.asDouble() : Double.NaN;
    }

    /**
     * The per-frame figures of a run as one array per figure (time, errors, filter figures, kidnap
     * times): the result document's {@code series} and the player's plots read the same shape.
     */
    public static ObjectNode series(RunTrace tr) {
        ObjectNode s = MAPPER.createObjectNode();
        ArrayNode t = s.putArray("time");
        ArrayNode pe = s.putArray("positionError");
        ArrayNode he = s.putArray("headingErrorDeg");
        ArrayNode ess = s.putArray("effectiveSampleSize");
        ArrayNode n = s.putArray("particles");
        ArrayNode lik = s.putArray("meanLikelihood");
        ArrayNode slow = s.putArray("slowAverage");
        ArrayNode fast = s.putArray("fastAverage");
        ArrayNode inj = s.putArray("injected");
        for (int i = 0; i < tr.size(); i++) {
            t.add(round(tr.time(i), 3));
            pe.add(round(tr.positionError(i), 4));
            he.add(round(Math.toDegrees(tr.headingError(i)), 3));
            ess.add(round(tr.effectiveSize(i), 1));
            n.add(tr.particles(i));
            lik.add(round(tr.meanLikelihood(i), 6));
            slow.add(round(tr.slowAverage(i), 6));
            fast.add(round(tr.fastAverage(i), 6));
            inj.add(tr.injected(i));
        }
        ArrayNode k = s.putArray("kidnaps");
        for (double v : tr.kidnapTimes()) {
            k.add(v);
        }
        return s;
    }

    private static void interval(ObjectNode n, Interval i) {
        n.put("lower", round(i.lower(), 6));
        n.put("upper", round(i.upper(), 6));
        n.put("confidence", i.confidence());
    }

    private static void spread(ObjectNode n, Spread s) {
        n.put("count", s.count());
        put(n, "p50", s.p50());
        put(n, "p90", s.p90());
        put(n, "max", s.max());
        put(n, "mean", s.mean());
    }

    private static void put(ObjectNode n, String key, double v) {
        if (Double.isFinite(v)) {
            n.put(key, round(v, 6));
        } else {
            n.putNull(key);
        }
    }

    private static double round(double v, int places) {
        if (!Double.isFinite(v)) {
            return v;
        }
        double f = Math.pow(10, places);
        return Math.round(v * f) / f;
    }
}
