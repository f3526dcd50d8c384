package dev.driftlab.app.player;

import dev.driftlab.evaluation.RunTrace;
import dev.driftlab.geometry.Bounds;
import dev.driftlab.geometry.Point;
import dev.driftlab.geometry.Polygon;
import dev.driftlab.geometry.Pose;
import dev.driftlab.geometry.Segment;
import dev.driftlab.recording.Frame;
import dev.driftlab.recording.FrameChunk;
import dev.driftlab.recording.FrameCodec;
import dev.driftlab.recording.FrameHypothesis;
import dev.driftlab.report.ResultJson;
import dev.driftlab.scenario.Clutter;
import dev.driftlab.scenario.Door;
import dev.driftlab.scenario.DoorState;
import dev.driftlab.scenario.Fault;
import dev.driftlab.scenario.FaultKind;
import dev.driftlab.scenario.Fixture;
import dev.driftlab.scenario.Room;
import dev.driftlab.scenario.Scenario;
import dev.driftlab.scenario.Trigger;
import dev.driftlab.sim.ScanGeometry;
import dev.driftlab.site.WallPieces;
import java.util.List;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;
import tools.jackson.databind.node.ArrayNode;
import tools.jackson.databind.node.ObjectNode;

/**
 * Builds the player's JSON: once per run a scene (believed map, where the actual world differs,
 * beam angles, faults, episodes and the per-frame series), then one document per stored chunk with
 * its frames. Metres and radians throughout; numbers are rounded to what a screen can show so a
 * chunk of 50 frames stays small.
 */
public final class SceneJson {

    private static final JsonMapper MAPPER = JsonMapper.builder().build();

    private SceneJson() {}

    /**
     * The scene of a run.
     *
     * @param scenario the scenario run
     * @param resultJson the run's stored result document, may be empty
     * @param chunks indexes of the stored chunks
     * @return a JSON object
     */
    public static ObjectNode scene(Scenario scenario, String resultJson, List<Integer> chunks) {
        ObjectNode o = MAPPER.createObjectNode();
        o.put("scenario", scenario.name());
        Bounds b = scenario.site().bounds().orElse(new Bounds(0, 0, 1, 1));
        o.putArray("bounds")
                .add(r(b.minX(), 3))
                .add(r(b.minY(), 3))
                .add(r(b.maxX(), 3))
                .add(r(b.maxY(), 3));
        ArrayNode walls = o.putArray("walls");
        for (Segment s : WallPieces.of(scenario.site(), Door::mapped)) {
            segment(walls.addArray(), s);
        }
        ArrayNode doors = o.putArray("doors");
        for (Door d : scenario.site().doors()) {
            scenario.site().opening(d).ifPresent(seg -> {
                ObjectNode n = doors.addObject();
                n.put("id", d.id());
                n.put("mapped", d.mapped() == DoorState.OPEN ? "open" : "closed");
                n.put("actual", d.actual() == DoorState.OPEN ? "open" : "closed");
                segment(n.putArray("at"), seg);
            });
        }
        ArrayNode fixtures = o.putArray("fixtures");
        for (Fixture f : scenario.site().fixtures()) {
            ObjectNode n = fixtures.addObject();
            n.put("name", f.name());
            outline(n.putArray("outline"), f.outline());
        }
        ArrayNode rooms = o.putArray("rooms");
        for (Room room : scenario.site().rooms()) {
            ObjectNode n = rooms.addObject();
            n.put("name", room.name());
            outline(n.putArray("outline"), room.outline());
        }
        ArrayNode clutter = o.putArray("clutter");
        for (Clutter c : scenario.site().clutter()) {
            ObjectNode n = clutter.addObject();
            n.put("name", c.name());
            put(n, "from", c.appearAt());
            put(n, "until", c.vanishAt());
            outline(n.putArray("outline"), c.outline());
        }
        ScanGeometry scan = ScanGeometry.of(scenario.rangefinder());
        ArrayNode beams = o.putArray("beams");
        for (double a : scan.copyAngles()) {
            beams.add(r(a, 5));
        }
        pose(o.putArray("mount"), scan.mount());
        o.put("maxRange", scan.maxRange());
        o.put("rate", scenario.rangefinder().rate());
        ArrayNode faults = o.putArray("faults");
        for (Fault f : scenario.faults()) {
            ObjectNode n = faults.addObject();
            n.put("id", f.id());
            FaultKind kind = FaultKind.of(f);
            n.put("kind", kind.fileName());
            n.put("label", kind.label());
            if (f.trigger() instanceof Trigger.AtTime at) {
                n.put("at", at.time());
            }
        }
        ArrayNode ch = o.putArray("chunks");
        chunks.forEach(ch::add);
        if (!resultJson.isBlank()) {
            JsonNode result = MAPPER.readTree(resultJson);
            JsonNode trials = result.path("trials");
            if (trials.isArray() && !trials.isEmpty()) {
                JsonNode first = trials.get(0);
                o.put("seed", first.path("seed").asLong());
                o.put("variant", first.path("variant").asString(""));
                JsonNode kidnaps = first.path("kidnaps");
                for (JsonNode k : kidnaps) {
                    // the player names the outcome's marks with the kind's label from the one list
                    if (k instanceof ObjectNode kn) {
                        kn.put("label", FaultKind.KIDNAP.label());
                    }
                }
                o.set("kidnaps", kidnaps);
                o.set("lost", first.path("lost"));
                o.set("convergenceTime", first.path("convergenceTime"));
                JsonNode end = first.path("end");
                if (end.isObject()) {
                    // how the played trial ended: the player marks an early end on its timeline
                    o.set("end", end);
                }
            }
            if (result.has("series")) {
                o.set("series", result.get("series"));
            }
        }
        return o;
    }

    /** Frames at most whose series the scene carries when the run's result has none. */
    public static final int MAX_SERIES_FRAMES = 6000;

    // Upper bounds of the written size, bytes: a number rounded as here within a 1 km site and its
    // separator, a name's character (escaped or non-ASCII), one frame of the series, the fixed
    // parts of a chunk's frame and of a hypothesis, one particle (x, y, relative weight), one range.
    private static final int NUMBER = 10;
    private static final int NAME_CHAR = 3;
    private static final int SERIES_FRAME = 9 * 14;
    private static final int FRAME_FIXED = 500;
    private static final int HYPOTHESIS = 7 * NUMBER + 3;
    private static final int PARTICLE = 8 + 8 + 6;
    private static final int RANGE = 8;

    /**
     * About how many bytes {@link #scene} writes for this scenario, worked out from its counts
     * before anything is built; at least the real size (the tests compare), so a budget checked
     * against it is kept.
     *
     * @param scenario the scenario run
     * @param resultChars length of the run's stored result document (the scene carries part of it)
     * @param frames frames recorded, whose series the scene carries when the result has none
     */
    public static long sceneBytes(Scenario scenario, long resultChars, int frames) {
        long bytes = 2_000 + 3L * scenario.name().length() * NAME_CHAR;
        long edges = 0;
        for (Room room : scenario.site().rooms()) {
            int corners = room.outline().corners().size();
            edges += corners;
            bytes += 40 + (long) room.name().length() * NAME_CHAR + 2L * corners * NUMBER;
        }
        // a door cuts the walls along its opening, usually two (one per room), each into two pieces at most
        long doors = scenario.site().doors().size();
        bytes += (edges + 2 * doors) * (4 * NUMBER + 3);
        for (Door d : scenario.site().doors()) {
            bytes += 80 + (long) d.id().length() * NAME_CHAR + 4 * NUMBER;
        }
        for (Fixture f : scenario.site().fixtures()) {
            bytes += 40
                    + (long) f.name().length() * NAME_CHAR
                    + 2L * f.outline().corners().size() * NUMBER;
        }
        for (Clutter c : scenario.site().clutter()) {
            bytes += 80
                    + (long) c.name().length() * NAME_CHAR
                    + 2L * c.outline().corners().size() * NUMBER;
        }
        bytes += (long) ScanGeometry.of(scenario.rangefinder()).beamCount() * NUMBER;
        for (Fault f : scenario.faults()) {
            bytes += 200 + (long) f.id().length() * NAME_CHAR;
        }
        bytes += resultChars + (long) Math.min(frames, MAX_SERIES_FRAMES) * SERIES_FRAME;
        return bytes;
    }

    /**
     * What a stored chunk's JSON would hold.
     *
     * @param frames frames in the chunk
     * @param particles particle states in all its frames
     * @param bytes about how many bytes {@link #chunk} writes for it, at least the real size
     */
    public record ChunkSize(int frames, long particles, long bytes) {}

    /**
     * The size of a stored chunk's JSON, read from the frames' heads without decoding them (see
     * {@code FrameCodec.shape}).
     *
     * @throws IllegalArgumentException when the chunk does not read
     */
    public static ChunkSize chunkSize(byte[] chunk) {
        int count = FrameChunk.frameCount(chunk);
        long bytes = 100;
        long particles = 0;
        for (int i = 0; i < count; i++) {
            FrameCodec.Shape s = FrameChunk.shape(chunk, i);
            particles += s.particles();
            bytes += FRAME_FIXED
                    + (long) s.hypotheses() * HYPOTHESIS
                    + (long) s.eventChars() * NAME_CHAR
                    + (long) s.beams() * RANGE
                    + (long) s.particles() * PARTICLE;
        }
        return new ChunkSize(count, particles, bytes);
    }

    /**
     * The series of a run's recorded frames, read a chunk at a time, so only one frame's particles
     * are held at once.
     *
     * @param chunks the run's stored chunks in order
     * @throws IllegalArgumentException when a chunk does not read
     */
    public static ObjectNode series(Iterable<byte[]> chunks) {
        RunTrace trace = new RunTrace();
        for (byte[] chunk : chunks) {
            int n = FrameChunk.frameCount(chunk);
            for (int i = 0; i < n; i++) {
                Frame f = FrameChunk.frame(chunk, i);
                trace.add(
                        f.time(),
                        f.truth().x(),
                        f.truth().y(),
                        f.truth().heading(),
                        f.estimate().x(),
                        f.estimate().y(),
                        f.estimate().heading(),
                        f.meanLikelihood(),
                        f.effectiveSize(),
                        f.particleCount(),
                        f.injected(),
                        f.slowAverage(),
                        f.fastAverage());
            }
        }
        return ResultJson.series(trace);
    }

    /** The answer as the bytes sent, so a kept answer weighs what it holds. */
    public static byte[] bytes(JsonNode node) {
        return MAPPER.writeValueAsBytes(node);
    }

    /**
     * The frames of one stored chunk.
     *
     * @param chunk the chunk as the recorder wrote it
     * @return a JSON object with {@code first} and {@code frames}
     * @throws IllegalArgumentException when the chunk does not read
     */
    public static ObjectNode chunk(byte[] chunk) {
        int count = FrameChunk.frameCount(chunk);
        ObjectNode o = MAPPER.createObjectNode();
        o.put("first", FrameChunk.firstFrame(chunk));
        ArrayNode frames = o.putArray("frames");
        for (int i = 0; i < count; i++) {
            frame(frames.addObject(), FrameChunk.frame(chunk, i));
        }
        return o;
    }

    private static void frame(ObjectNode n, Frame f) {
        n.put("i", f.index());
        n.put("t", r(f.time(), 3));
        pose(n.putArray("truth"), f.truth());
        pose(n.putArray("odometry"), f.odometry());
        pose(n.putArray("estimate"), f.estimate());
        ArrayNode hyp = n.putArray("hypotheses");
        for (FrameHypothesis h : f.hypotheses()) {
            ArrayNode a = hyp.addArray();
            a.add(r(h.weight(), 4));
            a.add(r(h.x(), 3));
            a.add(r(h.y(), 3));
            a.add(r(h.heading(), 4));
            // an outside localizer may give no covariance: null, never a zero spread
            for (double v : new double[] {h.cxx(), h.cxy(), h.cyy()}) {
                if (Double.isFinite(v)) {
                    a.add(r(v, 6));
                } else {
                    a.addNull();
                }
            }
        }
        put(n, "ess", Double.isFinite(f.effectiveSize()) ? r(f.effectiveSize(), 1) : Double.NaN);
        put(n, "likelihood", f.meanLikelihood());
        put(n, "slow", f.slowAverage());
        put(n, "fast", f.fastAverage());
        n.put("injected", f.injected());
        n.put("particles", f.particleCount());
        ArrayNode ranges = n.putArray("ranges");
        for (float v : f.ranges()) {
            ranges.add(r(v, 3));
        }
        ArrayNode px = n.putArray("px");
        ArrayNode py = n.putArray("py");
        ArrayNode pw = n.putArray("pw");
        float max = 0;
        for (float w : f.particleWeight()) {
            max = Math.max(max, w);
        }
        for (int i = 0; i < f.particleCount(); i++) {
            px.add(r(f.particleX()[i], 2));
            py.add(r(f.particleY()[i], 2));
            // relative to the heaviest particle, so shading does not depend on the particle count
            pw.add(max > 0 ? r(f.particleWeight()[i] / max, 3) : 0);
        }
        ArrayNode events = n.putArray("events");
        f.events().forEach(events::add);
    }

    private static void segment(ArrayNode a, Segment s) {
        a.add(r(s.a().x(), 3));
        a.add(r(s.a().y(), 3));
        a.add(r(s.b().x(), 3));
        a.add(r(s.b().y(), 3));
    }

    private static void outline(ArrayNode a, Polygon p) {
        for (Point c : p.corners()) {
            a.add(r(c.x(), 3));
            a.add(r(c.y(), 3));
        }
    }

    private static void pose(ArrayNode a, Pose p) {
        a.add(r(p.x(), 4));
        a.add(r(p.y(), 4));
        a.add(r(p.heading(), 5));
    }

    private static void put(ObjectNode n, String key, double v) {
        if (Double.isFinite(v)) {
            n.put(key, v);
        } else {
            n.putNull(key);
        }
    }

    private static double r(double v, int places) {
        if (!Double.isFinite(v)) {
            return 0;
        }
        double f = Math.pow(10, places);
        return Math.round(v * f) / f;
    }
}
