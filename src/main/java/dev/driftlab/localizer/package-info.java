/**
 * Monte Carlo localization: the particle filter under test.
 *
 * <p>The filter ({@link dev.driftlab.localizer.MonteCarloLocalizer}) keeps its particles as a
 * structure of arrays ({@link dev.driftlab.localizer.ParticleSet}) and runs the odometry motion
 * model, a range measurement model (likelihood field or beam model), resampling, kidnap recovery
 * (augmented MCL injection and sensor resetting) and KLD-sampling. It sees the believed map only
 * through three small views defined here ({@link dev.driftlab.localizer.DistanceGrid}, {@link
 * dev.driftlab.localizer.BeamCaster}, {@link dev.driftlab.localizer.FreeSpaceSampler}) so that the map
 * side can change without touching the filter.
 *
 * <p>Frames and units: the site frame has x east, y north, metres; headings are radians
 * counter-clockwise from +x, wrapped to (-pi, pi]. Everything is deterministic from the seed
 * passed in, whatever the thread count.
 */
package dev.driftlab.localizer;
