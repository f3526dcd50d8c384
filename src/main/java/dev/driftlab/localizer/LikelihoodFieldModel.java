package dev.driftlab.localizer;

import dev.driftlab.geometry.NormalMath;
import dev.driftlab.scenario.LocalizerSettings.RangeModel;

/**
 * The likelihood-field range model (Thrun, Burgard and Fox, Probabilistic Robotics, table 6.3):
 * each beam end point scores {@code z_hit * N(d; 0, sigma_hit) + z_rand / z_max}, with {@code d} the
 * distance from the end point to the nearest obstacle. Readings at max range carry no end point
 * and are left out, as in the table.
 *
 * <p>The log of that value is precomputed for every grid cell, so scoring a beam is a rotation,
 * two casts and one table read: no exp, log or trigonometry per beam. End points outside the grid
 * score as if far from every obstacle.
 */
public final class LikelihoodFieldModel implements MeasurementModel {

    private final DistanceGrid grid;
    private final int width;
    private final int height;
    private final double originX;
    private final double originY;
    private final double invCell;
    private final double hitWeight;
    private final double randomWeight;
    private final double hitSpread;
    private final int beamStep;

    private float[] logTable;
    private double tableMaxRange = Double.NaN;
    private float outsideLog;

    // Prepared scan, in grid cells: end point of each used beam in the sensor frame.
    private double[] beamX = new double[0];
    private double[] beamY = new double[0];
    private int used;
    private double mountX;
    private double mountY;
    private double mountTurn;

    /**
     * A likelihood-field model over a distance grid.
     *
     * @param grid distance field of the believed map
     * @param settings range model settings (validated); hit and random weights are rescaled by the
     *     sum of the weights the model uses
     */
    public LikelihoodFieldModel(DistanceGrid grid, RangeModel settings) {
        this.grid = grid;
        this.width = grid.width();
        this.height = grid.height();
        this.originX = grid.originX();
        this.originY = grid.originY();
        this.invCell = 1.0 / grid.cellSize();
        double sum = settings.hitWeight() + settings.maxWeight() + settings.randomWeight();
        this.hitWeight = settings.hitWeight() / sum;
        this.randomWeight = settings.randomWeight() / sum;
        this.hitSpread = settings.hitSpread();
        this.beamStep = settings.beamStep();
    }

    /**
     * Per-beam likelihood of a beam end point, {@code z_hit * N(d; 0, sigma_hit) + z_rand / z_max}
     * with {@code d} the distance of the grid cell holding the end point; the value the hot loop
     * uses, exponentiated back.
     *
     * @param endX end point x in metres, site frame
     * @param endY end point y in metres, site frame
     * @param maxRange sensor max range z_max in metres
     * @return the per-beam likelihood, per metre
     */
    public double beamLikelihood(double endX, double endY, double maxRange) {
        ensureTable(maxRange);
        double gx = (endX - originX) * invCell;
        double gy = (endY - originY) * invCell;
        if (gx >= 0 && gy >= 0 && gx < width && gy < height) {
            return Math.exp(logTable[(int) gy * width + (int) gx]);
        }
        return Math.exp(outsideLog);
    }

    /** Log of the per-beam likelihood for a distance in metres; the formula the table holds. */
    double logValue(double d, double maxRange) {
        double hit = hitWeight * NormalMath.INV_SQRT_2PI / hitSpread * Math.exp(-0.5 * d * d / (hitSpread * hitSpread));
        double v = hit + randomWeight / maxRange;
        if (v > 0) {
            return Math.log(v);
        }
        // No random part and a far end point: keep the Gaussian's log finite instead of log(0).
        return Math.log(hitWeight * NormalMath.INV_SQRT_2PI / hitSpread) - 0.5 * d * d / (hitSpread * hitSpread);
    }

    private void ensureTable(double maxRange) {
        if (maxRange == tableMaxRange) {
            return;
        }
        float[] d = grid.distances();
        float[] table = new float[d.length];
        for (int i = 0; i < d.length; i++) {
            table[i] = (float) logValue(d[i], maxRange);
        }
        logTable = table;
        outsideLog = (float) logValue(Math.max(maxRange, 10 * hitSpread), maxRange);
        tableMaxRange = maxRange;
    }

    @Override
    public void prepare(Scan scan) {
        ensureTable(scan.maxRange);
        int beams = scan.beams();
        if (beamX.length < beams) {
            beamX = new double[beams];
            beamY = new double[beams];
        }
        int k = 0;
        for (int b = 0; b < beams; b += beamStep) {
            double r = scan.ranges[b];
            if (r >= scan.maxRange) {
                continue;
            }
            beamX[k] = r * Math.cos(scan.angles[b]) * invCell;
            beamY[k] = r * Math.sin(scan.angles[b]) * invCell;
            k++;
        }
        used = k;
        mountX = scan.mount.x();
        mountY = scan.mount.y();
        mountTurn = scan.mount.heading();
    }

    @Override
    public int beamsUsed() {
        return used;
    }

    @Override
    public void logLikelihoods(double[] x, double[] y, double[] heading, int from, int to, double[] out) {
        final float[] table = logTable;
        final double[] bx = beamX;
        final double[] by = beamY;
        final int n = used;
        final int w = width;
        final int h = height;
        final float outside = outsideLog;
        for (int p = from; p < to; p++) {
            double c = Math.cos(heading[p]);
            double s = Math.sin(heading[p]);
            double sx = ((x[p] + c * mountX - s * mountY) - originX) * invCell;
            double sy = ((y[p] + s * mountX + c * mountY) - originY) * invCell;
            double cs = c;
            double ss = s;
            if (mountTurn != 0) {
                cs = Math.cos(heading[p] + mountTurn);
                ss = Math.sin(heading[p] + mountTurn);
            }
            double sum = 0;
            for (int k = 0; k < n; k++) {
                double gx = sx + cs * bx[k] - ss * by[k];
                double gy = sy + ss * bx[k] + cs * by[k];
                int ix = (int) gx;
                int iy = (int) gy;
                if (gx >= 0 && gy >= 0 && ix < w && iy < h) {
                    sum += table[iy * w + ix];
                } else {
                    sum += outside;
                }
            }
            out[p] = sum;
        }
    }
}
