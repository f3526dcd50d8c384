package dev.driftlab.recording;

/**
 * One cluster of particles as recorded in a frame: its weight, mean pose and position covariance.
 *
 * @param weight share of the total weight, 0 to 1
 * @param x mean x, metres
 * @param y mean y, metres
 * @param heading circular mean heading, radians
 * @param cxx position covariance xx, square metres
 * @param cxy position covariance xy, square metres
 * @param cyy position covariance yy, square metres
 */
public record FrameHypothesis(double weight, double x, double y, double heading, double cxx, double cxy, double cyy) {}
