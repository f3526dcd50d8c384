package dev.driftlab.localizer;

import dev.driftlab.geometry.Pose;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;

/**
 * Pose estimate and hypotheses from a weighted particle set. The estimate is the weighted mean
 * with a circular mean for heading. Hypotheses come from grouping particles into square cells and
 * joining cells that touch (8-neighbourhood) into clusters, so that two separated groups, as in a
 * two-corridor ambiguity, give two hypotheses instead of one mean between them (grid-based
 * connected components, common practice, no source).
 *
 * <p>Scratch space is sized once for the set's capacity; each call allocates only the returned
 * hypotheses.
 */
public final class PoseClusters {

    private final double invCell;
    private final double minWeight;
    private final int[] binOf;
    private final long[] keys;
    private final int[] slotBin;
    private final int[] stamps;
    private final int mask;
    private int stamp;
    private final long[] binKey;
    private final int[] parent;
    private final double[] sw;
    private final double[] sx;
    private final double[] sy;
    private final double[] sc;
    private final double[] ss;
    private final double[] mx;
    private final double[] my;
    private final double[] mh;
    private final double[] cxx;
    private final double[] cxy;
    private final double[] cxh;
    private final double[] cyy;
    private final double[] cyh;
    private final double[] chh;
    private final int[] members;

    /**
     * Clustering for sets of up to {@code capacity} particles.
     *
     * @param capacity largest particle count
     * @param cellSize side of the grouping cells in metres; clusters closer than this merge
     * @param minWeight hypotheses lighter than this share of the weight are not reported
     */
    public PoseClusters(int capacity, double cellSize, double minWeight) {
        if (!(cellSize > 0)) {
            throw new IllegalArgumentException("cluster cell size must be > 0, got " + cellSize);
        }
        this.invCell = 1.0 / cellSize;
        this.minWeight = minWeight;
        this.binOf = new int[capacity];
        int slots = Integer.highestOneBit(Math.max(16, capacity * 2 - 1)) << 1;
        this.keys = new long[slots];
        this.slotBin = new int[slots];
        this.stamps = new int[slots];
        this.mask = slots - 1;
        this.binKey = new long[capacity];
        this.parent = new int[capacity];
        this.sw = new double[capacity];
        this.sx = new double[capacity];
        this.sy = new double[capacity];
        this.sc = new double[capacity];
        this.ss = new double[capacity];
        this.mx = new double[capacity];
        this.my = new double[capacity];
        this.mh = new double[capacity];
        this.cxx = new double[capacity];
        this.cxy = new double[capacity];
        this.cxh = new double[capacity];
        this.cyy = new double[capacity];
        this.cyh = new double[capacity];
        this.chh = new double[capacity];
        this.members = new int[capacity];
    }

    /**
     * The weighted mean pose and covariance of all particles, as one hypothesis of weight 1.
     *
     * @param set particles with normalised log weights
     * @return the overall estimate
     */
    public static Hypothesis estimate(ParticleSet set) {
        int n = set.size;
        double w = 0;
        double x = 0;
        double y = 0;
        double c = 0;
        double s = 0;
        for (int i = 0; i < n; i++) {
            double wi = Math.exp(set.logWeight[i]);
            w += wi;
            x += wi * set.x[i];
            y += wi * set.y[i];
            c += wi * Math.cos(set.heading[i]);
            s += wi * Math.sin(set.heading[i]);
        }
        if (!(w > 0)) {
            w = 0;
            for (int i = 0; i < n; i++) {
                x += set.x[i];
                y += set.y[i];
                c += Math.cos(set.heading[i]);
                s += Math.sin(set.heading[i]);
            }
            w = n;
            return summarise(set, x / w, y / w, Math.atan2(s, c), true);
        }
        return summarise(set, x / w, y / w, Math.atan2(s, c), false);
    }

    private static Hypothesis summarise(ParticleSet set, double meanX, double meanY, double meanH, boolean equal) {
        int n = set.size;
        double w = 0;
        double xx = 0;
        double xy = 0;
        double xh = 0;
        double yy = 0;
        double yh = 0;
        double hh = 0;
        for (int i = 0; i < n; i++) {
            double wi = equal ? 1.0 : Math.exp(set.logWeight[i]);
            double dx = set.x[i] - meanX;
            double dy = set.y[i] - meanY;
            double dh = ParticleSet.wrap(set.heading[i] - meanH);
            w += wi;
            xx += wi * dx * dx;
            xy += wi * dx * dy;
            xh += wi * dx * dh;
            yy += wi * dy * dy;
            yh += wi * dy * dh;
            hh += wi * dh * dh;
        }
        return new Hypothesis(
                1.0, Pose.of(meanX, meanY, meanH), new Covariance(xx / w, xy / w, xh / w, yy / w, yh / w, hh / w), n);
    }

    /**
     * Clusters the particles and summarises each cluster whose weight reaches the minimum.
     *
     * @param set particles with normalised log weights
     * @return hypotheses, heaviest first; at least one when the set is not empty
     */
    public List<Hypothesis> hypotheses(ParticleSet set) {
        int n = set.size;
        nextStamp();
        int bins = 0;
        for (int i = 0; i < n; i++) {
            long key = key(Math.floor(set.x[i] * invCell), Math.floor(set.y[i] * invCell));
            int b = findOrAdd(key, bins);
            if (b == bins) {
                binKey[bins] = key;
                parent[bins] = bins;
                bins++;
            }
            binOf[i] = b;
        }
        for (int b = 0; b < bins; b++) {
            long bx = binKey[b] >> 32;
            long by = (int) binKey[b];
            for (int dx = -1; dx <= 1; dx++) {
                for (int dy = -1; dy <= 1; dy++) {
                    if (dx == 0 && dy == 0) {
                        continue;
                    }
                    int other = find(key(bx + dx, by + dy));
                    if (other >= 0) {
                        union(b, other);
                    }
                }
            }
        }
        Arrays.fill(sw, 0, bins, 0);
        Arrays.fill(sx, 0, bins, 0);
        Arrays.fill(sy, 0, bins, 0);
        Arrays.fill(sc, 0, bins, 0);
        Arrays.fill(ss, 0, bins, 0);
        Arrays.fill(members, 0, bins, 0);
        double total = 0;
        for (int i = 0; i < n; i++) {
            int r = root(binOf[i]);
            double wi = Math.exp(set.logWeight[i]);
            total += wi;
            sw[r] += wi;
            sx[r] += wi * set.x[i];
            sy[r] += wi * set.y[i];
            sc[r] += wi * Math.cos(set.heading[i]);
            ss[r] += wi * Math.sin(set.heading[i]);
            members[r]++;
        }
        boolean equal = !(total > 0);
        if (equal) {
            // Every weight underflowed: summarise the particles as equally likely.
            Arrays.fill(sw, 0, bins, 0);
            Arrays.fill(sx, 0, bins, 0);
            Arrays.fill(sy, 0, bins, 0);
            Arrays.fill(sc, 0, bins, 0);
            Arrays.fill(ss, 0, bins, 0);
            for (int i = 0; i < n; i++) {
                int r = root(binOf[i]);
                sw[r] += 1;
                sx[r] += set.x[i];
                sy[r] += set.y[i];
                sc[r] += Math.cos(set.heading[i]);
                ss[r] += Math.sin(set.heading[i]);
            }
            total = n;
        }
        for (int b = 0; b < bins; b++) {
            if (parent[b] == b && sw[b] > 0) {
                mx[b] = sx[b] / sw[b];
                my[b] = sy[b] / sw[b];
                mh[b] = Math.atan2(ss[b], sc[b]);
            }
            cxx[b] = cxy[b] = cxh[b] = cyy[b] = cyh[b] = chh[b] = 0;
        }
        for (int i = 0; i < n; i++) {
            int r = root(binOf[i]);
            double wi = equal ? 1.0 : Math.exp(set.logWeight[i]);
            double dx = set.x[i] - mx[r];
            double dy = set.y[i] - my[r];
            double dh = ParticleSet.wrap(set.heading[i] - mh[r]);
            cxx[r] += wi * dx * dx;
            cxy[r] += wi * dx * dy;
            cxh[r] += wi * dx * dh;
            cyy[r] += wi * dy * dy;
            cyh[r] += wi * dy * dh;
            chh[r] += wi * dh * dh;
        }
        List<Hypothesis> out = new ArrayList<>();
        Hypothesis heaviest = null;
        for (int b = 0; b < bins; b++) {
            if (parent[b] != b || !(sw[b] > 0)) {
                continue;
            }
            double share = sw[b] / total;
            double w = sw[b];
            Hypothesis h = new Hypothesis(
                    share,
                    Pose.of(mx[b], my[b], mh[b]),
                    new Covariance(cxx[b] / w, cxy[b] / w, cxh[b] / w, cyy[b] / w, cyh[b] / w, chh[b] / w),
                    members[b]);
            if (heaviest == null || share > heaviest.weight()) {
                heaviest = h;
            }
            if (share >= minWeight) {
                out.add(h);
            }
        }
        if (out.isEmpty() && heaviest != null) {
            out.add(heaviest);
        }
        out.sort((a, b) -> Double.compare(b.weight(), a.weight()));
        return List.copyOf(out);
    }

    private static long key(double bx, double by) {
        return key((long) bx, (long) by);
    }

    private static long key(long bx, long by) {
        return (bx << 32) | (by & 0xFFFFFFFFL);
    }

    private void nextStamp() {
        stamp++;
        if (stamp == 0) {
            Arrays.fill(stamps, 0);
            stamp = 1;
        }
    }

    private int findOrAdd(long key, int newBin) {
        int slot = slot(key);
        while (stamps[slot] == stamp) {
            if (keys[slot] == key) {
                return slotBin[slot];
            }
            slot = (slot + 1) & mask;
        }
        stamps[slot] = stamp;
        keys[slot] = key;
        slotBin[slot] = newBin;
        return newBin;
    }

    private int find(long key) {
        int slot = slot(key);
        while (stamps[slot] == stamp) {
            if (keys[slot] == key) {
                return slotBin[slot];
            }
            slot = (slot + 1) & mask;
        }
        return -1;
    }

    private int slot(long key) {
        return (int) ((key * 0x9E3779B97F4A7C15L) >>> 40) & mask;
    }

    private int root(int b) {
        while (parent[b] != b) {
            parent[b] = parent[parent[b]];
            b = parent[b];
        }
        return b;
    }

    private void union(int a, int b) {
        int ra = root(a);
        int rb = root(b);
        if (ra != rb) {
            // Lower index as root keeps the result independent of visiting order details.
            if (ra < rb) {
                parent[rb] = ra;
            } else {
                parent[ra] = rb;
            }
        }
    }
}
