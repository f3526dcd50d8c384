package dev.driftlab.trial;

import static org.assertj.core.api.Assertions.assertThat;

import dev.driftlab.evaluation.EpisodeRules;
import dev.driftlab.evaluation.TrialOutcome;
import dev.driftlab.geometry.Pose;
import dev.driftlab.localizer.protocol.ChildCommands;
import dev.driftlab.localizer.protocol.ProcessLocalizer;
import dev.driftlab.recording.Frame;
import dev.driftlab.recording.FrameSink;
import dev.driftlab.scenario.Scenario;
import dev.driftlab.scenario.Scenarios;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.atomic.AtomicBoolean;
import org.junit.jupiter.api.Test;

/**
 * The built-in localizer behind the protocol ({@code localizer-stdio} in a child JVM) gives the
 * same trial outcomes as the built-in localizer in process, seed by seed: the protocol carries
 * everything the filter needs, and the judging is the same for both.
 */
class OutsideLocalizerConformanceTest {

    private static Scenario kidnapCorridor() {
        return Scenarios.corridor().withKidnapAt(8, Pose.of(15, 1, 0)).build();
    }

    @Test
    void batchThroughTheProtocol_equalsTheInProcessBatch_seedBySeed() {
        Scenario s = kidnapCorridor();
        long[] seeds = {1, 2, 3};
        BatchResult inProcess = new BatchRunner(s, 2)
                .run(s.allVariants(), seeds, EpisodeRules.defaults(), (d, t, l) -> {}, new AtomicBoolean());
        BatchResult outside = new BatchRunner(
                        s, 2, new OutsideLocalizer(ChildCommands.localizerStdio(), ProcessLocalizer.Limits.DEFAULT))
                .run(s.allVariants(), seeds, EpisodeRules.defaults(), (d, t, l) -> {}, new AtomicBoolean());

        assertThat(outside.trials()).hasSize(seeds.length * s.allVariants().size());
        assertThat(outside.trials()).isEqualTo(inProcess.trials());
        for (TrialOutcome t : outside.trials()) {
            assertThat(t.localizerTrouble()).isEmpty();
            assertThat(t.answerTimed()).isTrue();
            assertThat(t.answerP50()).isPositive().isLessThanOrEqualTo(t.answerP99());
        }
        for (TrialOutcome t : inProcess.trials()) {
            assertThat(t.answerTimed()).isTrue();
        }
        assertThat(outside.summary().verdicts()).isEqualTo(inProcess.summary().verdicts());
    }

    @Test
    void recordedRun_carriesTheOutsideParticlesAndHypotheses() {
        Scenario s = kidnapCorridor();
        List<Frame> frames = new ArrayList<>();
        FrameSink sink = frames::add;
        TrialRunner runner = new TrialRunner(
                s, new OutsideLocalizer(ChildCommands.localizerStdio(), ProcessLocalizer.Limits.DEFAULT));
        TrialRunner.Result r = runner.run(s.allVariants().get(0), 4, sink, EpisodeRules.defaults(), () -> false);

        TrialRunner.Result builtIn =
                new TrialRunner(s).run(s.allVariants().get(0), 4, FrameSink.NONE, EpisodeRules.defaults(), () -> false);
        assertThat(r.outcome()).isEqualTo(builtIn.outcome());
        assertThat(frames).isNotEmpty();
        Frame last = frames.get(frames.size() - 1);
        assertThat(last.particleX().length).isBetween(1, 5_000);
        assertThat(last.hypotheses()).isNotEmpty();
        assertThat(last.hypotheses().get(0).cxx()).isFinite();
    }
}
