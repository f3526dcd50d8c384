package dev.driftlab.geometry;

/**
 * Standard normal helpers, the one home of the normal quantile: the filter needs them at run time
 * (KLD bound, beam model), where no statistics library is allowed, and the batch statistics need
 * the quantile for interval bounds. They live in the lowest stage so both can reach them.
 */
public final class NormalMath {

    public static final double INV_SQRT_2PI = 1.0 / Math.sqrt(2 * Math.PI);

    private NormalMath() {}

    /**
     * Complementary error function by the Chebyshev fit of Numerical Recipes (erfcc), fractional
     * error below 1.2e-7 everywhere (coefficients from memory; checked against Commons Math in
     * the tests).
     */
    public static double erfc(double x) {
        double z = Math.abs(x);
        double t = 1.0 / (1.0 + 0.5 * z);
        double ans = t
                * Math.exp(
                        -z * z
                                - 1.26551223
                                + t
                                        * (1.00002368
                                                + t
                                                        * (0.37409196
                                                                + t
                                                                        * (0.09678418
                                                                                + t
                                                                                        * (-0.18628806
                                                                                                + t
                                                                                                        * (0.27886807
                                                                                                                + t
                                                                                                                        * (-1.13520398
                                                                                                                                + t
                                                                                                                                        * (1.48851587
                                                                                                                                                + t
                                                                                                                                                        * (-0.82215223
                                                                                                                                                                + t
                                                                                                                                                                        * 0.17087277)))))))));
        return x >= 0 ? ans : 2.0 - ans;
    }

    /** Standard normal cumulative distribution function. */
    public static double cdf(double z) {
        return 0.5 * erfc(-z / Math.sqrt(2));
    }

    /**
     * Standard normal quantile by Acklam's rational approximation (relative error about 1.15e-9;
     * coefficients from memory, checked against Commons Math in the tests).
     *
     * @param p probability in (0, 1)
     */
    public static double quantile(double p) {
        if (!(p > 0 && p < 1)) {
            throw new IllegalArgumentException("probability must be in (0, 1), got " + p);
        }
        final double pLow = 0.02425;
        if (p < pLow) {
            double q = Math.sqrt(-2 * Math.log(p));
            return (((((C1 * q + C2) * q + C3) * q + C4) * q + C5) * q + C6)
                    / ((((D1 * q + D2) * q + D3) * q + D4) * q + 1);
        }
        if (p > 1 - pLow) {
            double q = Math.sqrt(-2 * Math.log(1 - p));
            return -(((((C1 * q + C2) * q + C3) * q + C4) * q + C5) * q + C6)
                    / ((((D1 * q + D2) * q + D3) * q + D4) * q + 1);
        }
        double q = p - 0.5;
        double r = q * q;
        return (((((A1 * r + A2) * r + A3) * r + A4) * r + A5) * r + A6)
                * q
                / (((((B1 * r + B2) * r + B3) * r + B4) * r + B5) * r + 1);
    }

    private static final double A1 = -3.969683028665376e+01;
    private static final double A2 = 2.209460984245205e+02;
    private static final double A3 = -2.759285104469687e+02;
    private static final double A4 = 1.383577518672690e+02;
    private static final double A5 = -3.066479806614716e+01;
    private static final double A6 = 2.506628277459239e+00;
    private static final double B1 = -5.447609879822406e+01;
    private static final double B2 = 1.615858368580409e+02;
    private static final double B3 = -1.556989798598866e+02;
    private static final double B4 = 6.680131188771972e+01;
    private static final double B5 = -1.328068155288572e+01;
    private static final double C1 = -7.784894002430293e-03;
    private static final double C2 = -3.223964580411365e-01;
    private static final double C3 = -2.400758277161838e+00;
    private static final double C4 = -2.549732539343734e+00;
    private static final double C5 = 4.374664141464968e+00;
    private static final double C6 = 2.938163982698783e+00;
    private static final double D1 = 7.784695709041462e-03;
    private static final double D2 = 3.224671290700398e-01;
    private static final double D3 = 2.445134137142996e+00;
    private static final double D4 = 3.754408661907416e+00;
}
