package dev.driftlab.sim;

import dev.driftlab.geometry.Pose;
import dev.driftlab.geometry.RayCaster;
import dev.driftlab.scenario.Rangefinder;
import java.util.SplittableRandom;

/**
 * A scanning rangefinder: casts each beam against a world, then adds Gaussian range noise,
 * dropouts and fault effects. A beam that hits nothing within max range reports max range
 * without noise; noisy ranges are clamped to [0, max range].
 */
public final class RangeSensor {

    private final ScanGeometry geometry;
    private final double sigma;
    private final double dropout;

    /**
     * A sensor from its scenario description.
     *
     * @throws IllegalArgumentException naming the field when a value is out of range
     */
    public RangeSensor(Rangefinder rf) {
        this.geometry = ScanGeometry.of(rf);
        if (!(rf.rangeSigma() >= 0)) {
            throw new IllegalArgumentException("rangefinder.rangeSigma: must be >= 0, got " + rf.rangeSigma());
        }
        if (!(rf.dropout() >= 0 && rf.dropout() <= 1)) {
            throw new IllegalArgumentException("rangefinder.dropout: must be in [0, 1], got " + rf.dropout());
        }
        this.sigma = rf.rangeSigma();
        this.dropout = rf.dropout();
    }

    /** Beam layout, mount and max range. */
    public ScanGeometry geometry() {
        return geometry;
    }

    /**
     * Measures one scan with the sensor's own noise and dropout.
     *
     * @param world what the beams hit
     * @param robot robot pose in the site frame (the mount is applied here)
     * @param rng sensor random stream
     * @param out ranges in metres, length at least the beam count
     */
    public void measure(RayCaster world, Pose robot, SplittableRandom rng, float[] out) {
        measure(world, robot, rng, out, 1.0, false, 0.0, rng);
    }

    /**
     * Measures one scan with fault effects.
     *
     * @param noiseFactor multiplier on the range sigma (noise burst), at least 0
     * @param blackout whether every beam returns nothing
     * @param spuriousShare probability that a beam that hit something reports max range instead
     * @param faultRng fault random stream, used to pick spurious beams
     */
    void measure(
            RayCaster world,
            Pose robot,
            SplittableRandom rng,
            float[] out,
            double noiseFactor,
            boolean blackout,
            double spuriousShare,
            SplittableRandom faultRng) {
        double max = geometry.maxRange();
        int n = geometry.beamCount();
        if (blackout) {
            java.util.Arrays.fill(out, 0, n, (float) max);
            return;
        }
        Pose m = geometry.mount();
        double c = Math.cos(robot.heading());
        double s = Math.sin(robot.heading());
        double sx = robot.x() + c * m.x() - s * m.y();
        double sy = robot.y() + s * m.x() + c * m.y();
        double sh = robot.heading() + m.heading();
        double sd = sigma * noiseFactor;
        for (int i = 0; i < n; i++) {
            double r = world.cast(sx, sy, sh + geometry.angle(i), max);
            if (r < max) {
                if (dropout > 0 && rng.nextDouble() < dropout) {
                    r = max;
                } else if (spuriousShare > 0 && faultRng.nextDouble() < spuriousShare) {
                    r = max;
                } else if (sd > 0) {
                    r = Math.max(0, Math.min(max, r + sd * rng.nextGaussian()));
                }
            }
            out[i] = (float) r;
        }
    }
}
