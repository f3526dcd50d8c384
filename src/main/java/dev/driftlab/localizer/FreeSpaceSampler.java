package dev.driftlab.localizer;

import java.util.SplittableRandom;

/**
 * Draws positions uniformly from the reachable free space of the believed map. Used for global
 * initialisation, random injection and sensor-resetting candidates.
 */
@FunctionalInterface
public interface FreeSpaceSampler {

    /**
     * Writes {@code count} positions, uniform over reachable free space, into {@code xOut[from ..
     * from + count)} and {@code yOut[from .. from + count)}. Must draw all its randomness from
     * {@code rng} so that the filter stays deterministic from its seed.
     *
     * @param rng the only source of randomness
     * @param xOut receives x in metres, site frame
     * @param yOut receives y in metres, site frame
     * @param from first index to write
     * @param count number of positions to write
     */
    void sample(SplittableRandom rng, double[] xOut, double[] yOut, int from, int count);
}
