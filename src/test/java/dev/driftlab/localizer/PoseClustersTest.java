package dev.driftlab.localizer;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.List;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

class PoseClustersTest {

    @Test
    void twoCorridorAmbiguity_givesTwoHypotheses_withTheirWeightsMeansAndSpreads() {
        // Two groups 4 m apart, as in two parallel corridors that look alike; 70 % / 30 % of the weight.
        int n = 2000;
        ParticleSet set = new ParticleSet(n);
        double[] xs = new double[n];
        double[] ys = new double[n];
        double[] hs = new double[n];
        SplittableRandom rng = new SplittableRandom(5);
        for (int i = 0; i < n; i++) {
            boolean first = i < n / 2;
            xs[i] = (first ? 2.0 : 6.0) + 0.1 * rng.nextGaussian();
            ys[i] = 1.0 + 0.1 * rng.nextGaussian();
            // Headings straddle +-pi: the circular mean must be pi, not 0.
            hs[i] = Math.PI + 0.05 * rng.nextGaussian();
        }
        set.setAll(xs, ys, hs, n);
        for (int i = 0; i < n; i++) {
            set.logWeight[i] = Math.log((i < n / 2 ? 0.7 : 0.3) / (n / 2));
        }
        List<Hypothesis> h = new PoseClusters(n, 0.5, 0.05).hypotheses(set);
        assertThat(h).hasSize(2);
        assertThat(h.get(0).weight()).isCloseTo(0.7, within(1e-9));
        assertThat(h.get(1).weight()).isCloseTo(0.3, within(1e-9));
        // Sample mean of 1,000 draws with sd 0.1: standard error 0.0032; 5 standard errors.
        assertThat(h.get(0).mean().x()).isCloseTo(2.0, within(0.016));
        assertThat(h.get(1).mean().x()).isCloseTo(6.0, within(0.016));
        assertThat(Math.abs(h.get(0).mean().heading())).isCloseTo(Math.PI, within(0.01));
        // Variance estimate of 1,000 normal draws: relative standard error sqrt(2/999) = 4.5 %.
        assertThat(h.get(0).covariance().xx()).isCloseTo(0.01, within(0.0025));
        assertThat(h.get(0).covariance().hh()).isCloseTo(0.0025, within(0.0006));

        Hypothesis all = PoseClusters.estimate(set);
        assertThat(all.mean().x()).as("the meaningless average between them").isCloseTo(3.2, within(0.02));
    }

    @Test
    void estimate_withEveryWeightZero_stillGivesAFinitePose() {
        ParticleSet set = new ParticleSet(3);
        set.setAll(new double[] {0, 1, 2}, new double[] {0, 0, 0}, new double[] {0, 0, 0}, 3);
        java.util.Arrays.fill(set.logWeight, Double.NEGATIVE_INFINITY);
        assertThat(PoseClusters.estimate(set).mean().x()).isCloseTo(1.0, within(1e-12));
        assertThat(new PoseClusters(3, 0.5, 0.05).hypotheses(set)).isNotEmpty();
    }
}
