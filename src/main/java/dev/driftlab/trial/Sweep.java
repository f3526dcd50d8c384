package dev.driftlab.trial;

import dev.driftlab.localizer.KldSampling;
import dev.driftlab.localizer.MonteCarloLocalizer;
import dev.driftlab.scenario.LocalizerSettings;
import dev.driftlab.scenario.LocalizerSettings.Particles;
import dev.driftlab.scenario.SettingsVariant;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

/**
 * Particle-count sweeps: the same settings at several fixed particle counts, run on the same seeds,
 * so a team sees how many particles its site needs. Also tells what the KLD-sampling bound asks for
 * on the scenario's own starting belief, so counts below it can be flagged.
 */
public final class Sweep {

    private Sweep() {}

    /**
     * One variant per count, named like "300 particles", each a fixed count (adaptive off).
     *
     * @throws IllegalArgumentException for an empty list or a count outside 1 to 1,000,000
     */
    public static List<SettingsVariant> variants(LocalizerSettings base, int[] counts) {
        if (counts.length == 0) {
            throw new IllegalArgumentException("give at least one particle count");
        }
        List<SettingsVariant> out = new ArrayList<>();
        for (int c : counts) {
            if (c < 1 || c > dev.driftlab.scenario.Limits.MAX_PARTICLES) {
                throw new IllegalArgumentException(
                        "particle count " + c + " is outside 1 to " + dev.driftlab.scenario.Limits.MAX_PARTICLES);
            }
            out.add(new SettingsVariant(
                    name(c), base.withParticles(base.particles().withFixedCount(c))));
        }
        return out;
    }

    /** The name of a sweep's variant at a count, such as "1,000 particles". */
    public static String name(int count) {
        return String.format(Locale.ROOT, "%,d particles", count);
    }

    /**
     * Particles the KLD-sampling bound (Fox 2003) asks for to represent the scenario's starting
     * belief with the settings' error bound and confidence: the bins occupied by a large initial
     * set (the settings' maximum count) are counted and the bound evaluated for that many bins.
     */
    public static int kldRequired(TrialRunner runner, LocalizerSettings settings, long seed) {
        Particles p = settings.particles();
        int probe = Math.max(p.maxCount(), Math.max(p.count(), 5000));
        LocalizerSettings probeSettings = settings.withParticles(p.withFixedCount(probe));
        try (MonteCarloLocalizer filter = new MonteCarloLocalizer(probeSettings, runner.views(settings), seed, 1)) {
            filter.initialize(runner.scenario().route().start());
            int bins = new KldSampling(p).occupiedBins(filter.particles());
            return KldSampling.bound(bins, p.errorBound(), p.confidence());
        }
    }
}
