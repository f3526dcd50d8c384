package dev.driftlab.bench;

import dev.driftlab.geometry.Polygon;
import dev.driftlab.geometry.Pose;
import dev.driftlab.scenario.Door;
import dev.driftlab.scenario.DoorState;
import dev.driftlab.scenario.Fixture;
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

/**
 * An invented large floor for benchmarks: 60 x 40 m of 6 x 5 m rooms in a 10 x 8 block, doors
 * through the shared walls, a shelf and a pillar in every room (about 1,100 segments).
 */
final class BenchSites {

    static final int COLUMNS = 10;
    static final int ROWS = 8;
    static final double ROOM_W = 6;
    static final double ROOM_H = 5;

    private BenchSites() {}

    static SitePlan largeFloor() {
        List<Room> rooms = new ArrayList<>();
        List<Door> doors = new ArrayList<>();
        List<Fixture> fixtures = new ArrayList<>();
        for (int r = 0; r < ROWS; r++) {
            for (int c = 0; c < COLUMNS; c++) {
                double x = c * ROOM_W;
                double y = r * ROOM_H;
                String id = "r" + r + "c" + c;
                rooms.add(new Room(id, "Room " + (r * COLUMNS + c + 1), Polygon.rectangle(x, y, ROOM_W, ROOM_H)));
                if (c < COLUMNS - 1) {
                    // right wall runs north from (x + 6, y): door centred at mid-height
                    doors.add(new Door(id + "e", id, 1, ROOM_H / 2, 0.9, DoorState.OPEN, DoorState.OPEN));
                }
                if (r < ROWS - 1) {
                    // top wall runs west from (x + 6, y + 5): door centred at mid-width
                    doors.add(new Door(id + "n", id, 2, ROOM_W / 2, 0.9, DoorState.OPEN, DoorState.OPEN));
                }
                fixtures.add(new Fixture(id + "s", "Shelf", Polygon.rectangle(x + 0.3, y + 4.3, 1.5, 0.4)));
                fixtures.add(new Fixture(id + "p", "Pillar", Polygon.rectangle(x + 4.8, y + 0.5, 0.4, 0.4)));
            }
        }
        return new SitePlan(rooms, doors, fixtures, List.of(), List.of());
    }

    /**
     * About three minutes of driving: east along the first row, north up the last column, west
     * along the top row, with a 360-beam scanner at 10 Hz and wheel and range noise.
     */
    static Scenario threeMinuteDrive() {
        double yLow = ROOM_H / 2;
        double yHigh = (ROWS - 1) * ROOM_H + ROOM_H / 2;
        double xFar = (COLUMNS - 1) * ROOM_W + ROOM_W / 2;
        Route route = new Route(
                Pose.of(ROOM_W / 2, yLow, 0),
                List.of(
                        new Waypoint(xFar, yLow, 0.8, 0),
                        new Waypoint(xFar, yHigh, 0.8, 0),
                        new Waypoint(ROOM_W / 2, yHigh, 0.8, 0)),
                0.0);
        Rangefinder rf = new Rangefinder(360, 2 * Math.PI, 12, 0.02, 10, Pose.of(0.1, 0, 0), 0.01);
        return new Scenario(
                "bench",
                "three-minute drive on the large floor",
                largeFloor(),
                Robot.typical(),
                rf,
                route,
                List.of(),
                LocalizerSettings.defaults(),
                List.of(),
                List.of());
    }
}
