package dev.driftlab.localizer.protocol;

import static dev.driftlab.localizer.protocol.MessageFields.array;
import static dev.driftlab.localizer.protocol.MessageFields.clip;
import static dev.driftlab.localizer.protocol.MessageFields.finite;
import static dev.driftlab.localizer.protocol.MessageFields.number;
import static dev.driftlab.localizer.protocol.MessageFields.object;
import static dev.driftlab.localizer.protocol.MessageFields.optional;
import static dev.driftlab.localizer.protocol.MessageFields.readCovariance;
import static dev.driftlab.localizer.protocol.MessageFields.readPose;
import static dev.driftlab.localizer.protocol.MessageFields.text;
import static dev.driftlab.localizer.protocol.MessageFields.whole;

import dev.driftlab.geometry.Pose;
import dev.driftlab.localizer.Covariance;
import dev.driftlab.localizer.Hypothesis;
import dev.driftlab.localizer.LocalizerFailure.Kind;
import dev.driftlab.localizer.ParticleSet;
import dev.driftlab.localizer.Scan;
import dev.driftlab.localizer.UpdateReport;
import java.util.ArrayList;
import java.util.List;
import tools.jackson.core.JacksonException;
import tools.jackson.core.json.JsonReadFeature;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;
import tools.jackson.databind.node.ArrayNode;
import tools.jackson.databind.node.ObjectNode;

/**
 * Every message of {@code driftlab-localizer/1}, written and read: the one home of the protocol's
 * message names, fields, version and bounds (docs/localizer-protocol.md describes them, the schemas
 * under {@code static/schema/localizer-1/} check them). One message is one JSON object on one line.
 *
 * <p>Readers throw {@link ProtocolException} naming the message and field: {@code MALFORMED} for a
 * line that is not JSON or misses a field, {@code NOT_FINITE} for NaN or infinite numbers (read
 * leniently so they can be named), {@code VERSION} for another protocol version.
 */
public final class Messages {

    /** The protocol's name and version, as greeting and hello carry it. */
    public static final String VERSION = "driftlab-localizer/1";

    /** Most particles an estimate may carry. */
    public static final int MAX_PARTICLES = 5_000;

    /** Most hypotheses an estimate may carry. */
    public static final int MAX_HYPOTHESES = 100;

    /** Longest line read from a localizer, in characters. */
    public static final int MAX_LINE_CHARS = 1 << 22;

    /** Longest localizer name kept. */
    public static final int MAX_NAME = 200;

    /** Message types. */
    public static final String GREETING = "greeting";

    /** The localizer's answer to the greeting. */
    public static final String HELLO = "hello";

    /** The localizer's refusal of the greeting (another version, a map it cannot use). */
    public static final String REFUSED = "refused";

    /** An odometry increment. */
    public static final String ODOMETRY = "odometry";

    /** A range scan. */
    public static final String SCAN = "scan";

    /** The localizer's answer to a scan. */
    public static final String ESTIMATE = "estimate";

    /** The end of the trial. */
    public static final String END = "end";

    private static final JsonMapper MAPPER = JsonMapper.builder()
            .enable(JsonReadFeature.ALLOW_NON_NUMERIC_NUMBERS)
            .build();

    private Messages() {}

    // ---- reading any line

    /** Parses one line into an object with a {@code type}. */
    public static JsonNode parse(String line) {
        JsonNode n;
        try {
            n = MAPPER.readTree(line);
        } catch (JacksonException e) {
            throw new ProtocolException(Kind.MALFORMED, "not a JSON object: " + clip(line));
        }
        if (n == null || !n.isObject()) {
            throw new ProtocolException(Kind.MALFORMED, "not a JSON object: " + clip(line));
        }
        if (!n.path("type").isString()) {
            throw new ProtocolException(Kind.MALFORMED, "message has no \"type\": " + clip(line));
        }
        return n;
    }

    /** The message's type. */
    public static String type(JsonNode message) {
        return message.path("type").asString();
    }

    // ---- greeting (Driftlab -> localizer)

    /** The greeting as one line. */
    public static String greeting(Greeting g) {
        ObjectNode n = MAPPER.createObjectNode();
        n.put("type", GREETING);
        n.put("protocol", VERSION);
        ObjectNode map = n.putObject("map");
        map.put("cellSize", g.cellSize());
        map.put("originX", g.originX());
        map.put("originY", g.originY());
        map.put("width", g.width());
        map.put("height", g.height());
        ArrayNode rows = map.putArray("rows");
        for (int[] row : g.rows()) {
            ArrayNode r = rows.addArray();
            for (int run : row) {
                r.add(run);
            }
        }
        ArrayNode walls = map.putArray("walls");
        for (double[] w : g.walls()) {
            walls.addArray().add(w[0]).add(w[1]).add(w[2]).add(w[3]);
        }
        ObjectNode rf = n.putObject("rangefinder");
        ArrayNode beams = rf.putArray("beamAngles");
        for (double a : g.beamAngles()) {
            beams.add(a);
        }
        pose(rf.putObject("mount"), g.mount());
        rf.put("maxRange", g.maxRange());
        rf.put("rate", g.rate());
        ObjectNode robot = n.putObject("robot");
        robot.put("wheelbase", g.wheelbase());
        robot.put("wheelRadius", g.wheelRadius());
        robot.put("ticksPerTurn", g.ticksPerTurn());
        robot.put("footprintRadius", g.footprintRadius());
        if (g.startUnknown()) {
            n.put("start", "unknown");
        } else {
            ObjectNode s = n.putObject("start");
            pose(s.putObject("pose"), g.start());
            s.put("spread", g.startSpread());
            s.put("turnSpread", g.startTurnSpread());
        }
        n.put("particles", g.particles());
        if (g.settings() != null) {
            n.set("settings", g.settings());
        }
        return MAPPER.writeValueAsString(n);
    }

    /**
     * Reads a greeting (the localizer's side).
     *
     * @throws ProtocolException {@code VERSION} naming both versions when the protocol differs
     */
    public static Greeting readGreeting(JsonNode n) {
        expectType(n, GREETING);
        String version = text(n, "protocol", "greeting.protocol");
        if (!version.equals(VERSION)) {
            throw new ProtocolException(
                    Kind.VERSION, "the greeting is " + version + "; this localizer speaks " + VERSION + " only");
        }
        JsonNode map = object(n, "map", "greeting.map");
        int width = whole(map, "width", "greeting.map.width");
        int height = whole(map, "height", "greeting.map.height");
        JsonNode rowsNode = array(map, "rows", "greeting.map.rows");
        if (rowsNode.size() != height) {
            throw new ProtocolException(
                    Kind.MALFORMED, "greeting.map.rows has " + rowsNode.size() + " rows, not the height " + height);
        }
        int[][] rows = new int[height][];
        for (int j = 0; j < height; j++) {
            JsonNode r = rowsNode.get(j);
            rows[j] = new int[r.size()];
            for (int i = 0; i < r.size(); i++) {
                rows[j][i] = r.get(i).asInt();
            }
        }
        JsonNode wallsNode = array(map, "walls", "greeting.map.walls");
        double[][] walls = new double[wallsNode.size()][4];
        for (int i = 0; i < walls.length; i++) {
            for (int k = 0; k < 4; k++) {
                walls[i][k] = finite(wallsNode.get(i).path(k), "greeting.map.walls[" + i + "][" + k + "]");
            }
        }
        JsonNode rf = object(n, "rangefinder", "greeting.rangefinder");
        JsonNode beamsNode = array(rf, "beamAngles", "greeting.rangefinder.beamAngles");
        double[] beams = new double[beamsNode.size()];
        for (int i = 0; i < beams.length; i++) {
            beams[i] = finite(beamsNode.get(i), "greeting.rangefinder.beamAngles[" + i + "]");
        }
        JsonNode robot = object(n, "robot", "greeting.robot");
        JsonNode start = n.path("start");
        Pose startPose = null;
        double spread = 0;
        double turnSpread = 0;
        if (!(start.isString() && start.asString().equals("unknown"))) {
            JsonNode s = object(n, "start", "greeting.start");
            startPose = readPose(s, "pose", "greeting.start.pose");
            spread = number(s, "spread", "greeting.start.spread");
            turnSpread = number(s, "turnSpread", "greeting.start.turnSpread");
        }
        JsonNode settings = n.path("settings");
        return new Greeting(
                number(map, "cellSize", "greeting.map.cellSize"),
                number(map, "originX", "greeting.map.originX"),
                number(map, "originY", "greeting.map.originY"),
                width,
                height,
                rows,
                walls,
                beams,
                readPose(rf, "mount", "greeting.rangefinder.mount"),
                number(rf, "maxRange", "greeting.rangefinder.maxRange"),
                number(rf, "rate", "greeting.rangefinder.rate"),
                number(robot, "wheelbase", "greeting.robot.wheelbase"),
                number(robot, "wheelRadius", "greeting.robot.wheelRadius"),
                whole(robot, "ticksPerTurn", "greeting.robot.ticksPerTurn"),
                number(robot, "footprintRadius", "greeting.robot.footprintRadius"),
                startPose,
                spread,
                turnSpread,
                whole(n, "particles", "greeting.particles"),
                settings.isObject() ? settings : null);
    }

    // ---- hello / refused (localizer -> Driftlab)

    /** The localizer's hello. */
    public static String hello(String name) {
        ObjectNode n = MAPPER.createObjectNode();
        n.put("type", HELLO);
        n.put("name", name);
        n.put("protocol", VERSION);
        return MAPPER.writeValueAsString(n);
    }

    /** The localizer's refusal of a greeting. */
    public static String refused(String reason) {
        ObjectNode n = MAPPER.createObjectNode();
        n.put("type", REFUSED);
        n.put("reason", reason);
        return MAPPER.writeValueAsString(n);
    }

    /**
     * Reads the answer to the greeting and returns the localizer's name.
     *
     * @throws ProtocolException {@code VERSION} for a refusal or another version
     */
    public static String readHello(JsonNode n) {
        if (type(n).equals(REFUSED)) {
            throw new ProtocolException(
                    Kind.VERSION,
                    "the localizer refused the greeting: "
                            + clip(n.path("reason").asString("")));
        }
        expectType(n, HELLO);
        String version = text(n, "protocol", "hello.protocol");
        if (!version.equals(VERSION)) {
            throw new ProtocolException(
                    Kind.VERSION, "the localizer speaks " + clip(version) + "; Driftlab speaks " + VERSION);
        }
        String name = text(n, "name", "hello.name");
        return name.length() > MAX_NAME ? name.substring(0, MAX_NAME) : name;
    }

    // ---- odometry and scan (Driftlab -> localizer)

    /**
     * An odometry message: the robot's dead-reckoned pose in its odometry frame and the increment
     * since the previous one, in the previous pose's frame (forward, left, turn).
     *
     * @param time seconds since the start
     * @param previous the previous odometry pose, or null for the first (increment 0)
     * @param now the odometry pose now
     */
    public static String odometry(double time, Pose previous, Pose now) {
        ObjectNode n = MAPPER.createObjectNode();
        n.put("type", ODOMETRY);
        n.put("time", time);
        ObjectNode d = n.putObject("increment");
        if (previous == null) {
            d.put("forward", 0.0).put("left", 0.0).put("turn", 0.0);
        } else {
            double dx = now.x() - previous.x();
            double dy = now.y() - previous.y();
            double c = Math.cos(previous.heading());
            double s = Math.sin(previous.heading());
            d.put("forward", c * dx + s * dy);
            d.put("left", -s * dx + c * dy);
            d.put("turn", dev.driftlab.geometry.Angles.wrap(now.heading() - previous.heading()));
        }
        pose(n.putObject("pose"), now);
        return MAPPER.writeValueAsString(n);
    }

    /** The odometry pose of an odometry message. */
    public static Pose readOdometryPose(JsonNode n) {
        expectType(n, ODOMETRY);
        return readPose(n, "pose", "odometry.pose");
    }

    /** A scan message: ranges in beam order, a range equal to the max range meaning no return. */
    public static String scan(double time, Scan scan) {
        ObjectNode n = MAPPER.createObjectNode();
        n.put("type", SCAN);
        n.put("time", time);
        ArrayNode r = n.putArray("ranges");
        for (int i = 0; i < scan.beams(); i++) {
            r.add(scan.range(i));
        }
        return MAPPER.writeValueAsString(n);
    }

    /** The ranges of a scan message. */
    public static double[] readRanges(JsonNode n) {
        expectType(n, SCAN);
        JsonNode r = array(n, "ranges", "scan.ranges");
        double[] out = new double[r.size()];
        for (int i = 0; i < out.length; i++) {
            out[i] = finite(r.get(i), "scan.ranges[" + i + "]");
        }
        return out;
    }

    /** The time of a scan or odometry message. */
    public static double readTime(JsonNode n) {
        return number(n, "time", type(n) + ".time");
    }

    /** The end message. */
    public static String end(String reason) {
        ObjectNode n = MAPPER.createObjectNode();
        n.put("type", END);
        n.put("reason", reason);
        return MAPPER.writeValueAsString(n);
    }

    // ---- estimate (localizer -> Driftlab)

    /**
     * An estimate from a belief of the built-in filter: the heaviest hypothesis as the pose, every
     * hypothesis, up to {@code maxParticles} particles (evenly spaced through the set), and the
     * filter's figures (Driftlab-specific, for identical results through the protocol).
     */
    public static String estimate(double time, UpdateReport r, ParticleSet ps, int maxParticles) {
        ObjectNode n = MAPPER.createObjectNode();
        n.put("type", ESTIMATE);
        n.put("time", time);
        pose(n.putObject("pose"), r.best().mean());
        covariance(n, r.best().covariance());
        ArrayNode hyps = n.putArray("hypotheses");
        for (Hypothesis h : r.hypotheses()) {
            ObjectNode hn = hyps.addObject();
            hn.put("weight", h.weight());
            pose(hn.putObject("pose"), h.mean());
            covariance(hn, h.covariance());
            hn.put("particles", h.particles());
        }
        int count = Math.min(Math.min(maxParticles, MAX_PARTICLES), ps.size());
        if (count > 0) {
            ObjectNode p = n.putObject("particles");
            ArrayNode xs = p.putArray("x");
            ArrayNode ys = p.putArray("y");
            ArrayNode hs = p.putArray("heading");
            ArrayNode ws = p.putArray("weight");
            for (int k = 0; k < count; k++) {
                int i = (int) ((long) k * ps.size() / count);
                xs.add(ps.x(i));
                ys.add(ps.y(i));
                hs.add(ps.heading(i));
                ws.add(ps.weight(i));
            }
        }
        ObjectNode f = n.putObject("figures");
        nullable(f, "meanLikelihood", r.meanLikelihood());
        nullable(f, "effectiveSampleSize", r.effectiveSampleSize());
        f.put("particleCount", r.particleCount());
        f.put("injected", r.injected());
        nullable(f, "slowAverage", r.slowAverage());
        nullable(f, "fastAverage", r.fastAverage());
        return MAPPER.writeValueAsString(n);
    }

    /**
     * A localizer's answer to a scan.
     *
     * @param pose the estimate that is judged, site frame
     * @param report the belief as the trial loop takes it (figures not reported are NaN)
     * @param particles sample to draw: x, y, heading, weight columns; null when none was sent
     */
    public record Estimate(Pose pose, UpdateReport report, double[][] particles) {}

    /**
     * Reads an estimate.
     *
     * @param n the message
     * @param scanTime the time of the scan it answers
     * @throws ProtocolException naming the field at fault
     */
    public static Estimate readEstimate(JsonNode n, double scanTime) {
        expectType(n, ESTIMATE);
        double time = number(n, "time", "estimate.time");
        if (Math.abs(time - scanTime) > 1e-6) {
            throw new ProtocolException(
                    Kind.MALFORMED, "estimate.time is " + time + " but the scan it answers was at " + scanTime);
        }
        Pose pose = readPose(n, "pose", "estimate.pose");
        Covariance cov = readCovariance(n, "estimate");
        List<Hypothesis> hyps = new ArrayList<>();
        JsonNode hn = n.path("hypotheses");
        if (!hn.isMissingNode() && !hn.isNull()) {
            if (!hn.isArray()) {
                throw new ProtocolException(Kind.MALFORMED, "estimate.hypotheses must be a list");
            }
            if (hn.size() > MAX_HYPOTHESES) {
                throw new ProtocolException(
                        Kind.MALFORMED,
                        "estimate.hypotheses has " + hn.size() + " entries; at most " + MAX_HYPOTHESES
                                + " are allowed");
            }
            for (int i = 0; i < hn.size(); i++) {
                String p = "estimate.hypotheses[" + i + "]";
                JsonNode h = hn.get(i);
                double w = number(h, "weight", p + ".weight");
                if (w < 0 || w > 1) {
                    throw new ProtocolException(Kind.MALFORMED, p + ".weight must be in [0, 1], got " + w);
                }
                int particles = h.path("particles").isNumber()
                        ? Math.max(0, h.path("particles").asInt())
                        : 0;
                hyps.add(new Hypothesis(w, readPose(h, "pose", p + ".pose"), readCovariance(h, p), particles));
            }
        }
        double[][] particles = readParticles(n.path("particles"));
        JsonNode f = n.path("figures");
        int count = f.path("particleCount").isNumber()
                ? f.path("particleCount").asInt()
                : dev.driftlab.localizer.TrialLocalizer.UNKNOWN_COUNT;
        UpdateReport report = new UpdateReport(
                true,
                new Hypothesis(1.0, pose, cov, Math.max(0, count)),
                hyps,
                optional(f, "effectiveSampleSize"),
                count,
                optional(f, "meanLikelihood"),
                optional(f, "slowAverage"),
                optional(f, "fastAverage"),
                Double.NaN,
                f.path("injected").isNumber() ? Math.max(0, f.path("injected").asInt()) : 0,
                0,
                false,
                false);
        return new Estimate(pose, report, particles);
    }

    private static double[][] readParticles(JsonNode p) {
        if (p.isMissingNode() || p.isNull()) {
            return null;
        }
        if (!p.isObject()) {
            throw new ProtocolException(Kind.MALFORMED, "estimate.particles must be an object of columns");
        }
        String[] cols = {"x", "y", "heading", "weight"};
        JsonNode x = array(p, "x", "estimate.particles.x");
        int n = x.size();
        if (n > MAX_PARTICLES) {
            throw new ProtocolException(
                    Kind.MALFORMED,
                    "estimate.particles has " + n + " particles; at most " + MAX_PARTICLES + " are allowed");
        }
        double[][] out = new double[4][n];
        for (int c = 0; c < 4; c++) {
            JsonNode col = p.path(cols[c]);
            if (c == 3 && (col.isMissingNode() || col.isNull())) {
                java.util.Arrays.fill(out[3], 1.0);
                continue;
            }
            col = array(p, cols[c], "estimate.particles." + cols[c]);
            if (col.size() != n) {
                throw new ProtocolException(
                        Kind.MALFORMED,
                        "estimate.particles." + cols[c] + " has " + col.size() + " entries, x has " + n);
            }
            for (int i = 0; i < n; i++) {
                out[c][i] = finite(col.get(i), "estimate.particles." + cols[c] + "[" + i + "]");
            }
            if (c == 3) {
                for (int i = 0; i < n; i++) {
                    if (out[3][i] < 0) {
                        throw new ProtocolException(
                                Kind.MALFORMED, "estimate.particles.weight[" + i + "] must not be negative");
                    }
                }
            }
        }
        return out;
    }

    // ---- helpers

    private static void pose(ObjectNode n, Pose p) {
        n.put("x", p.x());
        n.put("y", p.y());
        n.put("heading", p.heading());
    }

    private static void covariance(ObjectNode n, Covariance c) {
        if (c.known()) {
            n.putArray("covariance")
                    .add(c.xx())
                    .add(c.xy())
                    .add(c.xh())
                    .add(c.yy())
                    .add(c.yh())
                    .add(c.hh());
        }
    }

    private static void nullable(ObjectNode n, String field, double v) {
        if (Double.isFinite(v)) {
            n.put(field, v);
        } else {
            n.putNull(field);
        }
    }

    private static void expectType(JsonNode n, String type) {
        if (!type(n).equals(type)) {
            throw new ProtocolException(
                    Kind.MALFORMED, "expected a \"" + type + "\" message, got \"" + clip(type(n)) + "\"");
        }
    }
}
