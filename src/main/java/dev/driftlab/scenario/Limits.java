package dev.driftlab.scenario;

/**
 * Upper bounds on scenario sizes. They keep one scenario within what a run on a small server can
 * hold, and catch typing slips such as a site in millimetres or a particle count with three extra
 * zeros.
 */
public final class Limits {
    /** Largest site extent along either axis, metres. */
    public static final double MAX_SITE_EXTENT = 1000.0;
    /** Most beams per scan. */
    public static final int MAX_BEAMS = 4096;
    /** Most particles, for the fixed count and the adaptive maximum. */
    public static final int MAX_PARTICLES = 1_000_000;
    /** Most waypoints on a route. */
    public static final int MAX_WAYPOINTS = 2000;
    /** Most corners in one outline. */
    public static final int MAX_CORNERS = 1000;
    /** Most faults in one scenario. */
    public static final int MAX_FAULTS = 500;
    /** Most settings variants. */
    public static final int MAX_VARIANTS = 20;
    /** Most gates. */
    public static final int MAX_GATES = 50;
    /** Most contacts a no-contact gate may allow in one trial. */
    public static final int MAX_GATE_CONTACTS = 1000;
    /** Longest run, seconds of robot time (2 hours). */
    public static final double MAX_RUN_SECONDS = 7200.0;
    /** Most cells in the believed map's occupancy grid. */
    public static final long MAX_GRID_CELLS = 64_000_000L;

    /**
     * Least KLD-sampling confidence (1 - delta). Below one half the normal quantile in the
     * Wilson-Hilferty form of the bound ({@code KldSampling.bound}) turns negative, so the count
     * falls under the chi-square mean: a "confidence" worse than a coin toss. Lower still the bound
     * reaches zero or below (for two bins, below about 0.05) and the filter would run on its
     * minimum count whatever the spread. Fox ("Adapting the sample size in particle filters
     * through KLD-sampling", IJRR 22(12), 2003) works with 0.99 (from memory).
     */
    public static final double MIN_CONFIDENCE = 0.5;

    /**
     * Most KLD-sampling confidence, 1 - 10^-4. Towards 1 the normal quantile grows without limit
     * (at 1 it is infinite and the bound overflows), so the count only runs to the maximum, which a
     * fixed count says more plainly. The editor's form offers the same range.
     */
    public static final double MAX_CONFIDENCE = 0.9999;

    private Limits() {}
}
