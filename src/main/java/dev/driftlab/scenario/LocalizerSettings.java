package dev.driftlab.scenario;

/**
 * Configuration of the Monte Carlo localization filter, grouped as the settings screens show it.
 * Units are SI and radians. The textbook symbol of each setting is named in its group's docs.
 *
 * @param particles particle count, adaptive count and initialisation
 * @param motionNoise odometry motion model noise (alpha1..alpha4) and update thresholds
 * @param rangeModel measurement model and its mixture weights
 * @param resampling resampling scheme and when it runs
 * @param recovery kidnap recovery: random injection and sensor resetting
 */
public record LocalizerSettings(
        Particles particles, MotionNoise motionNoise, RangeModel rangeModel, Resampling resampling, Recovery recovery) {

    /** Checks presence of every group. */
    public LocalizerSettings {
        Checks.present(particles, "particles");
        Checks.present(motionNoise, "motionNoise");
        Checks.present(rangeModel, "rangeModel");
        Checks.present(resampling, "resampling");
        Checks.present(recovery, "recovery");
    }

    /** The same settings with other particle settings. */
    public LocalizerSettings withParticles(Particles p) {
        return new LocalizerSettings(p, motionNoise, rangeModel, resampling, recovery);
    }

    /** Settings that suit the sample sites: 2,000 particles, likelihood field, systematic resampling. */
    public static LocalizerSettings defaults() {
        return new LocalizerSettings(
                Particles.defaults(),
                MotionNoise.defaults(),
                RangeModel.defaults(),
                Resampling.defaults(),
                Recovery.defaults());
    }

    /** How the filter starts. */
    public enum Start {
        /** Uniform over the reachable free space of the believed map (global localization). */
        EVERYWHERE,
        /** Gaussian around the route's start pose. */
        AROUND_START
    }

    /**
     * Particle count and initialisation.
     *
     * @param count particles at start (and always, when not adaptive)
     * @param adaptive whether KLD-sampling adapts the count
     * @param minCount lower bound for the adaptive count
     * @param maxCount upper bound for the adaptive count
     * @param errorBound KLD-sampling error bound (epsilon)
     * @param confidence KLD-sampling confidence 1 - delta (e.g. 0.99)
     * @param binSize KLD histogram bin size in x and y, metres
     * @param binTurn KLD histogram bin size in heading, radians
     * @param start where the particles start
     * @param startSpread position standard deviation around the start, metres
     * @param startTurnSpread heading standard deviation around the start, radians
     */
    public record Particles(
            int count,
            boolean adaptive,
            int minCount,
            int maxCount,
            double errorBound,
            double confidence,
            double binSize,
            double binTurn,
            Start start,
            double startSpread,
            double startTurnSpread) {
        /** Checks finiteness. */
        public Particles {
            Checks.finite(errorBound, "errorBound");
            Checks.finite(confidence, "confidence");
            Checks.finite(binSize, "binSize");
            Checks.finite(binTurn, "binTurn");
            Checks.present(start, "start");
            Checks.finite(startSpread, "startSpread");
            Checks.finite(startTurnSpread, "startTurnSpread");
        }

        /**
         * The same settings with a fixed particle count (adaptive off; the adaptive bounds widened to
         * include the count).
         */
        public Particles withFixedCount(int fixed) {
            return new Particles(
                    fixed,
                    false,
                    Math.min(minCount, fixed),
                    Math.max(maxCount, fixed),
                    errorBound,
                    confidence,
                    binSize,
                    binTurn,
                    start,
                    startSpread,
                    startTurnSpread);
        }

        /** The same settings starting differently. */
        public Particles startingAt(Start where) {
            return new Particles(
                    count,
                    adaptive,
                    minCount,
                    maxCount,
                    errorBound,
                    confidence,
                    binSize,
                    binTurn,
                    where,
                    startSpread,
                    startTurnSpread);
        }

        /** 2,000 fixed particles around the start. */
        public static Particles defaults() {
            return new Particles(
                    2000,
                    false,
                    200,
                    5000,
                    0.05,
                    0.99,
                    0.5,
                    Math.toRadians(10),
                    Start.AROUND_START,
                    0.3,
                    Math.toRadians(10));
        }
    }

    /**
     * Odometry motion model noise, variance form, plus the thresholds below which the filter waits.
     *
     * @param turnFromTurn alpha1: rotation variance per squared rotation (rad^2/rad^2)
     * @param turnFromDrive alpha2: rotation variance per squared distance (rad^2/m^2)
     * @param driveFromDrive alpha3: distance variance per squared distance (m^2/m^2)
     * @param driveFromTurn alpha4: distance variance per squared rotation (m^2/rad^2)
     * @param minTravel travel in metres before a filter update
     * @param minTurn turn in radians before a filter update
     */
    public record MotionNoise(
            double turnFromTurn,
            double turnFromDrive,
            double driveFromDrive,
            double driveFromTurn,
            double minTravel,
            double minTurn) {
        /** Checks finiteness. */
        public MotionNoise {
            Checks.finite(turnFromTurn, "turnFromTurn");
            Checks.finite(turnFromDrive, "turnFromDrive");
            Checks.finite(driveFromDrive, "driveFromDrive");
            Checks.finite(driveFromTurn, "driveFromTurn");
            Checks.finite(minTravel, "minTravel");
            Checks.finite(minTurn, "minTurn");
        }

        /** Moderate noise for a robot on hard floor. */
        public static MotionNoise defaults() {
            return new MotionNoise(0.02, 0.01, 0.01, 0.02, 0.05, Math.toRadians(3));
        }
    }

    /** Which measurement model the filter uses. */
    public enum RangeModelKind {
        /** Distance from each beam end point to the nearest mapped obstacle. */
        LIKELIHOOD_FIELD,
        /** Ray cast per beam and a four-part mixture density. */
        BEAM
    }

    /**
     * Measurement model.
     *
     * @param kind likelihood field or beam model
     * @param beamStep use every k-th beam (1 = all)
     * @param hitWeight z_hit
     * @param shortWeight z_short (beam model only)
     * @param maxWeight z_max
     * @param randomWeight z_rand
     * @param hitSpread sigma_hit in metres
     * @param shortDecay lambda_short per metre (beam model only)
     * @param cellSize map grid cell size in metres
     */
    public record RangeModel(
            RangeModelKind kind,
            int beamStep,
            double hitWeight,
            double shortWeight,
            double maxWeight,
            double randomWeight,
            double hitSpread,
            double shortDecay,
            double cellSize) {
        /** Checks presence and finiteness. */
        public RangeModel {
            Checks.present(kind, "kind");
            Checks.finite(hitWeight, "hitWeight");
            Checks.finite(shortWeight, "shortWeight");
            Checks.finite(maxWeight, "maxWeight");
            Checks.finite(randomWeight, "randomWeight");
            Checks.finite(hitSpread, "hitSpread");
            Checks.finite(shortDecay, "shortDecay");
            Checks.finite(cellSize, "cellSize");
        }

        /** Likelihood field, every sixth beam, 5 cm cells. */
        public static RangeModel defaults() {
            return new RangeModel(RangeModelKind.LIKELIHOOD_FIELD, 6, 0.9, 0.05, 0.02, 0.08, 0.1, 1.0, 0.05);
        }

        /** Sum of the mixture weights that the chosen model uses. */
        public double weightSum() {
            return kind == RangeModelKind.BEAM
                    ? hitWeight + shortWeight + maxWeight + randomWeight
                    : hitWeight + maxWeight + randomWeight;
        }
    }

    /** Resampling schemes. */
    public enum Scheme {
        MULTINOMIAL,
        STRATIFIED,
        SYSTEMATIC,
        RESIDUAL
    }

    /** When resampling runs. */
    public enum ResampleWhen {
        /** When the effective sample size falls under the set fraction of the count. */
        LOW_SPREAD,
        /** After every measurement update. */
        EVERY_UPDATE
    }

    /**
     * Resampling.
     *
     * @param scheme how particles are drawn
     * @param when trigger rule
     * @param essFraction fraction of the count below which the effective sample size triggers it
     */
    public record Resampling(Scheme scheme, ResampleWhen when, double essFraction) {
        /** Checks presence and finiteness. */
        public Resampling {
            Checks.present(scheme, "scheme");
            Checks.present(when, "when");
            Checks.finite(essFraction, "essFraction");
        }

        /** Systematic resampling when the effective sample size drops below N/2. */
        public static Resampling defaults() {
            return new Resampling(Scheme.SYSTEMATIC, ResampleWhen.LOW_SPREAD, 0.5);
        }
    }

    /**
     * Kidnap recovery.
     *
     * @param injection random injection driven by the slow and fast likelihood averages (augmented
     *     MCL)
     * @param slowRate alpha_slow
     * @param fastRate alpha_fast
     * @param sensorReset sensor resetting: redraw part of the set from poses that fit the scan
     * @param resetShare share of particles redrawn on a reset, 0 to 1
     * @param resetBelow reset when the mean beam likelihood falls below this share of its slow average
     */
    public record Recovery(
            boolean injection,
            double slowRate,
            double fastRate,
            boolean sensorReset,
            double resetShare,
            double resetBelow) {
        /** Checks finiteness. */
        public Recovery {
            Checks.finite(slowRate, "slowRate");
            Checks.finite(fastRate, "fastRate");
            Checks.finite(resetShare, "resetShare");
            Checks.finite(resetBelow, "resetBelow");
        }

        /** Injection on with common rates, sensor resetting off. */
        public static Recovery defaults() {
            return new Recovery(true, 0.001, 0.1, false, 0.1, 0.2);
        }
    }
}
