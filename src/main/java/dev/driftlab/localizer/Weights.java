package dev.driftlab.localizer;

/**
 * Weight arithmetic on primitive arrays: log-sum-exp normalisation and the effective sample size.
 * Nothing here allocates.
 */
public final class Weights {

    private Weights() {}

    /**
     * Natural log of {@code sum(exp(logs[0 .. n)))}, computed around the largest term so that it
     * neither overflows nor underflows.
     *
     * @param logs log values; {@code -infinity} stands for a zero term
     * @param n number of values to use
     * @return the log of the sum; {@code -infinity} when every term is zero or not a number
     */
    public static double logSumExp(double[] logs, int n) {
        double max = Double.NEGATIVE_INFINITY;
        for (int i = 0; i < n; i++) {
            if (logs[i] > max) {
                max = logs[i];
            }
        }
        if (max == Double.NEGATIVE_INFINITY) {
            return max;
        }
        if (max == Double.POSITIVE_INFINITY) {
            return max;
        }
        double sum = 0;
        for (int i = 0; i < n; i++) {
            sum += Math.exp(logs[i] - max);
        }
        return max + Math.log(sum);
    }

    /**
     * Normalises log weights in place so that their exponentials sum to 1 and writes the linear
     * weights into {@code weightsOut}.
     *
     * @param logs log weights, overwritten with normalised log weights
     * @param n number of weights
     * @param weightsOut receives the normalised weights (may be null-free scratch of length n)
     * @return the log of the sum before normalisation; {@code -infinity} if every weight was zero,
     *     in which case the weights are set equal
     */
    public static double normalizeLog(double[] logs, int n, double[] weightsOut) {
        double total = logSumExp(logs, n);
        if (!Double.isFinite(total)) {
            // Nothing to normalise by: fall back to equal weights rather than divide by zero.
            double lw = -Math.log(n);
            double w = 1.0 / n;
            for (int i = 0; i < n; i++) {
                logs[i] = lw;
                weightsOut[i] = w;
            }
            return total;
        }
        for (int i = 0; i < n; i++) {
            double l = logs[i] - total;
            if (!(l == l)) {
                l = Double.NEGATIVE_INFINITY;
            }
            logs[i] = l;
            weightsOut[i] = Math.exp(l);
        }
        return total;
    }

    /**
     * Effective sample size {@code 1 / sum(w_i^2)} of normalised weights (Kong, Liu and Wong 1994):
     * n for equal weights, 1 when one particle holds all the weight.
     *
     * @param weights normalised weights
     * @param n number of weights
     * @return effective sample size in [1, n]
     */
    public static double effectiveSampleSize(double[] weights, int n) {
        double sumSq = 0;
        for (int i = 0; i < n; i++) {
            sumSq += weights[i] * weights[i];
        }
        return sumSq > 0 ? 1.0 / sumSq : 0.0;
    }
}
