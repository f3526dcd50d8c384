package dev.driftlab.sim;

import dev.driftlab.geometry.Angles;
import dev.driftlab.scenario.Robot;
import dev.driftlab.scenario.Route;
import dev.driftlab.scenario.Waypoint;

/**
 * Drives a route: for each waypoint, turn in place to face it, drive straight to it with the
 * acceleration and speed limits, then dwell; after the last one wait the settle time. Turn rates
 * are limited by the robot's top turn rate and by the wheel acceleration limit. Outputs a forward
 * speed (m/s) and a turn rate (rad/s) per step.
 */
final class RouteFollower {

    enum Phase {
        TURN,
        DRIVE,
        DWELL,
        SETTLE,
        BLOCKED,
        DONE
    }

    /** Heading error in radians below which a turn in place counts as done when steering by truth. */
    private static final double TURN_DONE = 1e-4;

    /** Remaining distance in metres below which a waypoint counts as reached when steering by truth. */
    private static final double ARRIVED = 1e-4;

    /** Within this distance (m) of the waypoint the heading is no longer corrected: the bearing is unstable. */
    private static final double NO_CORRECTION_WITHIN = 0.1;

    /** Heading error (rad) while driving beyond which the robot stops and turns in place again. */
    private static final double RETURN_TO_TURN = 0.5;

    /** Proportional gain of the heading correction while driving, per second. */
    private static final double HEADING_GAIN = 2.0;

    private final Route route;
    private final double maxSpeed;
    private final double maxTurn;
    private final double accel;
    private final double turnAccel;
    private final double turnDone;
    private final double arrived;

    private Phase phase;
    private int target;
    private double timer;
    private double v;
    private double w;
    private int reached = -1;

    /**
     * @param headingResolution smallest heading change the steering pose can show (0 for truth)
     * @param distanceResolution smallest travel the steering pose can show (0 for truth)
     */
    RouteFollower(Route route, Robot robot, double headingResolution, double distanceResolution) {
        this.route = route;
        this.maxSpeed = robot.maxSpeed();
        this.maxTurn = robot.maxTurnRate();
        this.accel = robot.maxAcceleration();
        this.turnAccel = robot.maxAcceleration() / (robot.wheelbase() / 2);
        // odometry moves in whole ticks: a target finer than one tick could never be met
        this.turnDone = Math.max(TURN_DONE, 1.01 * headingResolution);
        this.arrived = Math.max(ARRIVED, 1.01 * distanceResolution);
        this.target = 0;
        this.phase = route.waypoints().isEmpty() ? Phase.SETTLE : Phase.TURN;
    }

    Phase phase() {
        return phase;
    }

    /** Forward speed command, m/s. */
    double speed() {
        return v;
    }

    /** Turn rate command, rad/s. */
    double turnRate() {
        return w;
    }

    /** Index of the waypoint reached in the last update, or -1. */
    int reachedNow() {
        return reached;
    }

    /** Stops for good: a collision. The run ends after the settle time. */
    void block() {
        v = 0;
        w = 0;
        if (phase != Phase.DONE) {
            phase = Phase.BLOCKED;
            timer = 0;
        }
    }

    /**
     * Computes the commands for the next step from the steering pose.
     *
     * @param px east, metres
     * @param py north, metres
     * @param ph heading, radians
     * @param dt step length, seconds
     */
    void update(double px, double py, double ph, double dt) {
        reached = -1;
        switch (phase) {
            case TURN -> turn(px, py, ph, dt);
            case DRIVE -> drive(px, py, ph, dt);
            case DWELL -> {
                v = 0;
                w = 0;
                timer += dt;
                if (timer >= route.waypoints().get(target).dwell() - 1e-9) {
                    target++;
                    timer = 0;
                    phase = target < route.waypoints().size() ? Phase.TURN : Phase.SETTLE;
                }
            }
            case SETTLE, BLOCKED -> {
                v = 0;
                w = 0;
                timer += dt;
                if (timer >= route.settle() - 1e-9) {
                    phase = Phase.DONE;
                }
            }
            case DONE -> {
                v = 0;
                w = 0;
            }
        }
    }

    private void turn(double px, double py, double ph, double dt) {
        Waypoint wp = route.waypoints().get(target);
        double dx = wp.x() - px;
        double dy = wp.y() - py;
        v = 0;
        if (Math.hypot(dx, dy) <= arrived) {
            arrive();
            return;
        }
        double err = Angles.difference(Math.atan2(dy, dx), ph);
        if (Math.abs(err) <= turnDone) {
            w = 0;
            phase = Phase.DRIVE;
            return;
        }
        double want = Math.signum(err) * Math.min(maxTurn, Math.sqrt(2 * turnAccel * Math.abs(err)));
        w = Math.max(w - turnAccel * dt, Math.min(w + turnAccel * dt, want));
        if (Math.abs(w * dt) > Math.abs(err)) {
            w = err / dt;
        }
    }

    private void drive(double px, double py, double ph, double dt) {
        Waypoint wp = route.waypoints().get(target);
        double dx = wp.x() - px;
        double dy = wp.y() - py;
        double dist = Math.hypot(dx, dy);
        double remaining = dx * Math.cos(ph) + dy * Math.sin(ph);
        if (remaining <= arrived) {
            arrive();
            return;
        }
        double err = dist > NO_CORRECTION_WITHIN ? Angles.difference(Math.atan2(dy, dx), ph) : 0;
        if (Math.abs(err) > RETURN_TO_TURN) {
            v = 0;
            w = 0;
            phase = Phase.TURN;
            return;
        }
        double want = Math.min(Math.min(wp.speed(), maxSpeed), Math.sqrt(2 * accel * remaining));
        v = Math.min(want, v + accel * dt);
        if (v * dt > remaining) {
            v = remaining / dt;
        }
        w = Math.max(-maxTurn, Math.min(maxTurn, HEADING_GAIN * err));
    }

    private void arrive() {
        v = 0;
        w = 0;
        reached = target;
        timer = 0;
        phase = Phase.DWELL;
    }

    /**
     * A generous upper bound on the route's duration in seconds: each leg at its speed limit plus
     * acceleration, half a turn per waypoint, dwell and settle.
     */
    static double plannedDuration(Route route, Robot robot) {
        double t = route.settle();
        double px = route.start().x();
        double py = route.start().y();
        for (Waypoint wp : route.waypoints()) {
            double speed = Math.min(wp.speed(), robot.maxSpeed());
            double len = Math.hypot(wp.x() - px, wp.y() - py);
            t += len / speed + 2 * speed / robot.maxAcceleration();
            t += Math.PI / robot.maxTurnRate()
                    + 2 * robot.maxTurnRate() * robot.wheelbase() / 2 / robot.maxAcceleration();
            t += wp.dwell();
            px = wp.x();
            py = wp.y();
        }
        return t;
    }
}
