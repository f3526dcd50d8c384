package dev.driftlab.sim;

import dev.driftlab.geometry.Bounds;
import dev.driftlab.geometry.Polygon;
import dev.driftlab.geometry.Pose;
import dev.driftlab.scenario.DoorState;
import dev.driftlab.scenario.Fault;
import dev.driftlab.scenario.FloorZone;
import dev.driftlab.scenario.Rangefinder;
import dev.driftlab.scenario.Robot;
import dev.driftlab.scenario.Room;
import dev.driftlab.scenario.Route;
import dev.driftlab.scenario.Scenario;
import dev.driftlab.scenario.Waypoint;
import dev.driftlab.site.ActualWorld;
import dev.driftlab.site.CompiledSite;
import dev.driftlab.site.SiteCompiler;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.SplittableRandom;

/**
 * Simulates one run of a scenario: the robot follows its route at a fixed internal step, floor
 * zones and faults act on its wheels, and the rangefinder scans the actual world at its own rate
 * (at the first internal step at or after each scan time, the first at time 0). Results stream to a
 * {@link SimListener}.
 *
 * <p>Deterministic: the same scenario, seed and options give the same output bit for bit. Motion
 * noise, range noise and fault randomness come from three separate streams split from the seed,
 * so the simulated data never depend on anything else (in particular not on localizer settings).
 *
 * <p>Bounded: a run stops after at most three times the route's planned duration plus a minute
 * ({@link Outcome#STEP_LIMIT}); routes planned longer than a day are refused. Single use, not
 * thread-safe.
 */
public final class Simulator {

    /** Longest route, in seconds of robot time, the simulator accepts. */
    public static final double MAX_DURATION = 24 * 3600;

    private final Robot robot;
    private final Route route;
    private final SimOptions options;
    private final double dt;
    private final ActualWorld world;
    private final DiffDrive drive;
    private final RouteFollower follower;
    private final FaultTimeline timeline;
    private final RangeSensor sensor;
    private final FloorZone[] zones;
    private final Bounds[] zoneBounds;
    private final SplittableRandom motionRng;
    private final SplittableRandom sensorRng;
    private final SplittableRandom faultRng;
    private final long maxSteps;
    private final double scanRate;
    private final float[] ranges;
    private final List<Fault> firedNow = new ArrayList<>();
    private final List<Fault> endedNow = new ArrayList<>();
    private final List<SimEvent> pending = new ArrayList<>();
    private final List<Fault> faults;

    private Contact firstContact;
    private int contacts;

    private long step;
    private long scans;
    private long nextScanIndex;
    private boolean blocked;
    private RunSummary summary;

    /** A simulator with default options (100 Hz, steering by the true pose). */
    public Simulator(Scenario scenario, long seed) {
        this(scenario, SiteCompiler.compile(scenario.site()), seed, SimOptions.defaults());
    }

    /**
     * A simulator on an already compiled site (compile once, run many seeds).
     *
     * @param scenario the scenario; its localizer settings are not read
     * @param site the scenario's compiled site plan
     * @param seed run seed
     * @param options step rate and steering
     * @throws IllegalArgumentException naming the field when the scenario cannot be simulated
     */
    public Simulator(Scenario scenario, CompiledSite site, long seed, SimOptions options) {
        this.robot = scenario.robot();
        this.route = scenario.route();
        this.options = options;
        this.dt = 1.0 / options.stepRate();
        checkRobot(robot);
        checkRoute(route);
        checkRangefinder(scenario.rangefinder());
        this.world = site.actualWorld();
        Map<String, Polygon> places = new HashMap<>();
        for (Room r : scenario.site().rooms()) {
            places.put(r.id(), r.outline());
        }
        this.zones = scenario.site().floorZones().toArray(new FloorZone[0]);
        this.zoneBounds = new Bounds[zones.length];
        for (int k = 0; k < zones.length; k++) {
            FloorZone z = zones[k];
            places.put(z.id(), z.outline());
            zoneBounds[k] = z.outline().bounds();
            if (!(z.slip() >= 0 && z.slip() <= 1)) {
                throw new IllegalArgumentException(
                        "site.floorZones[" + k + "].slip: must be in [0, 1], got " + z.slip());
            }
            if (!(z.noiseFactor() >= 0)) {
                throw new IllegalArgumentException("site.floorZones[" + k + "].noiseFactor: must be >= 0");
            }
        }
        checkFaults(scenario.faults(), world);
        this.faults = List.copyOf(scenario.faults());
        Pose start = route.start();
        this.timeline = new FaultTimeline(scenario.faults(), places, start.x(), start.y());
        this.drive = new DiffDrive(robot, start);
        boolean byOdometry = options.steering() == Steering.ODOMETRY;
        this.follower = new RouteFollower(
                route,
                robot,
                byOdometry ? drive.metresPerTick() / robot.wheelbase() : 0,
                byOdometry ? drive.metresPerTick() : 0);
        this.sensor = new RangeSensor(scenario.rangefinder());
        this.ranges = new float[sensor.geometry().beamCount()];
        this.scanRate = scenario.rangefinder().rate();
        SplittableRandom root = new SplittableRandom(seed);
        this.motionRng = root.split();
        this.sensorRng = root.split();
        this.faultRng = root.split();
        double planned = RouteFollower.plannedDuration(route, robot);
        if (planned > MAX_DURATION) {
            throw new IllegalArgumentException("route: planned duration " + Math.round(planned)
                    + " s exceeds the limit of " + (long) MAX_DURATION + " s");
        }
        this.maxSteps = (long) Math.ceil((3 * planned + 60) * options.stepRate());
    }

    private static void checkRobot(Robot r) {
        positive(r.wheelbase(), "robot.wheelbase");
        positive(r.wheelRadius(), "robot.wheelRadius");
        if (r.ticksPerTurn() < 1) {
            throw new IllegalArgumentException("robot.ticksPerTurn: must be at least 1, got " + r.ticksPerTurn());
        }
        if (!(r.footprintRadius() >= 0)) {
            throw new IllegalArgumentException("robot.footprintRadius: must be >= 0, got " + r.footprintRadius());
        }
        positive(r.leftWheelScale(), "robot.leftWheelScale");
        positive(r.rightWheelScale(), "robot.rightWheelScale");
        positive(r.wheelbaseScale(), "robot.wheelbaseScale");
        if (!(r.wheelNoise() >= 0)) {
            throw new IllegalArgumentException("robot.wheelNoise: must be >= 0, got " + r.wheelNoise());
        }
        positive(r.maxSpeed(), "robot.maxSpeed");
        positive(r.maxTurnRate(), "robot.maxTurnRate");
        positive(r.maxAcceleration(), "robot.maxAcceleration");
    }

    private static void checkRoute(Route route) {
        for (int k = 0; k < route.waypoints().size(); k++) {
            Waypoint w = route.waypoints().get(k);
            positive(w.speed(), "route.waypoints[" + k + "].speed");
            if (!(w.dwell() >= 0)) {
                throw new IllegalArgumentException("route.waypoints[" + k + "].dwell: must be >= 0, got " + w.dwell());
            }
        }
        if (!(route.settle() >= 0)) {
            throw new IllegalArgumentException("route.settle: must be >= 0, got " + route.settle());
        }
    }

    private static void checkRangefinder(Rangefinder rf) {
        positive(rf.rate(), "rangefinder.rate");
    }

    private static void checkFaults(List<Fault> faults, ActualWorld world) {
        for (int k = 0; k < faults.size(); k++) {
            Fault f = faults.get(k);
            String at = "faults[" + k + "]";
            if (f instanceof Fault.Slip s) {
                inUnit(s.fraction(), at + ".fraction");
                notNegative(s.duration(), at + ".duration");
            } else if (f instanceof Fault.Stall s) {
                notNegative(s.duration(), at + ".duration");
            } else if (f instanceof Fault.Blackout b) {
                notNegative(b.duration(), at + ".duration");
            } else if (f instanceof Fault.NoiseBurst b) {
                notNegative(b.duration(), at + ".duration");
                notNegative(b.factor(), at + ".factor");
            } else if (f instanceof Fault.SpuriousMaxRange s) {
                notNegative(s.duration(), at + ".duration");
                inUnit(s.share(), at + ".share");
            } else if (f instanceof Fault.DoorChange d) {
                try {
                    world.isDoorClosed(d.door());
                } catch (IllegalArgumentException e) {
                    throw new IllegalArgumentException(at + ".door: no door \"" + d.door() + "\"", e);
                }
            } else if (f instanceof Fault.ClutterChange c) {
                try {
                    world.isClutterPresent(c.clutter());
                } catch (IllegalArgumentException e) {
                    throw new IllegalArgumentException(at + ".clutter: no clutter \"" + c.clutter() + "\"", e);
                }
            }
        }
    }

    private static void positive(double v, String field) {
        if (!(v > 0)) {
            throw new IllegalArgumentException(field + ": must be positive, got " + v);
        }
    }

    private static void notNegative(double v, String field) {
        if (!(v >= 0)) {
            throw new IllegalArgumentException(field + ": must be >= 0, got " + v);
        }
    }

    private static void inUnit(double v, String field) {
        if (!(v >= 0 && v <= 1)) {
            throw new IllegalArgumentException(field + ": must be in [0, 1], got " + v);
        }
    }

    /**
     * A generous upper bound on how long the robot takes to drive the route, seconds: each leg at
     * its speed limit plus acceleration, half a turn per waypoint, dwell and settle. A run stops at
     * three times this plus a minute.
     */
    public static double plannedDuration(Route route, Robot robot) {
        return RouteFollower.plannedDuration(route, robot);
    }

    /** Beam layout of the scans this run emits (the same object every scan carries). */
    public ScanGeometry scanGeometry() {
        return sensor.geometry();
    }

    /** Internal step length in seconds. */
    public double stepLength() {
        return dt;
    }

    /**
     * Runs to the end, streaming to the listener.
     *
     * @return how the run ended
     */
    public RunSummary run(SimListener listener) {
        while (advance(listener)) {
            // each call simulates one step
        }
        return summary;
    }

    /**
     * Simulates one internal step, streaming its events, scan and state to the listener.
     *
     * @return false once the run has ended (then {@link #summary()} is set)
     */
    public boolean advance(SimListener listener) {
        if (summary != null) {
            return false;
        }
        double t = step * dt;
        for (SimEvent e : pending) {
            listener.onEvent(new SimEvent(t, e.kind(), e.subject(), e.detail()));
        }
        pending.clear();
        for (String id : world.advanceTo(t)) {
            listener.onEvent(new SimEvent(
                    t, EventKind.CLUTTER_CHANGED, id, world.isClutterPresent(id) ? "appeared" : "vanished"));
        }
        applyFaults(t, listener);
        if (t >= nextScanIndex / scanRate - 1e-9) {
            Pose truth = drive.truth();
            sensor.measure(
                    world,
                    truth,
                    sensorRng,
                    ranges,
                    timeline.noiseFactor(),
                    timeline.blackout(),
                    timeline.spuriousShare(),
                    faultRng);
            listener.onScan(new RangeScan(t, truth, drive.odometry(), sensor.geometry(), ranges));
            scans++;
            nextScanIndex++;
        }
        listener.onStep(new SimStep(t, drive.truth(), drive.odometry(), timeline.activeIds()));
        if (follower.phase() == RouteFollower.Phase.DONE) {
            finish(t, listener, blocked ? Outcome.BLOCKED : Outcome.FINISHED);
            return false;
        }
        if (step >= maxSteps) {
            finish(t, listener, Outcome.STEP_LIMIT);
            return false;
        }
        move(t);
        step++;
        return true;
    }

    /** How the run ended; throws if it has not ended yet. */
    public RunSummary summary() {
        if (summary == null) {
            throw new IllegalStateException("the run has not ended yet");
        }
        return summary;
    }

    /** The first contact of the footprint with an obstacle, if any so far. */
    public java.util.Optional<Contact> firstContact() {
        return java.util.Optional.ofNullable(firstContact);
    }

    /** Contacts of the footprint with obstacles so far. */
    public int contacts() {
        return contacts;
    }

    /**
     * Whether each scheduled fault fired, in scenario order, with the reason for each that did not.
     * Meant for after the run; during a run it says what has fired so far.
     *
     * @param endTime when the trial ended, seconds
     * @param completed whether the route was driven to its end
     */
    public List<FaultFiring> faultFirings(double endTime, boolean completed) {
        List<FaultFiring> out = new ArrayList<>(faults.size());
        for (int k = 0; k < faults.size(); k++) {
            Fault f = faults.get(k);
            double at = timeline.firedAt(k);
            if (!Double.isNaN(at)) {
                out.add(new FaultFiring(f.id(), true, at, ""));
            } else {
                out.add(new FaultFiring(f.id(), false, Double.NaN, notFired(f, endTime, completed)));
            }
        }
        return out;
    }

    private static String notFired(Fault f, double endTime, boolean completed) {
        String end = String.format(java.util.Locale.ROOT, "%.1f s", endTime);
        String early = completed ? "" : " before the trial ended early at " + end;
        if (f.trigger() instanceof dev.driftlab.scenario.Trigger.AtTime at) {
            String when = String.format(java.util.Locale.ROOT, "%.1f s", at.time());
            return completed
                    ? "scheduled at " + when + ", after the route's end at " + end
                    : "scheduled at " + when + ", but the trial ended first, at " + end;
        }
        if (f.trigger() instanceof dev.driftlab.scenario.Trigger.OnEntering on) {
            return "the robot never entered " + on.place() + early;
        }
        dev.driftlab.scenario.Trigger.NearPoint near = (dev.driftlab.scenario.Trigger.NearPoint) f.trigger();
        return String.format(
                        java.util.Locale.ROOT,
                        "the robot never came within %.2f m of (%.2f, %.2f)",
                        near.radius(),
                        near.point().x(),
                        near.point().y())
                + early;
    }

    private void finish(double t, SimListener listener, Outcome outcome) {
        String message = switch (outcome) {
            case FINISHED -> "route driven";
            case BLOCKED -> "robot stopped by an obstacle";
            case STEP_LIMIT ->
                "run stopped at its step bound of " + maxSteps + " steps (" + Math.round(maxSteps * dt)
                        + " s) before the route was done";
            case STOPPED -> "run stopped from outside";
        };
        EventKind kind = switch (outcome) {
            case FINISHED -> EventKind.ROUTE_FINISHED;
            case BLOCKED -> EventKind.ROUTE_ABANDONED;
            case STEP_LIMIT, STOPPED -> EventKind.STEP_LIMIT_REACHED;
        };
        listener.onEvent(new SimEvent(t, kind, "", message));
        summary = new RunSummary(t, step, scans, outcome, message);
    }

    private void applyFaults(double t, SimListener listener) {
        firedNow.clear();
        endedNow.clear();
        // once the footprint has touched, the route is abandoned: faults scheduled later never fire
        timeline.update(t, drive.x(), drive.y(), dt, firedNow, endedNow, !blocked);
        for (Fault f : endedNow) {
            listener.onEvent(new SimEvent(t, EventKind.FAULT_ENDED, f.id(), "ended"));
        }
        for (Fault f : firedNow) {
            if (f instanceof Fault.Kidnap k) {
                drive.teleport(k.to().x(), k.to().y(), k.to().heading());
                listener.onEvent(new SimEvent(t, EventKind.KIDNAPPED, f.id(), "carried to " + k.to()));
            } else if (f instanceof Fault.Bump b) {
                Pose to = drive.truth().compose(new Pose(b.forward(), b.left(), b.turn()));
                drive.teleport(to.x(), to.y(), to.heading());
                listener.onEvent(new SimEvent(t, EventKind.BUMPED, f.id(), "shoved to " + to));
            } else if (f instanceof Fault.DoorChange d) {
                if (world.setDoorClosed(d.door(), d.state() == DoorState.CLOSED)) {
                    listener.onEvent(new SimEvent(
                            t, EventKind.DOOR_CHANGED, d.door(), d.state() == DoorState.CLOSED ? "closed" : "opened"));
                }
            } else if (f instanceof Fault.ClutterChange c) {
                if (world.setClutterPresent(c.clutter(), c.present())) {
                    listener.onEvent(new SimEvent(
                            t, EventKind.CLUTTER_CHANGED, c.clutter(), c.present() ? "appeared" : "vanished"));
                }
            } else {
                listener.onEvent(new SimEvent(
                        t, EventKind.FAULT_STARTED, f.id(), f.getClass().getSimpleName()));
            }
        }
    }

    private void move(double t) {
        boolean byOdometry = options.steering() == Steering.ODOMETRY;
        follower.update(
                byOdometry ? drive.odoX() : drive.x(),
                byOdometry ? drive.odoY() : drive.y(),
                byOdometry ? drive.odoHeading() : drive.heading(),
                dt);
        if (follower.reachedNow() >= 0) {
            pending.add(new SimEvent(
                    t, EventKind.WAYPOINT_REACHED, Integer.toString(follower.reachedNow()), "waypoint reached"));
        }
        double v = follower.speed();
        double w = follower.turnRate();
        if (v == 0 && w == 0) {
            return;
        }
        double half = robot.wheelbase() / 2;
        double leftRate = (v - w * half) / robot.wheelRadius();
        double rightRate = (v + w * half) / robot.wheelRadius();
        // each wheel feels the surface under its own contact point
        double c = Math.cos(drive.heading());
        double s = Math.sin(drive.heading());
        double trueHalf = drive.trueWheelbase() / 2;
        FloorZone leftZone = zoneAt(drive.x() - s * trueHalf, drive.y() + c * trueHalf);
        FloorZone rightZone = zoneAt(drive.x() + s * trueHalf, drive.y() - c * trueHalf);
        double leftSlip = combine(leftZone == null ? 0 : leftZone.slip(), timeline.leftSlip());
        double rightSlip = combine(rightZone == null ? 0 : rightZone.slip(), timeline.rightSlip());
        double leftNoise = robot.wheelNoise() * (leftZone == null ? 1 : leftZone.noiseFactor());
        double rightNoise = robot.wheelNoise() * (rightZone == null ? 1 : rightZone.noiseFactor());
        drive.propose(
                leftRate,
                rightRate,
                dt,
                leftSlip,
                rightSlip,
                timeline.leftStalled(),
                timeline.rightStalled(),
                timeline.leftEncoderSees(),
                timeline.rightEncoderSees(),
                leftNoise,
                rightNoise,
                motionRng);
        double r = robot.footprintRadius();
        if (r > 0) {
            double after = world.clearance(drive.proposedX(), drive.proposedY(), r);
            if (after < r && after < world.clearance(drive.x(), drive.y(), r) - 1e-12) {
                blocked = true;
                contacts++;
                if (firstContact == null) {
                    firstContact = new Contact(t, drive.x(), drive.y());
                }
                follower.block();
                pending.add(new SimEvent(
                        t,
                        EventKind.COLLISION,
                        "",
                        String.format(
                                java.util.Locale.ROOT,
                                "footprint touched an obstacle at (%.3f, %.3f)",
                                drive.x(),
                                drive.y())));
                return;
            }
        }
        drive.commit();
    }

    private static double combine(double a, double b) {
        return 1 - (1 - a) * (1 - b);
    }

    /** The floor zone under a point; later zones lie on top of earlier ones. */
    private FloorZone zoneAt(double x, double y) {
        for (int k = zones.length - 1; k >= 0; k--) {
            if (zoneBounds[k].contains(x, y) && zones[k].outline().contains(x, y)) {
                return zones[k];
            }
        }
        return null;
    }
}
