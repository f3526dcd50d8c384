package dev.driftlab.localizer;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import dev.driftlab.scenario.LocalizerSettings;
import dev.driftlab.scenario.LocalizerSettings.MotionNoise;
import dev.driftlab.scenario.LocalizerSettings.Particles;
import dev.driftlab.scenario.LocalizerSettings.RangeModel;
import dev.driftlab.scenario.LocalizerSettings.RangeModelKind;
import dev.driftlab.scenario.LocalizerSettings.Recovery;
import dev.driftlab.scenario.LocalizerSettings.ResampleWhen;
import dev.driftlab.scenario.LocalizerSettings.Resampling;
import dev.driftlab.scenario.LocalizerSettings.Scheme;
import dev.driftlab.scenario.LocalizerSettings.Start;
import org.junit.jupiter.api.Test;

class SettingsCheckTest {

    private static final LocalizerSettings OK = LocalizerSettings.defaults();

    @Test
    void defaults_areValid() {
        assertThat(SettingsCheck.problems(OK)).isEmpty();
    }

    @Test
    void badValues_areRefused_withTheSettingNamed() {
        assertThat(problems(withRange(
                        new RangeModel(RangeModelKind.LIKELIHOOD_FIELD, 6, 0.9, 0.05, 0.02, 0.08, 0, 1, 0.05))))
                .containsExactly("localizer.rangeModel.hitSpread: must be more than 0 m, got 0");
        assertThat(problems(new LocalizerSettings(
                        OK.particles(),
                        new MotionNoise(-0.1, 0.01, 0.01, 0.02, 0.05, 0.05),
                        OK.rangeModel(),
                        OK.resampling(),
                        OK.recovery())))
                .containsExactly("localizer.motionNoise.turnFromTurn: -0.1 is out of range; allowed 0 to 10");
        assertThat(problems(withRange(new RangeModel(RangeModelKind.BEAM, 6, 0.9, 0.5, 0.02, 0.08, 0.1, 1, 0.05))))
                .singleElement()
                .asString()
                .startsWith("localizer.rangeModel: hitWeight + shortWeight + maxWeight + randomWeight must sum to 1");
        assertThat(problems(new LocalizerSettings(
                        new Particles(0, false, 1, 10, 0.05, 0.99, 0.5, 0.2, Start.AROUND_START, 0.3, 0.1),
                        OK.motionNoise(),
                        OK.rangeModel(),
                        OK.resampling(),
                        OK.recovery())))
                .containsExactly("localizer.particles.count: must be at least 1, got 0");
        assertThat(problems(new LocalizerSettings(
                        new Particles(100, true, 500, 400, 0.05, 1.5, 0.5, 0.2, Start.AROUND_START, 0.3, 0.1),
                        OK.motionNoise(),
                        OK.rangeModel(),
                        OK.resampling(),
                        OK.recovery())))
                .containsExactly(
                        "localizer.particles.confidence: 1.5 is out of range; allowed 0.5 to 0.9999",
                        "localizer.particles.minCount: must not exceed maxCount (400), got 500");
        assertThat(problems(new LocalizerSettings(
                        OK.particles(),
                        OK.motionNoise(),
                        OK.rangeModel(),
                        new Resampling(Scheme.SYSTEMATIC, ResampleWhen.LOW_SPREAD, 1.2),
                        OK.recovery())))
                .containsExactly("localizer.resampling.essFraction: 1.2 is out of range; allowed 0 to 1");
        assertThat(problems(new LocalizerSettings(
                        OK.particles(),
                        OK.motionNoise(),
                        OK.rangeModel(),
                        OK.resampling(),
                        new Recovery(true, 0.2, 0.1, true, -0.5, 0.2))))
                .containsExactly(
                        "localizer.recovery.resetShare: -0.5 is out of range; allowed 0 to 1",
                        "localizer.recovery.slowRate: must be below fastRate (0.1) for injection, got 0.2");
    }

    @Test
    void kldConfidence_isCheckedOnTheValidatorsRange() {
        // the bound Fox's KLD-sampling gives is zero or below for two bins at a confidence of
        // 0.03 (Wilson-Hilferty form, KldSampling.bound): the check must refuse it, not only
        // values outside (0, 1); the range agrees with ScenarioValidator (Limits)
        assertThat(KldSampling.bound(2, 0.05, 0.03)).isLessThanOrEqualTo(0);
        for (double ok : new double[] {0.5, 0.99, 0.9999}) {
            assertThat(problems(withConfidence(ok))).as("confidence %s", ok).isEmpty();
        }
        for (double bad : new double[] {0.03, 0.4999, 0.99991}) {
            assertThat(problems(withConfidence(bad)))
                    .containsExactly(
                            "localizer.particles.confidence: " + bad + " is out of range; allowed 0.5 to 0.9999"
                                    + (bad < 0.5 ? " (below 0.5 the particle count bound is meaningless)" : ""));
        }
    }

    private static LocalizerSettings withConfidence(double confidence) {
        return new LocalizerSettings(
                new Particles(100, true, 50, 400, 0.05, confidence, 0.5, 0.2, Start.AROUND_START, 0.3, 0.1),
                OK.motionNoise(),
                OK.rangeModel(),
                OK.resampling(),
                OK.recovery());
    }

    @Test
    void filter_refusesBadSettings_beforeDoingAnything() {
        TestRooms.Room room = TestRooms.rectangle(2, 2, 0.1);
        LocalizerSettings bad =
                withRange(new RangeModel(RangeModelKind.LIKELIHOOD_FIELD, 0, 0.9, 0, 0.02, 0.08, 0.1, 1, 0.05));
        assertThatThrownBy(() -> new MonteCarloLocalizer(bad, room.views(), 1))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("localizer.rangeModel.beamStep: must be at least 1, got 0");
    }

    @Test
    void weightSum_isRefusedBeyondTheValidatorsTolerance() {
        // the same 0.01 as the scenario validator (Limits.WEIGHT_SUM_TOLERANCE): a sum of 1.02
        // passed the filter's old check of 0.1 although the validator refused it
        assertThat(problems(withRange(
                        new RangeModel(RangeModelKind.LIKELIHOOD_FIELD, 6, 0.92, 0, 0.02, 0.08, 0.1, 1, 0.05))))
                .singleElement()
                .asString()
                .startsWith("localizer.rangeModel: hitWeight + maxWeight + randomWeight must sum to 1 within 0.01");
        assertThat(problems(withRange(
                        new RangeModel(RangeModelKind.LIKELIHOOD_FIELD, 6, 0.905, 0, 0.02, 0.08, 0.1, 1, 0.05))))
                .isEmpty();
    }

    private static LocalizerSettings withRange(RangeModel r) {
        return new LocalizerSettings(OK.particles(), OK.motionNoise(), r, OK.resampling(), OK.recovery());
    }

    private static java.util.List<String> problems(LocalizerSettings s) {
        return SettingsCheck.problems(s);
    }
}
