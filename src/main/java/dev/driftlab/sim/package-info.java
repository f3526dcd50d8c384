/**
 * The robot simulator: a differential drive with systematic and random wheel errors, a route
 * follower, floor zones, the fault timeline and a scanning rangefinder that sees the actual world.
 * It runs at a fixed internal step and streams true poses, wheel odometry, scans and events to a
 * {@link dev.driftlab.sim.SimListener}. A run is a pure function of (scenario, seed, options);
 * motion, sensor and fault randomness come from separate streams.
 *
 * <p>Units are metres, seconds and radians in the site frame (x east, y north, heading
 * counter-clockwise from +x). The robot frame has x forward and y to the left.
 */
package dev.driftlab.sim;
