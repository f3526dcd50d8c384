package dev.driftlab.scenario;

import dev.driftlab.geometry.Polygon;
import dev.driftlab.geometry.Pose;
import java.util.ArrayList;
import java.util.List;

/**
 * Small valid scenarios for tests, changed one thing at a time: {@code
 * Scenarios.corridor().withKidnapAt(30, Pose.of(15, 1, 0)).build()}.
 */
public final class Scenarios {

    private Scenarios() {}

    /**
     * A 20 m by 2 m corridor with a 4 m by 4 m side room behind a 0.9 m door (wall 2 of the corridor
     * runs from (20, 2) to (0, 2); the door's centre is at x = 3), a cabinet in the side room, and a
     * route along the corridor from (1, 1) to (18, 1) at 0.5 m/s.
     */
    public static Builder corridor() {
        Builder b = new Builder();
        b.rooms.add(new Room("corridor", "Test corridor", Polygon.rectangle(0, 0, 20, 2)));
        b.rooms.add(new Room("side", "Side room", Polygon.rectangle(1, 2, 4, 4)));
        b.doors.add(new Door("side-door", "corridor", 2, 17, 0.9, DoorState.OPEN, DoorState.OPEN));
        b.fixtures.add(new Fixture("cabinet", "Cabinet", Polygon.rectangle(3.5, 5, 1, 0.6)));
        b.start = Pose.of(1, 1, 0);
        b.waypoints.add(new Waypoint(18, 1, 0.5, 0));
        return b;
    }

    /** Mutable builder; {@link #build()} makes the immutable scenario. */
    public static final class Builder {
        final List<Room> rooms = new ArrayList<>();
        final List<Door> doors = new ArrayList<>();
        final List<Fixture> fixtures = new ArrayList<>();
        final List<FloorZone> zones = new ArrayList<>();
        final List<Clutter> clutter = new ArrayList<>();
        final List<Waypoint> waypoints = new ArrayList<>();
        final List<Fault> faults = new ArrayList<>();
        final List<SettingsVariant> variants = new ArrayList<>();
        final List<Gate> gates = new ArrayList<>();
        Robot robot = Robot.typical();
        Rangefinder rangefinder = Rangefinder.typical();
        LocalizerSettings localizer = LocalizerSettings.defaults();
        Pose start;
        double settle = 5;
        boolean contactAllowed;
        String name = "Test corridor";

        public Builder withName(String n) {
            name = n;
            return this;
        }

        public Builder withRoom(Room r) {
            rooms.add(r);
            return this;
        }

        public Builder withDoor(Door d) {
            doors.add(d);
            return this;
        }

        public Builder withFixture(Fixture f) {
            fixtures.add(f);
            return this;
        }

        public Builder withZone(FloorZone z) {
            zones.add(z);
            return this;
        }

        public Builder withClutter(Clutter c) {
            clutter.add(c);
            return this;
        }

        public Builder withStart(Pose p) {
            start = p;
            return this;
        }

        public Builder withWaypoints(Waypoint... w) {
            waypoints.clear();
            waypoints.addAll(List.of(w));
            return this;
        }

        public Builder withFault(Fault f) {
            faults.add(f);
            return this;
        }

        public Builder withKidnapAt(double t, Pose to) {
            return withFault(new Fault.Kidnap("kidnap-" + faults.size(), new Trigger.AtTime(t), to));
        }

        public Builder withRobot(Robot r) {
            robot = r;
            return this;
        }

        public Builder withRangefinder(Rangefinder r) {
            rangefinder = r;
            return this;
        }

        public Builder withLocalizer(LocalizerSettings l) {
            localizer = l;
            return this;
        }

        public Builder withVariant(SettingsVariant v) {
            variants.add(v);
            return this;
        }

        public Builder withContactAllowed(boolean allowed) {
            contactAllowed = allowed;
            return this;
        }

        public Builder withoutWaypoints() {
            waypoints.clear();
            return this;
        }

        public Builder withGate(Gate g) {
            gates.add(g);
            return this;
        }

        public Scenario build() {
            return new Scenario(
                    name,
                    "Test scenario",
                    new SitePlan(rooms, doors, fixtures, zones, clutter),
                    robot,
                    rangefinder,
                    new Route(start, waypoints, settle, contactAllowed),
                    faults,
                    localizer,
                    variants,
                    gates);
        }

        /** The scenario as a JSON document, for tests of the reader and of paths in messages. */
        public String json() {
            return ScenarioJson.write(build());
        }
    }
}
