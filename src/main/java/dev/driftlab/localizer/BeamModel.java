package dev.driftlab.localizer;

import dev.driftlab.geometry.NormalMath;
import dev.driftlab.scenario.LocalizerSettings.RangeModel;

/**
 * The beam range model (Thrun, Burgard and Fox, Probabilistic Robotics, section 6.3): each beam's
 * measured range {@code z} is scored against the range {@code z*} a ray cast from the pose
 * expects, with the mixture {@code z_hit p_hit + z_short p_short + z_max p_max + z_rand p_rand}:
 * a Gaussian around {@code z*} truncated to [0, z_max], an exponential for unexpected short
 * returns before {@code z*}, a point mass at {@code z_max} and a uniform part.
 */
public final class BeamModel implements MeasurementModel {

    /** Beyond this many spreads from both ends of [0, z_max] the truncation factor is 1 to double precision. */
    private static final double NO_TRUNCATION = 8.5;

    /** Rays per batch handed to the caster: enough to keep its lanes busy, small enough for L1/L2. */
    private static final int BATCH_RAYS = 4096;

    private final BeamCaster caster;
    private final double hitWeight;
    private final double shortWeight;
    private final double maxWeight;
    private final double randomWeight;
    private final double sigma;
    private final double lambda;
    private final double hitCoef;
    private final int beamStep;

    /** Ray batches of the calling thread; threads of one filter call this model at once. */
    private final ThreadLocal<RayScratch> scratch = ThreadLocal.withInitial(RayScratch::new);

    private double[] ranges = new double[0];
    private double[] angles = new double[0];
    private int used;
    private double maxRange;
    private double mountX;
    private double mountY;
    private double mountTurn;
    private double[] beamCos = new double[0];
    private double[] beamSin = new double[0];
    /** Log density per used beam over expected ranges 0, step, 2 step, ... (row k at k * tableWidth). */
    private double[] table = new double[0];

    private int tableWidth;
    private double tableStep;

    /**
     * A beam model over a ray caster.
     *
     * @param caster ray caster of the believed map
     * @param settings range model settings (validated); the four weights are rescaled to sum to 1
     */
    public BeamModel(BeamCaster caster, RangeModel settings) {
        this.caster = caster;
        double sum = settings.hitWeight() + settings.shortWeight() + settings.maxWeight() + settings.randomWeight();
        this.hitWeight = settings.hitWeight() / sum;
        this.shortWeight = settings.shortWeight() / sum;
        this.maxWeight = settings.maxWeight() / sum;
        this.randomWeight = settings.randomWeight() / sum;
        this.sigma = settings.hitSpread();
        this.lambda = settings.shortDecay();
        this.hitCoef = NormalMath.INV_SQRT_2PI / sigma;
        this.beamStep = settings.beamStep();
    }

    /**
     * The mixture density for a measured range given the expected one, per metre; at {@code z >=
     * zMax} the point mass enters with value 1, as in the book.
     *
     * @param z measured range in metres
     * @param expected expected range z* in metres, in [0, zMax]
     * @param zMax sensor max range in metres
     * @return the mixture value
     */
    public double density(double z, double expected, double zMax) {
        return hitWeight * hitPart(z, expected, zMax)
                + shortWeight * shortPart(z, expected)
                + (z >= zMax ? maxWeight : 0.0)
                + (z < zMax ? randomWeight / zMax : 0.0);
    }

    /** The truncated Gaussian p_hit, per metre. */
    double hitPart(double z, double expected, double zMax) {
        if (z < 0 || z > zMax) {
            return 0;
        }
        double dz = z - expected;
        double g = hitCoef * Math.exp(-0.5 * dz * dz / (sigma * sigma));
        return g * truncation(expected, zMax);
    }

    /** 1 / (probability mass of N(z*, sigma) on [0, zMax]). */
    double truncation(double expected, double zMax) {
        if (expected > NO_TRUNCATION * sigma && zMax - expected > NO_TRUNCATION * sigma) {
            return 1.0;
        }
        double mass = NormalMath.cdf((zMax - expected) / sigma) - NormalMath.cdf(-expected / sigma);
        return mass > 0 ? 1.0 / mass : 0.0;
    }

    /** The exponential p_short on [0, z*], normalised to 1 over that interval, per metre. */
    double shortPart(double z, double expected) {
        if (z < 0 || z > expected || expected <= 0) {
            return 0;
        }
        return lambda * Math.exp(-lambda * z) / (-Math.expm1(-lambda * expected));
    }

    @Override
    public void prepare(Scan scan) {
        int beams = scan.beams();
        if (ranges.length < beams) {
            ranges = new double[beams];
            angles = new double[beams];
        }
        int k = 0;
        for (int b = 0; b < beams; b += beamStep) {
            ranges[k] = scan.ranges[b];
            angles[k] = scan.angles[b];
            k++;
        }
        used = k;
        maxRange = scan.maxRange;
        mountX = scan.mount.x();
        mountY = scan.mount.y();
        mountTurn = scan.mount.heading();
        if (beamCos.length < used) {
            beamCos = new double[beams];
            beamSin = new double[beams];
        }
        for (int b = 0; b < used; b++) {
            beamCos[b] = Math.cos(angles[b] + mountTurn);
            beamSin[b] = Math.sin(angles[b] + mountTurn);
        }
        buildTable();
    }

    /**
     * Tabulates the log density of every used beam against the expected range once per scan, so the
     * per-particle loop interpolates instead of evaluating exp, the normal CDF and log per beam. The
     * step is a quarter of sigma_hit (at least zMax / 4096): linear interpolation of the Gaussian's
     * log then errs by at most 1/128 in log density (under 1 %).
     */
    private void buildTable() {
        tableStep = Math.max(sigma / 4, maxRange / 4096);
        tableWidth = (int) Math.ceil(maxRange / tableStep) + 2;
        int size = used * tableWidth;
        if (table.length < size) {
            table = new double[size];
        }
        for (int k = 0; k < used; k++) {
            int row = k * tableWidth;
            for (int q = 0; q < tableWidth; q++) {
                double expected = Math.min(maxRange, q * tableStep);
                double v = density(ranges[k], expected, maxRange);
                // A zero mixture (no random or max part) must not turn into -infinity and NaN weights.
                table[row + q] = v > 1e-300 ? Math.log(v) : -690.8;
            }
        }
    }

    @Override
    public int beamsUsed() {
        return used;
    }

    @Override
    public void logLikelihoods(double[] x, double[] y, double[] heading, int from, int to, double[] out) {
        final double zMax = maxRange;
        final int n = used;
        final double inverseStep = 1.0 / tableStep;
        final int width = tableWidth;
        final int lastCell = width - 2;
        // scratch kept per thread (the filter's threads share this model), grown only when a call
        // needs more rays than before: the beams of a block of particles go to the caster as one batch, which keeps its
        // vector
        // lanes full (GridCaster.castRays)
        int block = Math.max(1, Math.min(to - from, BATCH_RAYS / Math.max(1, n)));
        int rays = block * n;
        RayScratch scratch = this.scratch.get().ensure(rays);
        double[] originX = scratch.originX;
        double[] originY = scratch.originY;
        double[] dirX = scratch.dirX;
        double[] dirY = scratch.dirY;
        double[] expected = scratch.expected;
        for (int first = from; first < to; first += block) {
            int last = Math.min(to, first + block);
            int r = 0;
            for (int p = first; p < last; p++) {
                double c = Math.cos(heading[p]);
                double s = Math.sin(heading[p]);
                double sx = x[p] + c * mountX - s * mountY;
                double sy = y[p] + s * mountX + c * mountY;
                for (int k = 0; k < n; k++, r++) {
                    originX[r] = sx;
                    originY[r] = sy;
                    dirX[r] = c * beamCos[k] - s * beamSin[k];
                    dirY[r] = s * beamCos[k] + c * beamSin[k];
                }
            }
            caster.castRays(originX, originY, dirX, dirY, 0, r, zMax, expected);
            r = 0;
            for (int p = first; p < last; p++) {
                double sum = 0;
                for (int k = 0; k < n; k++, r++) {
                    double e = expected[r] * inverseStep;
                    int q = (int) e;
                    if (q > lastCell) {
                        q = lastCell;
                    }
                    double frac = e - q;
                    int at = k * width + q;
                    sum += table[at] + frac * (table[at + 1] - table[at]);
                }
                out[p] = sum;
            }
        }
    }

    /** One thread's arrays for a batch of rays, grown on demand and then reused. */
    private static final class RayScratch {
        double[] originX = new double[0];
        double[] originY = new double[0];
        double[] dirX = new double[0];
        double[] dirY = new double[0];
        double[] expected = new double[0];

        RayScratch ensure(int rays) {
            if (originX.length < rays) {
                originX = new double[rays];
                originY = new double[rays];
                dirX = new double[rays];
                dirY = new double[rays];
                expected = new double[rays];
            }
            return this;
        }
    }
}
