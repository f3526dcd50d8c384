package dev.driftlab.trial;

import static org.assertj.core.api.Assertions.assertThat;

import dev.driftlab.evaluation.EpisodeRules;
import dev.driftlab.evaluation.TrialEnd;
import dev.driftlab.evaluation.TrialOutcome;
import dev.driftlab.localizer.protocol.ChildCommands;
import dev.driftlab.localizer.protocol.ProcessLocalizer;
import dev.driftlab.recording.Frame;
import dev.driftlab.recording.FrameSink;
import dev.driftlab.scenario.Scenario;
import dev.driftlab.scenario.Scenarios;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.atomic.AtomicBoolean;
import org.junit.jupiter.api.Test;

/**
 * Faults of an outside localizer's process: each ends its trial marked with what happened and the
 * last lines of the program's error output, the batch goes on, and nothing is left running. The
 * test localizers are shell scripts under src/test/resources/localizers/.
 */
class OutsideLocalizerFaultsTest {

    private static final ProcessLocalizer.Limits QUICK =
            new ProcessLocalizer.Limits(Duration.ofSeconds(10), Duration.ofMillis(500), Duration.ofSeconds(1));

    private static final Scenario CORRIDOR = Scenarios.corridor().build();

    private static OutsideLocalizer script(String name) {
        return new OutsideLocalizer(
                List.of("sh", ChildCommands.testLocalizer(name).toString()), QUICK);
    }

    private static TrialRunner.Result run(String script, FrameSink sink) {
        return new TrialRunner(CORRIDOR, script(script))
                .run(CORRIDOR.allVariants().get(0), 1, sink, EpisodeRules.defaults(), () -> false);
    }

    private static TrialOutcome outcome(String script) {
        return run(script, FrameSink.NONE).outcome();
    }

    @Test
    void crash_endsTheTrial_withTheExitStatusAndTheLastLinesOfItsErrorOutput() {
        TrialRunner.Result r = run("crash.sh", FrameSink.NONE);
        TrialOutcome t = r.outcome();

        assertThat(t.end().kind()).isEqualTo(TrialEnd.Kind.LOCALIZER_FAILED);
        assertThat(t.end().time()).isPositive();
        assertThat(r.trace().size()).isEqualTo(2);
        assertThat(t.localizerTrouble())
                .startsWith("crash: ")
                .contains("exited with status 3")
                .contains("fatal: the map reader ran out of cells")
                .contains("trace line 100")
                .doesNotContain("trace line 50\n");
        // bounded: the message, a heading line and at most 20 lines of the tail
        assertThat(t.localizerTrouble().lines().count()).isLessThanOrEqualTo(22);
    }

    @Test
    void hang_isStoppedAtTheTimeLimit_andLeavesNoProcessBehind() throws InterruptedException {
        long started = System.nanoTime();
        TrialOutcome t = outcome("hang.sh");
        double seconds = (System.nanoTime() - started) / 1e9;

        assertThat(t.end().kind()).isEqualTo(TrialEnd.Kind.LOCALIZER_FAILED);
        assertThat(t.localizerTrouble())
                .startsWith("hang: ")
                .contains("within 500 ms")
                .contains("thinking very hard");
        assertThat(seconds).isLessThan(8);
        Thread.sleep(200);
        assertThat(ProcessHandle.current().descendants().filter(ProcessHandle::isAlive))
                .as("no child process left running")
                .isEmpty();
    }

    @Test
    void malformedLine_endsTheTrial_namingWhatCameInstead() {
        TrialOutcome t = outcome("malformed.sh");

        assertThat(t.end().kind()).isEqualTo(TrialEnd.Kind.LOCALIZER_FAILED);
        assertThat(t.localizerTrouble())
                .startsWith("malformed: ")
                .contains("not a JSON object")
                .contains("about to answer");
    }

    @Test
    void nanInTheAnswer_endsTheTrial_namingTheField() {
        TrialOutcome t = outcome("nan.sh");

        assertThat(t.end().kind()).isEqualTo(TrialEnd.Kind.LOCALIZER_FAILED);
        assertThat(t.localizerTrouble()).startsWith("not-finite: ").contains("estimate.pose.x is NaN");
    }

    @Test
    void wrongVersion_isRefusedBeforeTheFirstScan_namingBothVersions() {
        TrialRunner.Result r = run("wrong-version.sh", FrameSink.NONE);
        TrialOutcome t = r.outcome();

        assertThat(t.end().kind()).isEqualTo(TrialEnd.Kind.LOCALIZER_FAILED);
        assertThat(t.end().time()).isZero();
        assertThat(r.trace().size()).isEqualTo(1);
        assertThat(Double.isNaN(r.trace().estX(0)))
                .as("no estimate was ever given")
                .isTrue();
        assertThat(t.localizerTrouble())
                .startsWith("version: ")
                .contains("driftlab-localizer/2")
                .contains("Driftlab speaks driftlab-localizer/1")
                .contains("speaking version 2");
        assertThat(t.answerTimed()).isFalse();
    }

    @Test
    void missingProgram_failsToStart_withAClearMessage() {
        OutsideLocalizer nowhere = new OutsideLocalizer(List.of("/no/such/localizer-program"), QUICK);
        TrialOutcome t = new TrialRunner(CORRIDOR, nowhere)
                .run(CORRIDOR.allVariants().get(0), 1, FrameSink.NONE, EpisodeRules.defaults(), () -> false)
                .outcome();

        assertThat(t.localizerTrouble()).startsWith("start: ").contains("/no/such/localizer-program");
    }

    @Test
    void batch_goesOnAfterFailures_andMarksEveryTrial() {
        BatchResult b = new BatchRunner(CORRIDOR, 2, script("crash.sh"))
                .run(
                        CORRIDOR.allVariants(),
                        new long[] {1, 2, 3},
                        EpisodeRules.defaults(),
                        (d, n, l) -> {},
                        new AtomicBoolean());

        assertThat(b.trials()).hasSize(3);
        assertThat(b.cancelled()).isFalse();
        assertThat(b.trials()).allSatisfy(t -> {
            assertThat(t.end().kind()).isEqualTo(TrialEnd.Kind.LOCALIZER_FAILED);
            assertThat(t.localizerTrouble()).startsWith("crash: ");
        });
        assertThat(b.summary().allGatesPass()).isFalse();
    }

    @Test
    void localizerWithoutOptionalParts_isJudged_andItsAbsentPartsStayAbsent() {
        List<Frame> frames = new ArrayList<>();
        TrialRunner.Result r = run("steady.sh", frames::add);
        TrialOutcome t = r.outcome();

        assertThat(t.end().kind()).isEqualTo(TrialEnd.Kind.COMPLETED);
        assertThat(t.localizerTrouble()).isEmpty();
        assertThat(t.answerTimed()).isTrue();
        assertThat(Double.isNaN(t.meanParticles()))
                .as("no particle count, not zero")
                .isTrue();
        assertThat(frames).isNotEmpty().allSatisfy(f -> {
            assertThat(f.particleCount()).isZero();
            assertThat(f.hypotheses()).hasSize(1);
            assertThat(Double.isNaN(f.hypotheses().get(0).cxx()))
                    .as("no covariance, not zero")
                    .isTrue();
            assertThat(Double.isNaN(f.effectiveSize())).isTrue();
            assertThat(f.estimate().x()).isEqualTo(2.0);
        });
        assertThat(r.trace().particles(0)).isEqualTo(dev.driftlab.localizer.TrialLocalizer.UNKNOWN_COUNT);
    }
}
