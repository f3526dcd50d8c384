package dev.driftlab.trial;

import static org.assertj.core.api.Assertions.assertThat;

import dev.driftlab.evaluation.EpisodeRules;
import dev.driftlab.evaluation.GateVerdict;
import dev.driftlab.evaluation.TrialOutcome;
import dev.driftlab.evaluation.Verdict;
import dev.driftlab.scenario.Gate;
import dev.driftlab.scenario.GateMetric;
import dev.driftlab.scenario.Profile;
import dev.driftlab.scenario.Scenario;
import dev.driftlab.scenario.ScenarioException;
import dev.driftlab.scenario.Scenarios;
import dev.driftlab.scenario.SettingsVariant;
import dev.driftlab.scenario.Waypoint;
import java.util.List;
import java.util.concurrent.atomic.AtomicBoolean;
import org.junit.jupiter.api.Test;

/** Suites: the matrix is the per-scenario batches run alone, and bad profiles are refused or reported. */
class SuiteRunnerTest {

    private static final long[] SEEDS = {5, 6, 7};

    /** A short corridor drive with few particles and beams, so a trial takes a fraction of a second. */
    static Scenario small(String name, double rmseBound) {
        Scenario s = Scenarios.corridor()
                .withName(name)
                .withoutWaypoints()
                .withWaypoints(new Waypoint(7, 1, 0.6, 0))
                .withGate(new Gate("final", GateMetric.FINAL_ERROR, 0.3, 0.9))
                .withGate(new Gate("rmse", GateMetric.POSITION_RMSE, rmseBound, 1.0))
                .withVariant(new SettingsVariant("unused", dev.driftlab.scenario.LocalizerSettings.defaults()))
                .build();
        return profile("{\"format\":\"driftlab-profile/1\",\"name\":\"small\","
                        + "\"localizer\":{\"particles\":{\"count\":150}},\"rangefinder\":{\"beams\":45}}")
                .apply(s)
                .orThrow();
    }

    static Profile profile(String json) {
        return Profile.read(json);
    }

    static final Profile NOISY = profile("{\"format\":\"driftlab-profile/1\",\"name\":\"noisy\","
            + "\"rangefinder\":{\"rangeSigma\":0.3,\"dropout\":0.3}}");

    static final Profile FEW = profile(
            "{\"format\":\"driftlab-profile/1\",\"name\":\"few\",\"localizer\":{\"particles\":{\"count\":20}}}");

    private static SuiteResult run(SuitePlan plan, int threads) {
        return new SuiteRunner(threads).run(plan, EpisodeRules.defaults(), BatchProgress.NONE, new AtomicBoolean());
    }

    @Test
    void matrix_equalsEachScenarioBatchRunAloneOnTheSameSeeds() {
        Scenario a = small("A", 0.15);
        Scenario b = small("B", 0.5);
        SuitePlan plan = SuitePlan.of(
                List.of(new SuitePlan.Entry("A", "a.json", a, SEEDS), new SuitePlan.Entry("B", "b.json", b, SEEDS)),
                List.of(NOISY, FEW));

        SuiteResult result = run(plan, 2);

        assertThat(result.cancelled()).isFalse();
        assertThat(result.finished()).isEqualTo(2 * 3 * SEEDS.length);
        for (SuiteResult.Row row : result.rows()) {
            assertThat(row.plan().cells()).extracting(SuitePlan.Cell::name).containsExactly("as is", "noisy", "few");
            for (SuitePlan.Cell cell : row.plan().cells()) {
                Scenario alone = cell.scenario().orElseThrow();
                BatchResult batch = new BatchRunner(alone, 1)
                        .run(
                                List.of(new SettingsVariant("base", alone.localizer())),
                                SEEDS,
                                EpisodeRules.defaults(),
                                BatchProgress.NONE,
                                new AtomicBoolean());
                List<TrialOutcome> expected = batch.trials().stream()
                        .map(t -> t.withVariant(cell.name()))
                        .toList();
                assertThat(row.trials(cell.name())).isEqualTo(expected);
                List<GateVerdict> suiteGates =
                        row.column(cell.name()).orElseThrow().gates();
                List<GateVerdict> batchGates = batch.summary().verdicts();
                assertThat(suiteGates).hasSameSizeAs(batchGates);
                for (int i = 0; i < batchGates.size(); i++) {
                    GateVerdict x = suiteGates.get(i);
                    GateVerdict y = batchGates.get(i);
                    assertThat(x.variant()).isEqualTo(cell.name());
                    assertThat(List.of(x.gate(), x.pass(), x.passed(), x.exercised(), x.trials(), x.interval()))
                            .isEqualTo(
                                    List.of(y.gate(), y.pass(), y.passed(), y.exercised(), y.trials(), y.interval()));
                }
            }
            // the profiles are paired with the scenario as it is, in column order
            assertThat(row.summary().comparisons())
                    .extracting(c -> c.base() + ">" + c.variant() + ":" + c.pairs())
                    .containsExactly("as is>noisy:3", "as is>few:3");
        }
        // the profiles make a real difference to the figures (not only to the names)
        SuiteResult.Row rowA = result.rows().get(0);
        assertThat(rowA.trials("noisy").get(0).rmse())
                .isNotEqualTo(rowA.trials("as is").get(0).rmse());
    }

    @Test
    void result_doesNotDependOnTheThreadCount() {
        SuitePlan plan = SuitePlan.of(
                List.of(new SuitePlan.Entry("A", "a.json", small("A", 0.2), new long[] {1, 2})), List.of(FEW));

        assertThat(run(plan, 1).rows().get(0).trials())
                .isEqualTo(run(plan, 3).rows().get(0).trials());
    }

    @Test
    void profileMakingEveryScenarioInvalid_isReportedPerScenario_andTheScenariosAsTheyAreStillRun() {
        Profile tooMany = profile("{\"format\":\"driftlab-profile/1\",\"name\":\"too many beams\","
                + "\"rangefinder\":{\"beams\":100000}}");
        SuitePlan plan = SuitePlan.of(
                List.of(
                        new SuitePlan.Entry("A", "a.json", small("A", 0.5), new long[] {1, 2}),
                        new SuitePlan.Entry("B", "b.json", small("B", 0.5), new long[] {1, 2})),
                List.of(tooMany));

        assertThat(plan.trials()).isEqualTo(4);
        SuiteResult result = run(plan, 2);

        for (SuiteResult.Row row : result.rows()) {
            SuitePlan.Cell cell = row.cell("too many beams");
            assertThat(cell.invalid()).isTrue();
            assertThat(cell.problems()).isNotEmpty().allMatch(p -> p.isError());
            assertThat(cell.problems().get(0).path()).isEqualTo("rangefinder.beams");
            assertThat(row.trials("as is")).hasSize(2);
            assertThat(row.trials("too many beams")).isEmpty();
        }
        assertThat(result.invalidCells()).hasSize(2);
        // the gates of an invalid cell were tested by no trial: the suite cannot pass
        assertThat(result.verdict()).isNotEqualTo(Verdict.PASS);
        assertThat(result.gatesPlanned()).isEqualTo(2 * 2 * 3);
    }

    @Test
    void profileSettingAFieldThatDoesNotExist_isRefusedNamingTheFieldPath() {
        Profile typo = profile(
                "{\"format\":\"driftlab-profile/1\",\"name\":\"typo\"," + "\"rangefinder\":{\"rangeSgma\":0.1}}");

        org.assertj.core.api.Assertions.assertThatThrownBy(() -> SuitePlan.of(
                        List.of(new SuitePlan.Entry("A", "a.json", small("A", 0.5), new long[] {1})), List.of(typo)))
                .isInstanceOfSatisfying(
                        ScenarioException.class,
                        e -> assertThat(e.problems()).anySatisfy(p -> {
                            assertThat(p.path()).isEqualTo("profile \"typo\": rangefinder.rangeSgma");
                            assertThat(p.message()).contains("unknown key");
                        }));
    }

    @Test
    void emptySuite_andRepeatedNames_areRefused() {
        org.assertj.core.api.Assertions.assertThatThrownBy(() -> SuitePlan.of(List.of(), List.of()))
                .isInstanceOfSatisfying(
                        ScenarioException.class,
                        e -> assertThat(e.problems()).extracting(p -> p.path()).contains("scenarios"));
        Profile asIs = profile(
                "{\"format\":\"driftlab-profile/1\",\"name\":\"as is\"," + "\"rangefinder\":{\"dropout\":0.1}}");
        org.assertj.core.api.Assertions.assertThatThrownBy(() -> SuitePlan.of(
                        List.of(new SuitePlan.Entry("A", "a.json", small("A", 0.5), new long[] {1})),
                        List.of(NOISY, NOISY, asIs)))
                .isInstanceOfSatisfying(
                        ScenarioException.class,
                        e -> assertThat(e.problems())
                                .extracting(p -> p.path())
                                .containsExactly("profile \"noisy\"", "profile \"as is\""));
    }
}
