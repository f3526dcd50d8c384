package dev.driftlab.scenario;

import static dev.driftlab.scenario.ScenarioJson.toDeg;

import dev.driftlab.geometry.Point;
import dev.driftlab.geometry.Polygon;
import dev.driftlab.geometry.Pose;
import dev.driftlab.scenario.LocalizerSettings.MotionNoise;
import dev.driftlab.scenario.LocalizerSettings.Particles;
import dev.driftlab.scenario.LocalizerSettings.RangeModel;
import dev.driftlab.scenario.LocalizerSettings.Recovery;
import dev.driftlab.scenario.LocalizerSettings.Resampling;
import tools.jackson.databind.node.ArrayNode;
import tools.jackson.databind.node.ObjectNode;

/** Writing: records to a JSON tree, every key explicit. */
final class ScenarioWriter {

    static ObjectNode scenario(Scenario s) {
        ObjectNode o = ScenarioJson.MAPPER.createObjectNode();
        o.put("format", ScenarioJson.FORMAT);
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
            vn.set("localizer", SettingsMerge.diff(base, localizer(v.settings())));
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
        ObjectNode o = ScenarioJson.MAPPER.createObjectNode();
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
        ArrayNode a = ScenarioJson.MAPPER.createArrayNode();
        for (Point c : p.corners()) {
            a.addArray().add(c.x()).add(c.y());
        }
        return a;
    }

    static ObjectNode robot(Robot r) {
        ObjectNode o = ScenarioJson.MAPPER.createObjectNode();
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
        ObjectNode o = ScenarioJson.MAPPER.createObjectNode();
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
        ObjectNode o = ScenarioJson.MAPPER.createObjectNode();
        o.put("x", p.x());
        o.put("y", p.y());
        o.put("heading", toDeg(p.heading()));
        return o;
    }

    static ObjectNode route(Route r) {
        ObjectNode o = ScenarioJson.MAPPER.createObjectNode();
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
        ObjectNode o = ScenarioJson.MAPPER.createObjectNode();
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
        o.put("kind", FaultKind.of(f).fileName());
        if (f instanceof Fault.Slip s) {
            o.put("wheel", JsonFields.fileName(s.wheel()));
            o.put("fraction", s.fraction());
            o.put("duration", s.duration());
        } else if (f instanceof Fault.Stall s) {
            o.put("wheel", JsonFields.fileName(s.wheel()));
            o.put("duration", s.duration());
            o.put("encoderSeesIt", s.encoderSeesIt());
        } else if (f instanceof Fault.Kidnap k) {
            o.set("to", pose(k.to()));
        } else if (f instanceof Fault.Bump b) {
            o.put("forward", b.forward());
            o.put("left", b.left());
            o.put("turn", toDeg(b.turn()));
        } else if (f instanceof Fault.DoorChange d) {
            o.put("door", d.door());
            o.put("state", JsonFields.fileName(d.state()));
        } else if (f instanceof Fault.ClutterChange c) {
            o.put("clutter", c.clutter());
            o.put("action", c.present() ? "appear" : "vanish");
        } else if (f instanceof Fault.Blackout b) {
            o.put("duration", b.duration());
        } else if (f instanceof Fault.NoiseBurst n) {
            o.put("duration", n.duration());
            o.put("factor", n.factor());
        } else if (f instanceof Fault.SpuriousMaxRange s) {
            o.put("duration", s.duration());
            o.put("share", s.share());
        }
        return o;
    }

    static ObjectNode localizer(LocalizerSettings s) {
        ObjectNode o = ScenarioJson.MAPPER.createObjectNode();
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
