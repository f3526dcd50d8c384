package dev.driftlab.sim;

import dev.driftlab.geometry.Angles;
import dev.driftlab.geometry.Pose;
import dev.driftlab.scenario.Robot;
import java.util.SplittableRandom;

/**
 * Differential-drive kinematics with wheel encoders. The controller commands wheel turn rates; the
 * encoders count the wheels' turns in whole ticks; odometry integrates the ticks with the nominal
 * wheel radius and wheelbase, while the true pose integrates the ground travel of each wheel with
 * its actual radius (nominal times its scale), the actual wheelbase, surface slip, faults and
 * random noise.
 *
 * <p>Random wheel noise: each wheel's ground travel over a step gets a Gaussian error of standard
 * deviation {@code wheelNoise * sqrt(|travel| * 1 m)}, so that over a metre driven the error has
 * standard deviation {@code wheelNoise} metres whatever the step size.
 *
 * <p>A step is first proposed, then committed or dropped (when the robot would hit something).
 */
final class DiffDrive {

    private final double radius;
    private final double wheelbase;
    private final double trueWheelbase;
    private final double leftScale;
    private final double rightScale;
    private final double ticksPerRadian;
    private final double metresPerTick;

    private double x;
    private double y;
    private double heading;
    private double ox;
    private double oy;
    private double oh;
    private double leftAngle;
    private double rightAngle;
    private long leftTicks;
    private long rightTicks;

    private double nx;
    private double ny;
    private double nh;
    private double nLeftAngle;
    private double nRightAngle;

    DiffDrive(Robot robot, Pose start) {
        this.radius = robot.wheelRadius();
        this.wheelbase = robot.wheelbase();
        this.trueWheelbase = robot.wheelbase() * robot.wheelbaseScale();
        this.leftScale = robot.leftWheelScale();
        this.rightScale = robot.rightWheelScale();
        this.ticksPerRadian = robot.ticksPerTurn() / (2 * Math.PI);
        this.metresPerTick = 2 * Math.PI * radius / robot.ticksPerTurn();
        this.x = start.x();
        this.y = start.y();
        this.heading = start.heading();
        this.ox = start.x();
        this.oy = start.y();
        this.oh = start.heading();
    }

    /**
     * Proposes one step.
     *
     * @param leftRate commanded left wheel turn rate, radians per second
     * @param rightRate commanded right wheel turn rate, radians per second
     * @param dt step length in seconds
     * @param leftSlip fraction of the left wheel's ground travel lost, 0 to 1
     * @param rightSlip same for the right wheel
     * @param leftStalled whether the left wheel is blocked (no ground travel)
     * @param rightStalled same for the right wheel
     * @param leftEncoderSeesStall whether a blocked left wheel's encoder stops counting
     * @param rightEncoderSeesStall same for the right wheel
     * @param leftNoise wheel noise figure for the left wheel (robot noise times surface factor)
     * @param rightNoise same for the right wheel
     * @param rng motion random stream
     */
    void propose(
            double leftRate,
            double rightRate,
            double dt,
            double leftSlip,
            double rightSlip,
            boolean leftStalled,
            boolean rightStalled,
            boolean leftEncoderSeesStall,
            boolean rightEncoderSeesStall,
            double leftNoise,
            double rightNoise,
            SplittableRandom rng) {
        double lTurn = leftRate * dt;
        double rTurn = rightRate * dt;
        nLeftAngle = leftAngle + (leftStalled && leftEncoderSeesStall ? 0 : lTurn);
        nRightAngle = rightAngle + (rightStalled && rightEncoderSeesStall ? 0 : rTurn);
        double dl = leftStalled ? 0 : lTurn * radius * leftScale * (1 - leftSlip);
        double dr = rightStalled ? 0 : rTurn * radius * rightScale * (1 - rightSlip);
        if (leftNoise > 0 && dl != 0) {
            dl += leftNoise * Math.sqrt(Math.abs(dl)) * rng.nextGaussian();
        }
        if (rightNoise > 0 && dr != 0) {
            dr += rightNoise * Math.sqrt(Math.abs(dr)) * rng.nextGaussian();
        }
        double ds = (dl + dr) / 2;
        double dh = (dr - dl) / trueWheelbase;
        double mid = heading + dh / 2;
        nx = x + ds * Math.cos(mid);
        ny = y + ds * Math.sin(mid);
        nh = Angles.wrap(heading + dh);
    }

    /** Applies the proposed step to the true pose and the encoders, and updates odometry. */
    void commit() {
        x = nx;
        y = ny;
        heading = nh;
        leftAngle = nLeftAngle;
        rightAngle = nRightAngle;
        long lt = (long) Math.floor(leftAngle * ticksPerRadian);
        long rt = (long) Math.floor(rightAngle * ticksPerRadian);
        long dlt = lt - leftTicks;
        long drt = rt - rightTicks;
        leftTicks = lt;
        rightTicks = rt;
        if (dlt != 0 || drt != 0) {
            double dl = dlt * metresPerTick;
            double dr = drt * metresPerTick;
            double ds = (dl + dr) / 2;
            double dh = (dr - dl) / wheelbase;
            double mid = oh + dh / 2;
            ox += ds * Math.cos(mid);
            oy += ds * Math.sin(mid);
            oh = Angles.wrap(oh + dh);
        }
    }

    /** Proposed true position, east, metres. */
    double proposedX() {
        return nx;
    }

    /** Proposed true position, north, metres. */
    double proposedY() {
        return ny;
    }

    /** Moves the true pose without the encoders noticing (kidnap, bump). */
    void teleport(double tx, double ty, double th) {
        x = tx;
        y = ty;
        heading = Angles.wrap(th);
    }

    double x() {
        return x;
    }

    double y() {
        return y;
    }

    double heading() {
        return heading;
    }

    double odoX() {
        return ox;
    }

    double odoY() {
        return oy;
    }

    double odoHeading() {
        return oh;
    }

    long leftTicks() {
        return leftTicks;
    }

    long rightTicks() {
        return rightTicks;
    }

    double trueWheelbase() {
        return trueWheelbase;
    }

    double metresPerTick() {
        return metresPerTick;
    }

    Pose truth() {
        return new Pose(x, y, heading);
    }

    Pose odometry() {
        return new Pose(ox, oy, oh);
    }
}
