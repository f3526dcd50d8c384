package dev.driftlab.localizer;

import dev.driftlab.scenario.Limits;
import dev.driftlab.scenario.LocalizerSettings;
import dev.driftlab.scenario.LocalizerSettings.MotionNoise;
import dev.driftlab.scenario.LocalizerSettings.Particles;
import dev.driftlab.scenario.LocalizerSettings.RangeModel;
import dev.driftlab.scenario.LocalizerSettings.RangeModelKind;
import dev.driftlab.scenario.LocalizerSettings.Recovery;
import dev.driftlab.scenario.LocalizerSettings.Resampling;
import java.util.ArrayList;
import java.util.List;

/**
 * Range checks on localizer settings, each problem naming its setting by path, e.g. {@code
 * localizer.rangeModel.hitSpread: must be > 0, got 0.0}.
 */
public final class SettingsCheck {

    /** Most particles a filter accepts; beyond this a run would not fit a workstation's memory budget. */
    public static final int MAX_PARTICLES = 1_000_000;

    /**
     * Mixture weights are rescaled to sum to exactly 1; a sum further than this from 1 is taken as a
     * typing error rather than silently rescaled.
     */
    public static final double WEIGHT_SUM_TOLERANCE = 0.1;

    private SettingsCheck() {}

    /**
     * Every problem with the settings, in a stable order.
     *
     * @param s settings to check
     * @return messages of the form {@code localizer.group.setting: what is wrong}; empty when valid
     */
    public static List<String> problems(LocalizerSettings s) {
        List<String> p = new ArrayList<>();
        particles(s.particles(), p);
        motion(s.motionNoise(), p);
        range(s.rangeModel(), p);
        resampling(s.resampling(), p);
        recovery(s.recovery(), p);
        return List.copyOf(p);
    }

    /**
     * Refuses invalid settings.
     *
     * @param s settings to check
     * @throws IllegalArgumentException naming every bad setting
     */
    public static void require(LocalizerSettings s) {
        List<String> p = problems(s);
        if (!p.isEmpty()) {
            throw new IllegalArgumentException(String.join("; ", p));
        }
    }

    private static void particles(Particles s, List<String> p) {
        String g = "localizer.particles.";
        countIn(s.count(), 1, MAX_PARTICLES, g + "count", p);
        if (s.adaptive()) {
            countIn(s.minCount(), 1, MAX_PARTICLES, g + "minCount", p);
            countIn(s.maxCount(), 1, MAX_PARTICLES, g + "maxCount", p);
            if (s.minCount() > s.maxCount()) {
                p.add(g + "minCount: must not exceed maxCount (" + s.maxCount() + "), got " + s.minCount());
            }
            if (s.count() > s.maxCount()) {
                p.add(g + "count: must not exceed maxCount (" + s.maxCount() + ") when adaptive, got " + s.count());
            }
            openUnit(s.errorBound(), g + "errorBound", p);
            // the scenario validator's range (see Limits.MIN_CONFIDENCE): below it the bound is meaningless
            if (!(s.confidence() >= Limits.MIN_CONFIDENCE && s.confidence() <= Limits.MAX_CONFIDENCE)) {
                p.add(g + "confidence: must be in [" + Limits.MIN_CONFIDENCE + ", " + Limits.MAX_CONFIDENCE + "], got "
                        + s.confidence());
            }
            positive(s.binSize(), g + "binSize", p);
            if (!(s.binTurn() > 0 && s.binTurn() <= 2 * Math.PI)) {
                p.add(g + "binTurn: must be in (0, 2 pi] radians, got " + s.binTurn());
            }
        }
        notNegative(s.startSpread(), g + "startSpread", p);
        notNegative(s.startTurnSpread(), g + "startTurnSpread", p);
    }

    private static void motion(MotionNoise s, List<String> p) {
        String g = "localizer.motionNoise.";
        notNegative(s.turnFromTurn(), g + "turnFromTurn", p);
        notNegative(s.turnFromDrive(), g + "turnFromDrive", p);
        notNegative(s.driveFromDrive(), g + "driveFromDrive", p);
        notNegative(s.driveFromTurn(), g + "driveFromTurn", p);
        notNegative(s.minTravel(), g + "minTravel", p);
        notNegative(s.minTurn(), g + "minTurn", p);
    }

    private static void range(RangeModel s, List<String> p) {
        String g = "localizer.rangeModel.";
        if (s.beamStep() < 1) {
            p.add(g + "beamStep: must be >= 1, got " + s.beamStep());
        }
        positive(s.hitWeight(), g + "hitWeight", p);
        notNegative(s.shortWeight(), g + "shortWeight", p);
        notNegative(s.maxWeight(), g + "maxWeight", p);
        notNegative(s.randomWeight(), g + "randomWeight", p);
        double sum = s.weightSum();
        if (!(Math.abs(sum - 1.0) <= WEIGHT_SUM_TOLERANCE)) {
            String parts = s.kind() == RangeModelKind.BEAM
                    ? "hitWeight + shortWeight + maxWeight + randomWeight"
                    : "hitWeight + maxWeight + randomWeight";
            p.add("localizer.rangeModel: " + parts + " must sum to 1 within " + WEIGHT_SUM_TOLERANCE + ", got " + sum);
        }
        positive(s.hitSpread(), g + "hitSpread", p);
        if (s.kind() == RangeModelKind.BEAM) {
            positive(s.shortDecay(), g + "shortDecay", p);
        }
        positive(s.cellSize(), g + "cellSize", p);
    }

    private static void resampling(Resampling s, List<String> p) {
        double f = s.essFraction();
        if (!(f >= 0 && f <= 1)) {
            p.add("localizer.resampling.essFraction: must be in [0, 1], got " + f);
        }
    }

    private static void recovery(Recovery s, List<String> p) {
        String g = "localizer.recovery.";
        if (!(s.slowRate() > 0 && s.slowRate() <= 1)) {
            p.add(g + "slowRate: must be in (0, 1], got " + s.slowRate());
        }
        if (!(s.fastRate() > 0 && s.fastRate() <= 1)) {
            p.add(g + "fastRate: must be in (0, 1], got " + s.fastRate());
        }
        if (s.injection() && !(s.slowRate() < s.fastRate())) {
            p.add(g + "slowRate: must be below fastRate (" + s.fastRate() + ") for injection, got " + s.slowRate());
        }
        if (!(s.resetShare() >= 0 && s.resetShare() <= 1)) {
            p.add(g + "resetShare: must be in [0, 1], got " + s.resetShare());
        }
        if (!(s.resetBelow() >= 0 && s.resetBelow() <= 1)) {
            p.add(g + "resetBelow: must be in [0, 1], got " + s.resetBelow());
        }
    }

    private static void countIn(int v, int lo, int hi, String name, List<String> p) {
        if (v < lo || v > hi) {
            p.add(name + ": must be in [" + lo + ", " + hi + "], got " + v);
        }
    }

    private static void positive(double v, String name, List<String> p) {
        if (!(v > 0)) {
            p.add(name + ": must be > 0, got " + v);
        }
    }

    private static void notNegative(double v, String name, List<String> p) {
        if (!(v >= 0)) {
            p.add(name + ": must be >= 0, got " + v);
        }
    }

    private static void openUnit(double v, String name, List<String> p) {
        if (!(v > 0 && v < 1)) {
            p.add(name + ": must be in (0, 1), got " + v);
        }
    }
}
