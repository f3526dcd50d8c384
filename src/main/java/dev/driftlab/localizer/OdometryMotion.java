package dev.driftlab.localizer;

import dev.driftlab.geometry.Angles;
import dev.driftlab.geometry.Pose;
import dev.driftlab.scenario.LocalizerSettings.MotionNoise;
import java.util.SplittableRandom;

/**
 * The odometry motion model in sampling form (Thrun, Burgard and Fox, Probabilistic Robotics,
 * table 5.6), with the noise settings as variances: the relative motion between two odometry poses
 * is split into a first turn, a straight drive and a second turn, each is perturbed by zero-mean
 * Gaussian noise whose variance grows with the squared turn and drive, and the result is applied
 * to every particle.
 */
public final class OdometryMotion {

    /**
     * Below this drive in metres the direction of travel is noise, so the first turn is taken as 0
     * (common practice, no source).
     */
    static final double TINY_DRIVE = 1e-3;

    private final double turnFromTurn;
    private final double turnFromDrive;
    private final double driveFromDrive;
    private final double driveFromTurn;

    /**
     * A motion model with the given noise (already validated).
     *
     * @param noise alpha1..alpha4 as variances per squared motion
     */
    public OdometryMotion(MotionNoise noise) {
        this.turnFromTurn = noise.turnFromTurn();
        this.turnFromDrive = noise.turnFromDrive();
        this.driveFromDrive = noise.driveFromDrive();
        this.driveFromTurn = noise.driveFromTurn();
    }

    /**
     * The relative motion between two odometry poses, decomposed as in table 5.6.
     *
     * @param firstTurn turn before driving, radians
     * @param drive straight drive, metres, never negative
     * @param secondTurn turn after driving, radians
     */
    public record Delta(double firstTurn, double drive, double secondTurn) {

        /**
         * Decomposes the motion from {@code before} to {@code after}, both in the odometry frame.
         * Below {@value OdometryMotion#TINY_DRIVE} m of drive the first turn is 0.
         *
         * @param before odometry pose at the previous update
         * @param after odometry pose now
         * @return the decomposed motion
         */
        public static Delta between(Pose before, Pose after) {
            double dx = after.x() - before.x();
            double dy = after.y() - before.y();
            double drive = Math.hypot(dx, dy);
            double firstTurn = drive < TINY_DRIVE ? 0.0 : Angles.wrap(Math.atan2(dy, dx) - before.heading());
            double secondTurn = Angles.wrap(after.heading() - before.heading() - firstTurn);
            return new Delta(firstTurn, drive, secondTurn);
        }
    }

    /**
     * Moves particles {@code [0, set.size())} by a sampled version of {@code delta}.
     *
     * @param set particles, updated in place
     * @param delta motion since the last update
     * @param rng source of the motion noise
     */
    public void apply(ParticleSet set, Delta delta, SplittableRandom rng) {
        double r1 = delta.firstTurn();
        double t = delta.drive();
        double r2 = delta.secondTurn();
        // Noise grows with how much the robot turned; driving backwards shows up as a first turn
        // near pi that should count as a small turn (common practice, no source).
        double r1n = Math.min(Math.abs(r1), Math.PI - Math.abs(r1));
        double r2n = Math.min(Math.abs(r2), Math.PI - Math.abs(r2));
        double sdR1 = Math.sqrt(turnFromTurn * r1n * r1n + turnFromDrive * t * t);
        double sdT = Math.sqrt(driveFromDrive * t * t + driveFromTurn * (r1n * r1n + r2n * r2n));
        double sdR2 = Math.sqrt(turnFromTurn * r2n * r2n + turnFromDrive * t * t);
        double[] xs = set.x;
        double[] ys = set.y;
        double[] hs = set.heading;
        int n = set.size;
        for (int i = 0; i < n; i++) {
            double hr1 = r1 - sdR1 * rng.nextGaussian();
            double ht = t - sdT * rng.nextGaussian();
            double hr2 = r2 - sdR2 * rng.nextGaussian();
            double a = hs[i] + hr1;
            xs[i] += ht * Math.cos(a);
            ys[i] += ht * Math.sin(a);
            hs[i] = ParticleSet.wrap(a + hr2);
        }
    }
}
