package dev.driftlab.sim;

import dev.driftlab.geometry.Polygon;
import dev.driftlab.geometry.Pose;
import dev.driftlab.scenario.Clutter;
import dev.driftlab.scenario.Door;
import dev.driftlab.scenario.Fault;
import dev.driftlab.scenario.FloorZone;
import dev.driftlab.scenario.LocalizerSettings;
import dev.driftlab.scenario.Rangefinder;
import dev.driftlab.scenario.Robot;
import dev.driftlab.scenario.Room;
import dev.driftlab.scenario.Route;
import dev.driftlab.scenario.Scenario;
import dev.driftlab.scenario.SitePlan;
import dev.driftlab.scenario.Waypoint;
import java.util.ArrayList;
import java.util.List;

/** Small builder of valid scenarios for simulator tests. */
final class SimScenarios {

    private final List<Room> rooms = new ArrayList<>();
    private final List<Door> doors = new ArrayList<>();
    private final List<FloorZone> zones = new ArrayList<>();
    private final List<Clutter> clutter = new ArrayList<>();
    private final List<Fault> faults = new ArrayList<>();
    private final List<Waypoint> waypoints = new ArrayList<>();
    private Robot robot = noiseFree();
    private Rangefinder rangefinder = Rangefinder.typical();
    private Pose start = Pose.of(1, 1, 0);
    private double settle = 0.5;
    private LocalizerSettings localizer = LocalizerSettings.defaults();

    private SimScenarios() {}

    /** One empty rectangular room with its lower-left corner at the origin. */
    static SimScenarios room(double width, double height) {
        SimScenarios s = new SimScenarios();
        s.rooms.add(new Room("hall", "Hall", Polygon.rectangle(0, 0, width, height)));
        return s;
    }

    /** The typical robot without any systematic or random error. */
    static Robot noiseFree() {
        Robot t = Robot.typical();
        return new Robot(
                t.wheelbase(),
                t.wheelRadius(),
                t.ticksPerTurn(),
                t.footprintRadius(),
                1,
                1,
                1,
                0,
                t.maxSpeed(),
                t.maxTurnRate(),
                t.maxAcceleration());
    }

    /** A robot with the given wheel scales and noise, otherwise typical. */
    static Robot robot(double left, double right, double noise) {
        Robot t = Robot.typical();
        return new Robot(
                t.wheelbase(),
                t.wheelRadius(),
                t.ticksPerTurn(),
                t.footprintRadius(),
                left,
                right,
                1,
                noise,
                t.maxSpeed(),
                t.maxTurnRate(),
                t.maxAcceleration());
    }

    SimScenarios start(double x, double y, double heading) {
        start = Pose.of(x, y, heading);
        return this;
    }

    SimScenarios to(double x, double y) {
        return to(x, y, 0.5, 0);
    }

    SimScenarios to(double x, double y, double speed, double dwell) {
        waypoints.add(new Waypoint(x, y, speed, dwell));
        return this;
    }

    SimScenarios settle(double seconds) {
        settle = seconds;
        return this;
    }

    SimScenarios robot(Robot r) {
        robot = r;
        return this;
    }

    SimScenarios rangefinder(Rangefinder r) {
        rangefinder = r;
        return this;
    }

    SimScenarios fault(Fault f) {
        faults.add(f);
        return this;
    }

    SimScenarios zone(FloorZone z) {
        zones.add(z);
        return this;
    }

    SimScenarios door(Door d) {
        doors.add(d);
        return this;
    }

    SimScenarios room(Room r) {
        rooms.add(r);
        return this;
    }

    SimScenarios clutter(Clutter c) {
        clutter.add(c);
        return this;
    }

    SimScenarios localizer(LocalizerSettings l) {
        localizer = l;
        return this;
    }

    Scenario build() {
        return new Scenario(
                "test",
                "simulator test",
                new SitePlan(rooms, doors, List.of(), zones, clutter),
                robot,
                rangefinder,
                new Route(start, waypoints, settle),
                faults,
                localizer,
                List.of(),
                List.of());
    }
}
