package dev.driftlab.localizer;

import dev.driftlab.scenario.Limits;
import dev.driftlab.scenario.LocalizerSettings;
import dev.driftlab.scenario.LocalizerSettings.Particles;
import dev.driftlab.scenario.LocalizerSettings.RangeModel;
import dev.driftlab.scenario.LocalizerSettings.RangeModelKind;
import dev.driftlab.scenario.LocalizerSettings.Recovery;
import dev.driftlab.scenario.SettingsChecks;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Set;

/**
 * Range checks on localizer settings, each problem naming its setting by path, e.g. {@code
 * localizer.rangeModel.hitSpread: must be more than 0 m, got 0}. The ranges and their wording come
 * from the scenario's limits table ({@link Limits#FIELDS}), so a filter accepts exactly what the
 * validator lets through; settings built in code, not read from a file, are caught here too.
 */
public final class SettingsCheck {

    /** Settings the filter reads only when the count adapts; a fixed count may leave them anywhere. */
    private static final Set<String> ADAPTIVE_ONLY = Set.of(
            "localizer.particles.minCount",
            "localizer.particles.maxCount",
            "localizer.particles.errorBound",
            "localizer.particles.confidence",
            "localizer.particles.binSize",
            "localizer.particles.binTurn");

    private SettingsCheck() {}

    /**
     * Every problem with the settings, in a stable order.
     *
     * @param s settings to check
     * @return messages of the form {@code localizer.group.setting: what is wrong}; empty when valid
     */
    public static List<String> problems(LocalizerSettings s) {
        List<String> p = new ArrayList<>();
        for (Map.Entry<String, Double> e : SettingsChecks.values(s).entrySet()) {
            String path = e.getKey();
            if (!s.particles().adaptive() && ADAPTIVE_ONLY.contains(path)) {
                continue;
            }
            if (s.rangeModel().kind() != RangeModelKind.BEAM && path.equals("localizer.rangeModel.shortDecay")) {
                continue;
            }
            Limits.field(path).problem(e.getValue()).ifPresent(m -> p.add(path + ": " + m));
        }
        particles(s.particles(), p);
        range(s.rangeModel(), p);
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
        if (s.adaptive()) {
            if (s.minCount() > s.maxCount()) {
                p.add(g + "minCount: must not exceed maxCount (" + s.maxCount() + "), got " + s.minCount());
            }
            if (s.count() > s.maxCount()) {
                p.add(g + "count: must not exceed maxCount (" + s.maxCount() + ") when adaptive, got " + s.count());
            }
        }
    }

    private static void range(RangeModel s, List<String> p) {
        if (!(s.hitWeight() > 0)) {
            p.add("localizer.rangeModel.hitWeight: must be more than 0, got " + s.hitWeight());
        }
        double sum = s.weightSum();
        if (!(Math.abs(sum - 1.0) <= Limits.WEIGHT_SUM_TOLERANCE)) {
            String parts = s.kind() == RangeModelKind.BEAM
                    ? "hitWeight + shortWeight + maxWeight + randomWeight"
                    : "hitWeight + maxWeight + randomWeight";
            p.add("localizer.rangeModel: " + parts + " must sum to 1 within " + Limits.WEIGHT_SUM_TOLERANCE + ", got "
                    + sum);
        }
    }

    private static void recovery(Recovery s, List<String> p) {
        if (s.injection() && !(s.slowRate() < s.fastRate())) {
            p.add("localizer.recovery.slowRate: must be below fastRate (" + s.fastRate() + ") for injection, got "
                    + s.slowRate());
        }
    }
}
