package dev.driftlab.scenario;

import dev.driftlab.geometry.Point;
import dev.driftlab.geometry.Polygon;
import dev.driftlab.geometry.Pose;
import dev.driftlab.scenario.LocalizerSettings.MotionNoise;
import dev.driftlab.scenario.LocalizerSettings.Particles;
import dev.driftlab.scenario.LocalizerSettings.RangeModel;
import dev.driftlab.scenario.LocalizerSettings.Recovery;
import dev.driftlab.scenario.LocalizerSettings.Resampling;
import java.math.BigDecimal;
import java.math.RoundingMode;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import tools.jackson.core.JacksonException;
import tools.jackson.core.StreamReadFeature;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.SerializationFeature;
import tools.jackson.databind.json.JsonMapper;
import tools.jackson.databind.node.ArrayNode;
import tools.jackson.databind.node.ObjectNode;

/**
 * The scenario file format: JSON with metres, seconds and degrees, read into records in SI units
 * and radians. Reading reports every format problem at once (wrong types, missing or unknown keys,
 * numbers that are not finite, a newer format version) as a {@link ScenarioException}; semantic
 * checks are the {@link ScenarioValidator}'s job.
 */
public final class ScenarioJson {

    /** Name part of the {@code format} key. */
    public static final String FORMAT_NAME = "driftlab-scenario";
    /** Version this build reads and writes. */
    public static final int FORMAT_VERSION = 1;
    /** The full {@code format} value this build writes. */
    public static final String FORMAT = FORMAT_NAME + "/" + FORMAT_VERSION;

    private static final JsonMapper MAPPER = JsonMapper.builder()
            .enable(SerializationFeature.INDENT_OUTPUT)
            .enable(StreamReadFeature.STRICT_DUPLICATE_DETECTION)
            .build();

    private ScenarioJson() {}

    /**
     * Reads a scenario document.
     *
     * @throws ScenarioException with every problem found when the document cannot be read
     */
    public static Scenario read(String json) {
        if (json == null) {
            throw new ScenarioException(List.of(Problem.error("(document)", "is empty")));
        }
        JsonNode root;
        try {
            root = MAPPER.readTree(json);
        } catch (JacksonException e) {
            throw new ScenarioException(List.of(Problem.error("(document)", JsonTrouble.describe(e))));
        }
        if (root == null || root.isMissingNode()) {
            throw new ScenarioException(List.of(Problem.error("(document)", "is empty")));
        }
        List<Problem> problems = new ArrayList<>();
        Scenario scenario;
        try {
            scenario = new Reader(problems).scenario(root);
        } catch (JacksonException e) {
            String path = JsonTrouble.path(e);
            problems.add(Problem.error(path.isEmpty() ? "(document)" : path, JsonTrouble.describe(e)));
            scenario = null;
        }
        if (problems.stream().anyMatch(Problem::isError) || scenario == null) {
            throw new ScenarioException(problems);
        }
        return scenario;
    }

    /** Name and version of a settings-variants document. */
    public static final String VARIANTS_FORMAT = "driftlab-variants/1";

    /**
     * Reads a settings-variants document, {@code {"format": "driftlab-variants/1", "variants": [...]}},
     * whose variants have the same shape as a scenario's {@code variants}: a name and the settings that
     * differ from the scenario's own.
     *
     * @param json the document
     * @param base the scenario the variants change
     * @throws ScenarioException with every problem found
     */
    public static List<SettingsVariant> readVariants(String json, Scenario base) {
        JsonNode root;
        try {
            root = MAPPER.readTree(json == null ? "" : json);
        } catch (JacksonException e) {
            throw new ScenarioException(List.of(Problem.error("(document)", JsonTrouble.describe(e))));
        }
        List<Problem> problems = new ArrayList<>();
        JsonFields f = JsonFields.of(root, "", problems);
        String format = f.requiredText("format", JsonFields.MAX_NAME);
        if (f.has("format") && !format.equals(VARIANTS_FORMAT)) {
            problems.add(Problem.error("format", "must be \"" + VARIANTS_FORMAT + "\", got \"" + format + "\""));
        }
        JsonNode baseNode = Writer.localizer(base.localizer());
        Reader reader = new Reader(problems);
        List<SettingsVariant> variants;
        try {
            variants = f.list("variants", (n, p) -> reader.variant(n, p, baseNode));
        } catch (JacksonException e) {
            problems.add(Problem.error("(document)", JsonTrouble.describe(e)));
            variants = List.of();
        }
        f.finish();
        if (!f.has("variants")) {
            f.missing("variants");
        }
        for (int i = 0; i < variants.size(); i++) {
            problems.addAll(ScenarioValidator.validateSettings(
                    variants.get(i).settings(), base.rangefinder().beams(), "variants[" + i + "].localizer"));
        }
        if (problems.stream().anyMatch(Problem::isError)) {
            throw new ScenarioException(problems);
        }
        return variants;
    }

    /** Writes a scenario as an indented JSON document that {@link #read} reads back equal. */
    public static String write(Scenario s) {
        return MAPPER.writeValueAsString(Writer.scenario(s));
    }

    static double deg(double degrees) {
        return Math.toRadians(degrees);
    }

    /** Degrees rounded to 9 decimals so that file -> radians -> file gives the same text. */
    static double toDeg(double radians) {
        return BigDecimal.valueOf(Math.toDegrees(radians))
                .setScale(9, RoundingMode.HALF_EVEN)
                .doubleValue();
    }

    /** Reading: JSON tree to records. */
    private static final class Reader {
        private final List<Problem> problems;

        Reader(List<Problem> problems) {
            this.problems = problems;
        }

        Scenario scenario(JsonNode root) {
            JsonFields f = JsonFields.of(root, "", problems);
            checkFormat(f);
            String name = f.requiredText("name", JsonFields.MAX_NAME);
            String description = f.text("description", "", JsonFields.MAX_TEXT);
            SitePlan site = site(f.requiredObject("site"));
            Robot robot = robot(f.object("robot"));
            Rangefinder rangefinder = rangefinder(f.object("rangefinder"));
            Route route = route(f.requiredObject("route"));
            List<Fault> faults = f.list("faults", this::fault);
            JsonNode localizerNode = f.raw("localizer");
            LocalizerSettings localizer = localizer(f.object("localizer"));
            List<SettingsVariant> variants = f.list("variants", (n, p) -> variant(n, p, localizerNode));
            List<Gate> gates = f.list("gates", this::gate);
            f.finish();
            return new Scenario(name, description, site, robot, rangefinder, route, faults, localizer, variants, gates);
        }

        void checkFormat(JsonFields f) {
            if (!f.has("format")) {
                f.missing("format");
                return;
            }
            String format = f.textValue(f.raw("format"), "format", JsonFields.MAX_NAME);
            String prefix = FORMAT_NAME + "/";
            if (!format.startsWith(prefix)) {
                problems.add(Problem.error("format", "must be \"" + FORMAT + "\", got \"" + format + "\""));
                return;
            }
            int version;
            try {
                version = Integer.parseInt(format.substring(prefix.length()));
            } catch (NumberFormatException e) {
                problems.add(Problem.error("format", "has no version number: \"" + format + "\""));
                return;
            }
            if (version > FORMAT_VERSION) {
                problems.add(Problem.error(
                        "format",
                        "version " + version + " is newer than this Driftlab reads (" + FORMAT_VERSION
                                + "); update Driftlab to open this file"));
            } else if (version < 1) {
                problems.add(Problem.error("format", "version " + version + " does not exist"));
            }
        }

        SitePlan site(JsonFields f) {
            List<Room> rooms = f.list("rooms", this::room);
            List<Door> doors = f.list("doors", this::door);
            List<Fixture> fixtures = f.list("fixtures", this::fixture);
            List<FloorZone> zones = f.list("floorZones", this::floorZone);
            List<Clutter> clutter = f.list("clutter", this::clutter);
            f.finish();
            return new SitePlan(rooms, doors, fixtures, zones, clutter);
        }

        Room room(JsonNode n, String p) {
            JsonFields f = JsonFields.of(n, p, problems);
            String id = f.requiredText("id", JsonFields.MAX_NAME);
            String name = f.text("name", id, JsonFields.MAX_NAME);
            Polygon outline = outline(f);
            f.finish();
            return new Room(id, name, outline);
        }

        Door door(JsonNode n, String p) {
            JsonFields f = JsonFields.of(n, p, problems);
            String id = f.requiredText("id", JsonFields.MAX_NAME);
            String room = f.requiredText("room", JsonFields.MAX_NAME);
            int wall = f.requiredInteger("wall");
            double along = f.requiredNumber("along");
            double width = f.requiredNumber("width");
            DoorState mapped = f.choice("mapped", DoorState.class, DoorState.OPEN);
            DoorState actual = f.choice("actual", DoorState.class, mapped);
            f.finish();
            return new Door(id, room, wall, along, width, mapped, actual);
        }

        Fixture fixture(JsonNode n, String p) {
            JsonFields f = JsonFields.of(n, p, problems);
            String id = f.requiredText("id", JsonFields.MAX_NAME);
            String name = f.text("name", id, JsonFields.MAX_NAME);
            Polygon outline = outline(f);
            f.finish();
            return new Fixture(id, name, outline);
        }

        FloorZone floorZone(JsonNode n, String p) {
            JsonFields f = JsonFields.of(n, p, problems);
            String id = f.requiredText("id", JsonFields.MAX_NAME);
            String name = f.text("name", id, JsonFields.MAX_NAME);
            Surface surface = f.requiredChoice("surface", Surface.class, Surface.TILE);
            Polygon outline = outline(f);
            double slip = f.number("slip", 0);
            double noise = f.number("noiseFactor", 1);
            f.finish();
            return new FloorZone(id, name, surface, outline, slip, noise);
        }

        Clutter clutter(JsonNode n, String p) {
            JsonFields f = JsonFields.of(n, p, problems);
            String id = f.requiredText("id", JsonFields.MAX_NAME);
            String name = f.text("name", id, JsonFields.MAX_NAME);
            Polygon outline = outline(f);
            double appear = f.number("appearAt", 0);
            double vanish = f.number("vanishAt", Double.POSITIVE_INFINITY);
            f.finish();
            return new Clutter(id, name, outline, appear, vanish);
        }

        Polygon outline(JsonFields f) {
            List<Point> corners = f.has("outline") ? f.list("outline", this::point) : missingList(f, "outline");
            return new Polygon(corners);
        }

        <T> List<T> missingList(JsonFields f, String key) {
            f.missing(key);
            return List.of();
        }

        Point point(JsonNode n, String p) {
            if (n == null || !n.isArray() || n.size() != 2) {
                problems.add(Problem.error(p, "must be a corner [x, y] in metres, got " + JsonFields.describe(n)));
                return null;
            }
            JsonFields dummy = JsonFields.of(MAPPER.createObjectNode(), p, problems);
            double x = dummy.numberValue(n.get(0), p + "[0]");
            double y = dummy.numberValue(n.get(1), p + "[1]");
            return new Point(x, y);
        }

        Robot robot(JsonFields f) {
            Robot d = Robot.typical();
            Robot r = new Robot(
                    f.number("wheelbase", d.wheelbase()),
                    f.number("wheelRadius", d.wheelRadius()),
                    f.integer("ticksPerTurn", d.ticksPerTurn()),
                    f.number("footprintRadius", d.footprintRadius()),
                    f.number("leftWheelScale", d.leftWheelScale()),
                    f.number("rightWheelScale", d.rightWheelScale()),
                    f.number("wheelbaseScale", d.wheelbaseScale()),
                    f.number("wheelNoise", d.wheelNoise()),
                    f.number("maxSpeed", d.maxSpeed()),
                    deg(f.number("maxTurnRate", toDeg(d.maxTurnRate()))),
                    f.number("maxAcceleration", d.maxAcceleration()));
            f.finish();
            return r;
        }

        Rangefinder rangefinder(JsonFields f) {
            Rangefinder d = Rangefinder.typical();
            int beams = f.integer("beams", d.beams());
            double fov = deg(f.number("fieldOfView", toDeg(d.fieldOfView())));
            double maxRange = f.number("maxRange", d.maxRange());
            double sigma = f.number("rangeSigma", d.rangeSigma());
            double rate = f.number("rate", d.rate());
            Pose mount = d.mount();
            if (f.has("mount")) {
                JsonFields m = f.object("mount");
                mount = Pose.of(m.number("forward", 0), m.number("left", 0), deg(m.number("turn", 0)));
                m.finish();
            }
            double dropout = f.number("dropout", d.dropout());
            f.finish();
            return new Rangefinder(beams, fov, maxRange, sigma, rate, mount, dropout);
        }

        Route route(JsonFields f) {
            Pose start = pose(f.requiredObject("start"));
            List<Waypoint> waypoints = f.list("waypoints", this::waypoint);
            double settle = f.number("settle", 5);
            boolean contactAllowed = f.bool("contactAllowed", false);
            f.finish();
            return new Route(start, waypoints, settle, contactAllowed);
        }

        Pose pose(JsonFields f) {
            double x = f.requiredNumber("x");
            double y = f.requiredNumber("y");
            double heading = f.number("heading", 0);
            f.finish();
            return Pose.of(x, y, deg(heading));
        }

        Waypoint waypoint(JsonNode n, String p) {
            JsonFields f = JsonFields.of(n, p, problems);
            Waypoint w = new Waypoint(
                    f.requiredNumber("x"), f.requiredNumber("y"), f.number("speed", 0.5), f.number("dwell", 0));
            f.finish();
            return w;
        }

        Fault fault(JsonNode n, String p) {
            JsonFields f = JsonFields.of(n, p, problems);
            String id = f.requiredText("id", JsonFields.MAX_NAME);
            FaultKind kind = f.requiredChoice("kind", FaultKind.class, null);
            Trigger trigger = trigger(f);
            if (kind == null) {
                return null;
            }
            Fault fault = switch (kind) {
                case SLIP ->
                    new Fault.Slip(
                            id,
                            trigger,
                            f.requiredChoice("wheel", Wheel.class, Wheel.LEFT),
                            f.requiredNumber("fraction"),
                            f.requiredNumber("duration"));
                case STALL ->
                    new Fault.Stall(
                            id,
                            trigger,
                            f.requiredChoice("wheel", Wheel.class, Wheel.LEFT),
                            f.requiredNumber("duration"),
                            f.bool("encoderSeesIt", false));
                case KIDNAP -> new Fault.Kidnap(id, trigger, pose(f.requiredObject("to")));
                case BUMP ->
                    new Fault.Bump(id, trigger, f.number("forward", 0), f.number("left", 0), deg(f.number("turn", 0)));
                case DOOR_CHANGE ->
                    new Fault.DoorChange(
                            id,
                            trigger,
                            f.requiredText("door", JsonFields.MAX_NAME),
                            f.requiredChoice("state", DoorState.class, DoorState.CLOSED));
                case CLUTTER ->
                    new Fault.ClutterChange(
                            id,
                            trigger,
                            f.requiredText("clutter", JsonFields.MAX_NAME),
                            f.requiredChoice("action", ClutterAction.class, ClutterAction.APPEAR)
                                    == ClutterAction.APPEAR);
                case BLACKOUT -> new Fault.Blackout(id, trigger, f.requiredNumber("duration"));
                case NOISE_BURST ->
                    new Fault.NoiseBurst(id, trigger, f.requiredNumber("duration"), f.requiredNumber("factor"));
                case SPURIOUS_MAX_RANGE ->
                    new Fault.SpuriousMaxRange(id, trigger, f.requiredNumber("duration"), f.requiredNumber("share"));
            };
            f.finish();
            return fault;
        }

        Trigger trigger(JsonFields f) {
            boolean at = f.has("at");
            boolean enters = f.has("enters");
            boolean near = f.has("near");
            int count = (at ? 1 : 0) + (enters ? 1 : 0) + (near ? 1 : 0);
            if (count != 1) {
                problems.add(Problem.error(
                        f.path(),
                        count == 0
                                ? "needs a trigger: \"at\" (seconds), \"enters\" (room or zone id) or \"near\""
                                : "has more than one trigger; give only one of \"at\", \"enters\", \"near\""));
                return new Trigger.AtTime(0);
            }
            if (at) {
                return new Trigger.AtTime(f.number("at", 0));
            }
            if (enters) {
                return new Trigger.OnEntering(f.requiredText("enters", JsonFields.MAX_NAME));
            }
            JsonFields nf = f.object("near");
            Trigger t = new Trigger.NearPoint(
                    new Point(nf.requiredNumber("x"), nf.requiredNumber("y")), nf.requiredNumber("radius"));
            nf.finish();
            return t;
        }

        LocalizerSettings localizer(JsonFields f) {
            LocalizerSettings d = LocalizerSettings.defaults();
            Particles particles = particles(f.object("particles"), d.particles());
            MotionNoise motion = motionNoise(f.object("motionNoise"), d.motionNoise());
            RangeModel range = rangeModel(f.object("rangeModel"), d.rangeModel());
            Resampling resampling = resampling(f.object("resampling"), d.resampling());
            Recovery recovery = recovery(f.object("recovery"), d.recovery());
            f.finish();
            return new LocalizerSettings(particles, motion, range, resampling, recovery);
        }

        Particles particles(JsonFields f, Particles d) {
            Particles p = new Particles(
                    f.integer("count", d.count()),
                    f.bool("adaptive", d.adaptive()),
                    f.integer("minCount", d.minCount()),
                    f.integer("maxCount", d.maxCount()),
                    f.number("errorBound", d.errorBound()),
                    f.number("confidence", d.confidence()),
                    f.number("binSize", d.binSize()),
                    deg(f.number("binTurn", toDeg(d.binTurn()))),
                    f.choice("start", LocalizerSettings.Start.class, d.start()),
                    f.number("startSpread", d.startSpread()),
                    deg(f.number("startTurnSpread", toDeg(d.startTurnSpread()))));
            f.finish();
            return p;
        }

        MotionNoise motionNoise(JsonFields f, MotionNoise d) {
            MotionNoise m = new MotionNoise(
                    f.number("turnFromTurn", d.turnFromTurn()),
                    f.number("turnFromDrive", d.turnFromDrive()),
                    f.number("driveFromDrive", d.driveFromDrive()),
                    f.number("driveFromTurn", d.driveFromTurn()),
                    f.number("minTravel", d.minTravel()),
                    deg(f.number("minTurn", toDeg(d.minTurn()))));
            f.finish();
            return m;
        }

        RangeModel rangeModel(JsonFields f, RangeModel d) {
            RangeModel r = new RangeModel(
                    f.choice("kind", LocalizerSettings.RangeModelKind.class, d.kind()),
                    f.integer("beamStep", d.beamStep()),
                    f.number("hitWeight", d.hitWeight()),
                    f.number("shortWeight", d.shortWeight()),
                    f.number("maxWeight", d.maxWeight()),
                    f.number("randomWeight", d.randomWeight()),
                    f.number("hitSpread", d.hitSpread()),
                    f.number("shortDecay", d.shortDecay()),
                    f.number("cellSize", d.cellSize()));
            f.finish();
            return r;
        }

        Resampling resampling(JsonFields f, Resampling d) {
            Resampling r = new Resampling(
                    f.choice("scheme", LocalizerSettings.Scheme.class, d.scheme()),
                    f.choice("when", LocalizerSettings.ResampleWhen.class, d.when()),
                    f.number("essFraction", d.essFraction()));
            f.finish();
            return r;
        }

        Recovery recovery(JsonFields f, Recovery d) {
            Recovery r = new Recovery(
                    f.bool("injection", d.injection()),
                    f.number("slowRate", d.slowRate()),
                    f.number("fastRate", d.fastRate()),
                    f.bool("sensorReset", d.sensorReset()),
                    f.number("resetShare", d.resetShare()),
                    f.number("resetBelow", d.resetBelow()));
            f.finish();
            return r;
        }

        SettingsVariant variant(JsonNode n, String p, JsonNode baseLocalizer) {
            JsonFields f = JsonFields.of(n, p, problems);
            String name = f.requiredText("name", JsonFields.MAX_NAME);
            JsonNode changes = f.raw("localizer");
            f.finish();
            if (changes != null && !changes.isObject()) {
                problems.add(Problem.error(f.at("localizer"), "must be an object { ... }"));
                return null;
            }
            JsonNode merged = merge(baseLocalizer, changes);
            LocalizerSettings settings = localizer(JsonFields.of(merged, f.at("localizer"), problems));
            return new SettingsVariant(name, settings);
        }

        Gate gate(JsonNode n, String p) {
            JsonFields f = JsonFields.of(n, p, problems);
            Gate g = new Gate(
                    f.requiredText("id", JsonFields.MAX_NAME),
                    f.requiredChoice("metric", GateMetric.class, GateMetric.RECOVERY_TIME),
                    f.number("bound", 0),
                    f.number("share", 1.0),
                    f.choice("judgedBy", GateRule.class, GateRule.OBSERVED_SHARE));
            f.finish();
            return g;
        }
    }

    /** Deep merge: keys of {@code changes} replace those of {@code base}; objects merge recursively. */
    static JsonNode merge(JsonNode base, JsonNode changes) {
        ObjectNode out = base != null && base.isObject() ? ((ObjectNode) base).deepCopy() : MAPPER.createObjectNode();
        if (changes == null || !changes.isObject()) {
            return out;
        }
        for (Map.Entry<String, JsonNode> e : changes.properties()) {
            JsonNode existing = out.get(e.getKey());
            if (existing != null && existing.isObject() && e.getValue().isObject()) {
                out.set(e.getKey(), merge(existing, e.getValue()));
            } else {
                out.set(e.getKey(), e.getValue().deepCopy());
            }
        }
        return out;
    }

    /** Keys of {@code variant} that differ from {@code base}, recursively; the inverse of merge. */
    static ObjectNode diff(ObjectNode base, ObjectNode variant) {
        ObjectNode out = MAPPER.createObjectNode();
        for (Map.Entry<String, JsonNode> e : variant.properties()) {
            JsonNode b = base.get(e.getKey());
            JsonNode v = e.getValue();
            if (b != null && b.isObject() && v.isObject()) {
                ObjectNode sub = diff((ObjectNode) b, (ObjectNode) v);
                if (!sub.isEmpty()) {
                    out.set(e.getKey(), sub);
                }
            } else if (!v.equals(b)) {
                out.set(e.getKey(), v);
            }
        }
        return out;
    }

    /** Fault kinds as spelled in the file. */
    enum FaultKind {
        SLIP,
        STALL,
        KIDNAP,
        BUMP,
        DOOR_CHANGE,
        CLUTTER,
        BLACKOUT,
        NOISE_BURST,
        SPURIOUS_MAX_RANGE
    }

    /** What a clutter fault does. */
    enum ClutterAction {
        APPEAR,
        VANISH
    }

    /** Writing: records to a JSON tree, every key explicit. */
    private static final class Writer {

        static ObjectNode scenario(Scenario s) {
            ObjectNode o = MAPPER.createObjectNode();
            o.put("format", FORMAT);
            o.put("name", s.name());
            o.put("description", s.description());
            o.set("site", site(s.site()));
            o.set("robot", robot(s.robot()));
            o.set("rangefinder", rangefinder(s.rangefinder()));
            o.set("route", route(s.route()));
            ArrayNode faults = o.putArray("faults");
            s.faults().forEach(f -> faults.add(fault(f)));
            ObjectNode base = localizer(s.localizer());
            o.set("localizer", base);
            ArrayNode variants = o.putArray("variants");
            for (SettingsVariant v : s.variants()) {
                ObjectNode vn = variants.addObject();
                vn.put("name", v.name());
                vn.set("localizer", diff(base, localizer(v.settings())));
            }
            ArrayNode gates = o.putArray("gates");
            for (Gate g : s.gates()) {
                ObjectNode gn = gates.addObject();
                gn.put("id", g.id());
                gn.put("metric", JsonFields.fileName(g.metric()));
                gn.put("bound", g.bound());
                gn.put("share", g.share());
                if (g.rule() != GateRule.OBSERVED_SHARE) {
                    gn.put("judgedBy", g.rule().fileName());
                }
            }
            return o;
        }

        static ObjectNode site(SitePlan site) {
            ObjectNode o = MAPPER.createObjectNode();
            ArrayNode rooms = o.putArray("rooms");
            for (Room r : site.rooms()) {
                ObjectNode n = rooms.addObject();
                n.put("id", r.id());
                n.put("name", r.name());
                n.set("outline", outline(r.outline()));
            }
            ArrayNode doors = o.putArray("doors");
            for (Door d : site.doors()) {
                ObjectNode n = doors.addObject();
                n.put("id", d.id());
                n.put("room", d.room());
                n.put("wall", d.wall());
                n.put("along", d.along());
                n.put("width", d.width());
                n.put("mapped", JsonFields.fileName(d.mapped()));
                n.put("actual", JsonFields.fileName(d.actual()));
            }
            ArrayNode fixtures = o.putArray("fixtures");
            for (Fixture f : site.fixtures()) {
                ObjectNode n = fixtures.addObject();
                n.put("id", f.id());
                n.put("name", f.name());
                n.set("outline", outline(f.outline()));
            }
            ArrayNode zones = o.putArray("floorZones");
            for (FloorZone z : site.floorZones()) {
                ObjectNode n = zones.addObject();
                n.put("id", z.id());
                n.put("name", z.name());
                n.put("surface", JsonFields.fileName(z.surface()));
                n.set("outline", outline(z.outline()));
                n.put("slip", z.slip());
                n.put("noiseFactor", z.noiseFactor());
            }
            ArrayNode clutter = o.putArray("clutter");
            for (Clutter c : site.clutter()) {
                ObjectNode n = clutter.addObject();
                n.put("id", c.id());
                n.put("name", c.name());
                n.set("outline", outline(c.outline()));
                n.put("appearAt", c.appearAt());
                if (Double.isFinite(c.vanishAt())) {
                    n.put("vanishAt", c.vanishAt());
                }
            }
            return o;
        }

        static ArrayNode outline(Polygon p) {
            ArrayNode a = MAPPER.createArrayNode();
            for (Point c : p.corners()) {
                a.addArray().add(c.x()).add(c.y());
            }
            return a;
        }

        static ObjectNode robot(Robot r) {
            ObjectNode o = MAPPER.createObjectNode();
            o.put("wheelbase", r.wheelbase());
            o.put("wheelRadius", r.wheelRadius());
            o.put("ticksPerTurn", r.ticksPerTurn());
            o.put("footprintRadius", r.footprintRadius());
            o.put("leftWheelScale", r.leftWheelScale());
            o.put("rightWheelScale", r.rightWheelScale());
            o.put("wheelbaseScale", r.wheelbaseScale());
            o.put("wheelNoise", r.wheelNoise());
            o.put("maxSpeed", r.maxSpeed());
            o.put("maxTurnRate", toDeg(r.maxTurnRate()));
            o.put("maxAcceleration", r.maxAcceleration());
            return o;
        }

        static ObjectNode rangefinder(Rangefinder r) {
            ObjectNode o = MAPPER.createObjectNode();
            o.put("beams", r.beams());
            o.put("fieldOfView", toDeg(r.fieldOfView()));
            o.put("maxRange", r.maxRange());
            o.put("rangeSigma", r.rangeSigma());
            o.put("rate", r.rate());
            ObjectNode m = o.putObject("mount");
            m.put("forward", r.mount().x());
            m.put("left", r.mount().y());
            m.put("turn", toDeg(r.mount().heading()));
            o.put("dropout", r.dropout());
            return o;
        }

        static ObjectNode pose(Pose p) {
            ObjectNode o = MAPPER.createObjectNode();
            o.put("x", p.x());
            o.put("y", p.y());
            o.put("heading", toDeg(p.heading()));
            return o;
        }

        static ObjectNode route(Route r) {
            ObjectNode o = MAPPER.createObjectNode();
            o.set("start", pose(r.start()));
            ArrayNode w = o.putArray("waypoints");
            for (Waypoint p : r.waypoints()) {
                ObjectNode n = w.addObject();
                n.put("x", p.x());
                n.put("y", p.y());
                n.put("speed", p.speed());
                n.put("dwell", p.dwell());
            }
            o.put("settle", r.settle());
            if (r.contactAllowed()) {
                o.put("contactAllowed", true);
            }
            return o;
        }

        static ObjectNode fault(Fault f) {
            ObjectNode o = MAPPER.createObjectNode();
            o.put("id", f.id());
            Trigger trigger = f.trigger();
            if (trigger instanceof Trigger.AtTime t) {
                o.put("at", t.time());
            } else if (trigger instanceof Trigger.OnEntering t) {
                o.put("enters", t.place());
            } else if (trigger instanceof Trigger.NearPoint t) {
                ObjectNode n = o.putObject("near");
                n.put("x", t.point().x());
                n.put("y", t.point().y());
                n.put("radius", t.radius());
            }
            if (f instanceof Fault.Slip s) {
                o.put("kind", "slip");
                o.put("wheel", JsonFields.fileName(s.wheel()));
                o.put("fraction", s.fraction());
                o.put("duration", s.duration());
            } else if (f instanceof Fault.Stall s) {
                o.put("kind", "stall");
                o.put("wheel", JsonFields.fileName(s.wheel()));
                o.put("duration", s.duration());
                o.put("encoderSeesIt", s.encoderSeesIt());
            } else if (f instanceof Fault.Kidnap k) {
                o.put("kind", "kidnap");
                o.set("to", pose(k.to()));
            } else if (f instanceof Fault.Bump b) {
                o.put("kind", "bump");
                o.put("forward", b.forward());
                o.put("left", b.left());
                o.put("turn", toDeg(b.turn()));
            } else if (f instanceof Fault.DoorChange d) {
                o.put("kind", "door-change");
                o.put("door", d.door());
                o.put("state", JsonFields.fileName(d.state()));
            } else if (f instanceof Fault.ClutterChange c) {
                o.put("kind", "clutter");
                o.put("clutter", c.clutter());
                o.put("action", c.present() ? "appear" : "vanish");
            } else if (f instanceof Fault.Blackout b) {
                o.put("kind", "blackout");
                o.put("duration", b.duration());
            } else if (f instanceof Fault.NoiseBurst n) {
                o.put("kind", "noise-burst");
                o.put("duration", n.duration());
                o.put("factor", n.factor());
            } else if (f instanceof Fault.SpuriousMaxRange s) {
                o.put("kind", "spurious-max-range");
                o.put("duration", s.duration());
                o.put("share", s.share());
            }
            return o;
        }

        static ObjectNode localizer(LocalizerSettings s) {
            ObjectNode o = MAPPER.createObjectNode();
            Particles p = s.particles();
            ObjectNode pn = o.putObject("particles");
            pn.put("count", p.count());
            pn.put("adaptive", p.adaptive());
            pn.put("minCount", p.minCount());
            pn.put("maxCount", p.maxCount());
            pn.put("errorBound", p.errorBound());
            pn.put("confidence", p.confidence());
            pn.put("binSize", p.binSize());
            pn.put("binTurn", toDeg(p.binTurn()));
            pn.put("start", JsonFields.fileName(p.start()));
            pn.put("startSpread", p.startSpread());
            pn.put("startTurnSpread", toDeg(p.startTurnSpread()));
            MotionNoise m = s.motionNoise();
            ObjectNode mn = o.putObject("motionNoise");
            mn.put("turnFromTurn", m.turnFromTurn());
            mn.put("turnFromDrive", m.turnFromDrive());
            mn.put("driveFromDrive", m.driveFromDrive());
            mn.put("driveFromTurn", m.driveFromTurn());
            mn.put("minTravel", m.minTravel());
            mn.put("minTurn", toDeg(m.minTurn()));
            RangeModel r = s.rangeModel();
            ObjectNode rn = o.putObject("rangeModel");
            rn.put("kind", JsonFields.fileName(r.kind()));
            rn.put("beamStep", r.beamStep());
            rn.put("hitWeight", r.hitWeight());
            rn.put("shortWeight", r.shortWeight());
            rn.put("maxWeight", r.maxWeight());
            rn.put("randomWeight", r.randomWeight());
            rn.put("hitSpread", r.hitSpread());
            rn.put("shortDecay", r.shortDecay());
            rn.put("cellSize", r.cellSize());
            Resampling re = s.resampling();
            ObjectNode ren = o.putObject("resampling");
            ren.put("scheme", JsonFields.fileName(re.scheme()));
            ren.put("when", JsonFields.fileName(re.when()));
            ren.put("essFraction", re.essFraction());
            Recovery rc = s.recovery();
            ObjectNode rcn = o.putObject("recovery");
            rcn.put("injection", rc.injection());
            rcn.put("slowRate", rc.slowRate());
            rcn.put("fastRate", rc.fastRate());
            rcn.put("sensorReset", rc.sensorReset());
            rcn.put("resetShare", rc.resetShare());
            rcn.put("resetBelow", rc.resetBelow());
            return o;
        }
    }
}
