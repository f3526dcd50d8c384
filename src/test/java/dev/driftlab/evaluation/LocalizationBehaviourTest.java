package dev.driftlab.evaluation;

import static org.assertj.core.api.Assertions.assertThat;

import dev.driftlab.recording.FrameSink;
import dev.driftlab.scenario.LocalizerSettings;
import dev.driftlab.scenario.Scenario;
import dev.driftlab.scenario.ScenarioFiles;
import dev.driftlab.scenario.SettingsVariant;
import dev.driftlab.trial.BatchProgress;
import dev.driftlab.trial.BatchResult;
import dev.driftlab.trial.BatchRunner;
import dev.driftlab.trial.TrialRunner;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.atomic.AtomicBoolean;
import org.junit.jupiter.api.Test;

/**
 * The filter on the simulator, measured over seeds on the sample sites. Every trial is a pure
 * function of its seed, so these figures are exact for this build, not samples that may flake.
 */
class LocalizationBehaviourTest {

    private static Scenario sample(String name) throws IOException {
        return ScenarioFiles.load(Files.readString(Path.of("sample-projects/" + name + ".json")));
    }

    /** The office sample without its faults: a clean route. */
    private static Scenario cleanOffice() throws IOException {
        Scenario s = sample("office-carpet-stall");
        return new Scenario(
                s.name(),
                s.description(),
                s.site(),
                s.robot(),
                s.rangefinder(),
                s.route(),
                List.of(),
                s.localizer(),
                List.of(),
                s.gates());
    }

    private static LocalizerSettings withParticles(LocalizerSettings base, int count, LocalizerSettings.Start start) {
        return base.withParticles(base.particles().withFixedCount(count).startingAt(start));
    }

    @Test
    void tracking_fromKnownStart_onCleanRoute_staysUnder20cm() throws IOException {
        Scenario office = cleanOffice();
        TrialRunner runner = new TrialRunner(office);
        for (long seed = 1; seed <= 8; seed++) {
            TrialRunner.Result r =
                    runner.run(office.allVariants().get(0), seed, FrameSink.NONE, EpisodeRules.defaults(), () -> false);
            double worst = 0;
            for (double e : r.trace().positionErrors()) {
                worst = Math.max(worst, e);
            }
            assertThat(worst).as("largest position error, seed %d", seed).isLessThan(0.2);
        }
    }

    @Test
    void globalLocalization_inTheAsymmetricOffice_convergesIn90PercentOf50Seeds() throws IOException {
        // Threshold: position error under 0.3 m and heading under 10 degrees held for 2 s
        // (EpisodeRules.defaults), reached within 60 s of an 82 s route, with 10,000 particles.
        Scenario office = cleanOffice();
        SettingsVariant global = new SettingsVariant(
                "global", withParticles(office.localizer(), 10_000, LocalizerSettings.Start.EVERYWHERE));
        BatchResult r = new BatchRunner(office, 2)
                .run(
                        List.of(global),
                        BatchRunner.seeds(1, 50),
                        EpisodeRules.defaults(),
                        BatchProgress.NONE,
                        new AtomicBoolean());

        long converged = r.trials().stream()
                .filter(t -> t.converged() && t.convergenceTime() <= 60)
                .count();
        assertThat(converged).isGreaterThanOrEqualTo(45);
    }

    @Test
    void kidnap_recoveryWithInjection_farExceedsWithout_onFiftySeeds() throws IOException {
        Scenario hall = sample("storage-hall-kidnap");
        assertThat(hall.allVariants()).extracting(SettingsVariant::name).containsExactly("base", "no injection");

        BatchResult r = new BatchRunner(hall, 2)
                .run(
                        hall.allVariants(),
                        BatchRunner.seeds(1, 50),
                        EpisodeRules.defaults(),
                        BatchProgress.NONE,
                        new AtomicBoolean());

        VariantSummary on = r.summary().variants().get(0);
        VariantSummary off = r.summary().variants().get(1);
        assertThat(on.kidnapTrials()).isEqualTo(50);
        assertThat(off.kidnapTrials()).isEqualTo(50);
        // non-overlapping 95 % Wilson intervals: the difference is not a matter of luck
        assertThat(on.recoveryRate().lower()).isGreaterThan(off.recoveryRate().upper());
        PairedComparison c = r.summary().comparisons().get(0);
        assertThat(c.pairs()).isEqualTo(50);
        assertThat(c.recoveryShareHigh()).isLessThan(0);
    }

    @Test
    void sameSeed_givesIdenticalTrace_andVariantsSeeTheSameWorld() throws IOException {
        Scenario hall = sample("storage-hall-kidnap");
        TrialRunner runner = new TrialRunner(hall);
        SettingsVariant base = hall.allVariants().get(0);
        SettingsVariant off = hall.allVariants().get(1);

        TrialRunner.Result a = runner.run(base, 7, FrameSink.NONE, EpisodeRules.defaults(), () -> false);
        TrialRunner.Result b = runner.run(base, 7, FrameSink.NONE, EpisodeRules.defaults(), () -> false);
        TrialRunner.Result c = runner.run(off, 7, FrameSink.NONE, EpisodeRules.defaults(), () -> false);

        assertThat(b.trace().size()).isEqualTo(a.trace().size());
        for (int i = 0; i < a.trace().size(); i++) {
            assertThat(b.trace().estX(i)).isEqualTo(a.trace().estX(i));
            assertThat(b.trace().estY(i)).isEqualTo(a.trace().estY(i));
            assertThat(c.trace().trueX(i)).isEqualTo(a.trace().trueX(i));
            assertThat(c.trace().trueY(i)).isEqualTo(a.trace().trueY(i));
        }
        assertThat(b.outcome()).isEqualTo(a.outcome());
    }

    @Test
    void batch_resultsDoNotDependOnThreadCount() throws IOException {
        Scenario office = sample("office-carpet-stall");
        long[] seeds = BatchRunner.seeds(3, 3);

        BatchResult one = new BatchRunner(office, 1)
                .run(office.allVariants(), seeds, EpisodeRules.defaults(), BatchProgress.NONE, new AtomicBoolean());
        BatchResult two = new BatchRunner(office, 2)
                .run(office.allVariants(), seeds, EpisodeRules.defaults(), BatchProgress.NONE, new AtomicBoolean());

        assertThat(two.trials()).isEqualTo(one.trials());
    }

    @Test
    void cancelledBatch_keepsFinishedTrials() throws IOException {
        Scenario office = sample("office-carpet-stall");
        AtomicBoolean cancel = new AtomicBoolean();

        BatchResult r = new BatchRunner(office, 1)
                .run(
                        office.allVariants(),
                        BatchRunner.seeds(1, 10),
                        EpisodeRules.defaults(),
                        (done, total, last) -> {
                            if (done == 3) {
                                cancel.set(true);
                            }
                        },
                        cancel);

        assertThat(r.cancelled()).isTrue();
        assertThat(r.trials()).hasSize(3);
        assertThat(r.planned()).isEqualTo(20);
        assertThat(r.summary().variants()).isNotEmpty();
    }
}
