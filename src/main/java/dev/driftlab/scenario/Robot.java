package dev.driftlab.scenario;

/**
 * A differential-drive robot: two driven wheels on one axle.
 *
 * @param wheelbase distance between the wheel contact points in metres
 * @param wheelRadius nominal wheel radius in metres
 * @param ticksPerTurn encoder ticks per wheel revolution
 * @param footprintRadius radius of the circle that covers the robot, in metres
 * @param leftWheelScale actual / nominal radius of the left wheel (1 = exact)
 * @param rightWheelScale actual / nominal radius of the right wheel (1 = exact)
 * @param wheelbaseScale actual / nominal wheelbase (1 = exact)
 * @param wheelNoise standard deviation of random wheel travel per metre driven, as a fraction
 * @param maxSpeed top forward speed in metres per second
 * @param maxTurnRate top turn rate in radians per second
 * @param maxAcceleration linear acceleration limit in metres per second squared
 */
public record Robot(
        double wheelbase,
        double wheelRadius,
        int ticksPerTurn,
        double footprintRadius,
        double leftWheelScale,
        double rightWheelScale,
        double wheelbaseScale,
        double wheelNoise,
        double maxSpeed,
        double maxTurnRate,
        double maxAcceleration) {
    /** Checks finiteness; ranges are checked by the validator. */
    public Robot {
        Checks.finite(wheelbase, "wheelbase");
        Checks.finite(wheelRadius, "wheelRadius");
        Checks.finite(footprintRadius, "footprintRadius");
        Checks.finite(leftWheelScale, "leftWheelScale");
        Checks.finite(rightWheelScale, "rightWheelScale");
        Checks.finite(wheelbaseScale, "wheelbaseScale");
        Checks.finite(wheelNoise, "wheelNoise");
        Checks.finite(maxSpeed, "maxSpeed");
        Checks.finite(maxTurnRate, "maxTurnRate");
        Checks.finite(maxAcceleration, "maxAcceleration");
    }

    /** A typical small indoor service robot. */
    public static Robot typical() {
        return new Robot(0.40, 0.075, 4096, 0.30, 1.0, 1.0, 1.0, 0.01, 0.8, Math.toRadians(90), 0.5);
    }
}
