package dev.driftlab.localizer.protocol;

import dev.driftlab.geometry.Pose;
import java.util.Objects;
import tools.jackson.databind.JsonNode;

/**
 * What Driftlab tells a localizer before the first scan (the {@code greeting} message). Units are
 * metres, seconds and radians; poses are in the site frame, the mount in the robot frame.
 *
 * @param cellSize occupancy grid cell side, metres
 * @param originX west edge of column 0, metres
 * @param originY south edge of row 0, metres
 * @param width columns
 * @param height rows
 * @param rows run-length rows ({@link OccupancyRows})
 * @param walls wall segments of the believed map, each {@code {ax, ay, bx, by}} in metres
 * @param beamAngles beam directions relative to the sensor heading, radians, in scan order
 * @param mount sensor pose on the robot (forward, left, turn)
 * @param maxRange longest measurable range, metres; a range equal to it means no return
 * @param rate scans per second
 * @param wheelbase distance between the wheels, metres
 * @param wheelRadius nominal wheel radius, metres
 * @param ticksPerTurn encoder ticks per wheel turn
 * @param footprintRadius radius of the circle covering the robot, metres
 * @param start the start hint, or null when the start is unknown (global localization)
 * @param startSpread position standard deviation of the hint per axis, metres (0 when unknown)
 * @param startTurnSpread heading standard deviation of the hint, radians (0 when unknown)
 * @param particles most particles per answer Driftlab will draw (0: send none)
 * @param settings Driftlab-specific settings for its own localizer, or null
 */
public record Greeting(
        double cellSize,
        double originX,
        double originY,
        int width,
        int height,
        int[][] rows,
        double[][] walls,
        double[] beamAngles,
        Pose mount,
        double maxRange,
        double rate,
        double wheelbase,
        double wheelRadius,
        int ticksPerTurn,
        double footprintRadius,
        Pose start,
        double startSpread,
        double startTurnSpread,
        int particles,
        JsonNode settings) {

    /** Checks presence of the parts. */
    public Greeting {
        Objects.requireNonNull(rows, "rows");
        Objects.requireNonNull(walls, "walls");
        Objects.requireNonNull(beamAngles, "beamAngles");
        Objects.requireNonNull(mount, "mount");
    }

    /** Whether the start is unknown (no hint). */
    public boolean startUnknown() {
        return start == null;
    }
}
