package dev.driftlab.localizer;

import dev.driftlab.geometry.NormalMath;
import dev.driftlab.scenario.LocalizerSettings.Particles;

/**
 * Adaptive particle count by KLD-sampling (Fox, "Adapting the sample size in particle filters
 * through KLD-sampling", IJRR 22(12), 2003): enough particles that, with probability {@code 1 -
 * delta}, the Kullback-Leibler distance between the particle histogram and the true posterior
 * stays under {@code epsilon}, given {@code k} occupied histogram bins in x, y and heading.
 *
 * <p>Fox counts bins while drawing samples one at a time; here the bins are counted over the
 * predicted set (after the motion update), which is the set Fox's samples come from, and the next
 * resampling draws the resulting count. That keeps every resampling scheme usable (common practice,
 * no source).
 */
public final class KldSampling {

    private final double epsilon;
    private final double z;
    private final int minCount;
    private final int maxCount;
    private final double invBin;
    private final double invTurn;

    // Open-addressing set of bin keys; a stamp per slot avoids clearing between updates.
    private final long[] keys;
    private final int[] stamps;
    private final int mask;
    private int stamp;

    /**
     * KLD-sampling with the particle settings (validated).
     *
     * @param settings error bound, confidence, bin sizes and count limits
     */
    public KldSampling(Particles settings) {
        this.epsilon = settings.errorBound();
        this.z = NormalMath.quantile(settings.confidence());
        this.minCount = settings.minCount();
        this.maxCount = settings.maxCount();
        this.invBin = 1.0 / settings.binSize();
        this.invTurn = 1.0 / settings.binTurn();
        int slots = Integer.highestOneBit(Math.max(16, maxCount * 4 - 1)) << 1;
        this.keys = new long[slots];
        this.stamps = new int[slots];
        this.mask = slots - 1;
    }

    /**
     * The Wilson-Hilferty form of Fox's bound: {@code n = (k - 1) / (2 epsilon) * (1 - 2 / (9 (k -
     * 1)) + sqrt(2 / (9 (k - 1))) z_{1 - delta})^3}, rounded up.
     *
     * @param bins occupied bins k; for k below 2 the bound is 1
     * @param epsilon error bound, greater than 0
     * @param confidence 1 - delta, in (0, 1)
     * @return the number of particles needed
     */
    public static int bound(int bins, double epsilon, double confidence) {
        return bound(bins, epsilon, confidence, NormalMath.quantile(confidence));
    }

    private static int bound(int bins, double epsilon, double confidence, double zq) {
        if (bins < 2) {
            return 1;
        }
        double km1 = bins - 1;
        double a = 2.0 / (9.0 * km1);
        double t = 1.0 - a + Math.sqrt(a) * zq;
        double n = km1 / (2.0 * epsilon) * t * t * t;
        return n >= Integer.MAX_VALUE ? Integer.MAX_VALUE : (int) Math.ceil(n);
    }

    /**
     * Number of distinct (x, y, heading) bins the particles occupy.
     *
     * @param set particles
     * @return occupied bins, at least 1 for a non-empty set
     */
    public int occupiedBins(ParticleSet set) {
        stamp++;
        if (stamp == 0) {
            java.util.Arrays.fill(stamps, 0);
            stamp = 1;
        }
        int n = set.size;
        int count = 0;
        for (int i = 0; i < n; i++) {
            long bx = (long) Math.floor(set.x[i] * invBin) & 0x1FFFFF;
            long by = (long) Math.floor(set.y[i] * invBin) & 0x1FFFFF;
            long bh = (long) Math.floor((set.heading[i] + Math.PI) * invTurn) & 0x1FFFFF;
            long key = (bx << 42) | (by << 21) | bh;
            int slot = (int) ((key * 0x9E3779B97F4A7C15L) >>> 40) & mask;
            while (true) {
                if (stamps[slot] != stamp) {
                    stamps[slot] = stamp;
                    keys[slot] = key;
                    count++;
                    break;
                }
                if (keys[slot] == key) {
                    break;
                }
                slot = (slot + 1) & mask;
            }
            if (count * 2 > keys.length) {
                // More bins than the table was sized for: the count is already past any bound.
                break;
            }
        }
        return count;
    }

    /**
     * The particle count for the next resampling: the bound for the occupied bins, clamped to the
     * minimum and maximum count.
     *
     * @param set particles after the motion update
     * @return count in [minCount, maxCount]
     */
    public int targetCount(ParticleSet set) {
        int n = bound(occupiedBins(set), epsilon, 0, z);
        return Math.max(minCount, Math.min(maxCount, n));
    }
}
