package dev.driftlab.scenario;

import static dev.driftlab.scenario.ScenarioJson.deg;
import static dev.driftlab.scenario.ScenarioJson.toDeg;

import dev.driftlab.geometry.Point;
import dev.driftlab.geometry.Polygon;
import dev.driftlab.geometry.Pose;
import dev.driftlab.scenario.LocalizerSettings.MotionNoise;
import dev.driftlab.scenario.LocalizerSettings.Particles;
import dev.driftlab.scenario.LocalizerSettings.RangeModel;
import dev.driftlab.scenario.LocalizerSettings.Recovery;
import dev.driftlab.scenario.LocalizerSettings.Resampling;
import java.util.List;
import tools.jackson.databind.JsonNode;

/** Reading: JSON tree to records. */
final class ScenarioReader {
    private final List<Problem> problems;

    ScenarioReader(List<Problem> problems) {
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
        String prefix = ScenarioJson.FORMAT_NAME + "/";
        if (!format.startsWith(prefix)) {
            problems.add(Problem.error("format", "must be \"" + ScenarioJson.FORMAT + "\", got \"" + format + "\""));
            return;
        }
        int version;
        try {
            version = Integer.parseInt(format.substring(prefix.length()));
        } catch (NumberFormatException e) {
            problems.add(Problem.error("format", "has no version number: \"" + format + "\""));
            return;
        }
        if (version > ScenarioJson.FORMAT_VERSION) {
            problems.add(Problem.error(
                    "format",
                    "version " + version + " is newer than this Driftlab reads (" + ScenarioJson.FORMAT_VERSION
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
        JsonFields dummy = JsonFields.of(ScenarioJson.MAPPER.createObjectNode(), p, problems);
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
                        f.requiredChoice("action", ClutterAction.class, ClutterAction.APPEAR) == ClutterAction.APPEAR);
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
        JsonNode merged = SettingsMerge.merge(baseLocalizer, changes);
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

    /** What a clutter fault does. */
    enum ClutterAction {
        APPEAR,
        VANISH
    }
}
