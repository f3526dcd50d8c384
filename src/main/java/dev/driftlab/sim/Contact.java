package dev.driftlab.sim;

/**
 * The first moment the robot's footprint touched an obstacle of the actual world.
 *
 * @param time seconds from the run start
 * @param x robot centre when it touched, metres
 * @param y robot centre when it touched, metres
 */
public record Contact(double time, double x, double y) {}
