package dev.driftlab.app.runs;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import dev.driftlab.app.runs.persistence.RunRepository;
import dev.driftlab.app.runs.persistence.RunRepository.RunRow;
import dev.driftlab.app.scenarios.ScenarioStore;
import dev.driftlab.app.scenarios.persistence.ScenarioRepository;
import dev.driftlab.app.sharing.ShareLinks;
import dev.driftlab.app.sharing.persistence.ShareLinkRepository;
import dev.driftlab.scenario.Scenarios;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.concurrent.TimeUnit;
import java.util.function.Predicate;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.context.annotation.Import;
import org.springframework.test.context.TestPropertySource;
import org.springframework.transaction.annotation.Propagation;
import org.springframework.transaction.annotation.Transactional;

/**
 * The run queue with the scripted executor: states, progress, results and frames, cancelling,
 * failures, a full queue, and many submissions at once. Two workers and three waiting places.
 */
@Import({
    RunQueue.class,
    RunBoard.class,
    RunRepository.class,
    dev.driftlab.app.runs.persistence.UnitRepository.class,
    dev.driftlab.app.runs.WorkEngine.class,
    dev.driftlab.app.runs.LocalizerAllowList.class,
    dev.driftlab.app.runs.WorkerBoard.class,
    dev.driftlab.app.runs.persistence.WorkerRepository.class,
    ScriptedTrialExecutor.class,
    ScenarioStore.class,
    ScenarioRepository.class,
    ShareLinks.class,
    ShareLinkRepository.class
})
@TestPropertySource(properties = {"driftlab.runs.workers=2", "driftlab.runs.queue-capacity=3"})
@Transactional(propagation = Propagation.NOT_SUPPORTED)
abstract class RunQueueContract {

    @Autowired
    RunQueue queue;

    @Autowired
    RunBoard board;

    @Autowired
    RunRepository runs;

    @Autowired
    ScriptedTrialExecutor executor;

    @Autowired
    ScenarioStore store;

    long scenarioId;
    long revisionId;

    @BeforeEach
    void scenario() {
        executor.reset();
        ScenarioStore.Created c = store.create(Scenarios.corridor().json(), "Ana", "start");
        scenarioId = c.scenarioId();
        revisionId = store.view(scenarioId).latest().id();
    }

    @AfterEach
    void releaseHeldRuns() throws InterruptedException {
        executor.release();
        long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(20);
        while (queue.freePlaces() < queue.places()) {
            if (System.nanoTime() > deadline) {
                throw new AssertionError("the run queue did not empty within 20 s of releasing the held runs");
            }
            Thread.sleep(10);
        }
    }

    RunRow await(long runId, Predicate<RunRow> condition) throws InterruptedException {
        long deadline = System.nanoTime() + Duration.ofSeconds(20).toNanos();
        RunRow r = runs.find(runId).orElseThrow();
        while (!condition.test(r)) {
            if (System.nanoTime() > deadline) {
                throw new AssertionError("run " + runId + " stayed " + r.state());
            }
            Thread.sleep(10);
            r = runs.find(runId).orElseThrow();
        }
        return r;
    }

    static Predicate<RunRow> in(RunState s) {
        return r -> r.state().equals(s.word());
    }

    @Test
    void submittedRun_goesQueuedRunningDone_withResultTimingsAndFrameChunks() throws Exception {
        RunQueue.Submitted s =
                queue.submit(scenarioId, revisionId, List.of("base"), List.of(1L, 2L, 3L), new TrialOptions(true));

        RunRow done = await(s.runIds().get(0), in(RunState.DONE));

        assertThat(done.progress()).isEqualTo(1.0);
        assertThat(done.startedAt()).isPresent();
        assertThat(done.finishedAt()).isPresent();
        assertThat(board.result(done.id())).hasValue("{\"variant\":\"base\",\"trials\":3}");
        assertThat(board.chunks(done.id())).containsExactly(0, 1, 2);
        assertThat(new String(board.chunk(done.id(), 1))).isEqualTo("frames of seed 2");
    }

    @Test
    void doneRun_storesTheVerdictItsExecutorGave_andOtherEndsStoreNone() throws Exception {
        executor.verdict = dev.driftlab.evaluation.Verdict.FAIL;
        long done = queue.submit(scenarioId, revisionId, List.of("base"), List.of(1L), TrialOptions.resultsOnly())
                .runIds()
                .get(0);
        RunRow row = await(done, in(RunState.DONE));
        executor.failWith = "no engine";
        long failed = queue.submit(scenarioId, revisionId, List.of("base"), List.of(1L), TrialOptions.resultsOnly())
                .runIds()
                .get(0);

        assertThat(row.verdict()).hasValue(dev.driftlab.evaluation.Verdict.FAIL);
        assertThat(await(failed, in(RunState.FAILED)).verdict()).isEmpty();
    }

    @Test
    void cancel_ofARunningRun_endsItCancelled() throws Exception {
        executor.holdRuns();
        long id = queue.submit(scenarioId, revisionId, List.of("base"), List.of(1L), TrialOptions.resultsOnly())
                .runIds()
                .get(0);
        await(id, in(RunState.RUNNING));

        assertThat(queue.cancel(id)).isTrue();

        RunRow r = await(id, in(RunState.CANCELLED));
        assertThat(board.result(id)).isEmpty();
        assertThat(r.finishedAt()).isPresent();
    }

    @Test
    void cancel_ofAQueuedRun_meansItNeverRuns() throws Exception {
        executor.holdRuns();
        List<Long> ids = queue.submit(scenarioId, revisionId, List.of("base"), List.of(1L), TrialOptions.resultsOnly())
                .runIds();
        long first = ids.get(0);
        long second = queue.submit(scenarioId, revisionId, List.of("base"), List.of(2L), TrialOptions.resultsOnly())
                .runIds()
                .get(0);
        long third = queue.submit(scenarioId, revisionId, List.of("base"), List.of(3L), TrialOptions.resultsOnly())
                .runIds()
                .get(0);
        await(first, in(RunState.RUNNING));
        await(second, in(RunState.RUNNING));
        assertThat(runs.find(third).orElseThrow().state()).isEqualTo("queued");

        assertThat(queue.cancel(third)).isTrue();
        executor.release();

        await(first, in(RunState.DONE));
        await(second, in(RunState.DONE));
        assertThat(await(third, in(RunState.CANCELLED)).startedAt()).isEmpty();
        assertThat(executor.started.get()).isEqualTo(2);
    }

    @Test
    void failingExecutor_endsTheRunFailed_withItsPlainMessage() throws Exception {
        executor.failWith = "route.waypoints[2]: unreachable";
        long id = queue.submit(scenarioId, revisionId, List.of("base"), List.of(1L), TrialOptions.resultsOnly())
                .runIds()
                .get(0);

        RunRow r = await(id, in(RunState.FAILED));

        assertThat(r.failure()).isEqualTo("route.waypoints[2]: unreachable");
    }

    @Test
    void rerun_queuesAFreshRunWithTheSameInputs() throws Exception {
        long id = queue.submit(scenarioId, revisionId, List.of("base"), List.of(7L, 8L), TrialOptions.resultsOnly())
                .runIds()
                .get(0);
        await(id, in(RunState.DONE));

        long again = queue.rerun(id).runIds().get(0);

        RunRow r = await(again, in(RunState.DONE));
        assertThat(r.id()).isNotEqualTo(id);
        assertThat(r.seedList()).containsExactly(7L, 8L);
        assertThat(r.seeds()).isEqualTo("[7,8]");
        assertThat(r.revisionId()).isEqualTo(revisionId);
    }

    @Test
    void replaySeed_queuesThatSeedAloneWithFrames_andRefusesASeedTheRunDidNotHave() throws Exception {
        long id = queue.submit(scenarioId, revisionId, List.of("base"), List.of(7L, 8L), TrialOptions.resultsOnly())
                .runIds()
                .get(0);
        await(id, in(RunState.DONE));
        long before = runs.countAll();

        assertThatThrownBy(() -> queue.replaySeed(id, 9L))
                .isInstanceOfSatisfying(
                        RunRefused.class, e -> assertThat(e.field()).isEqualTo("seed"))
                .hasMessageContaining("seed 9 is not one of this run's seeds (7,8)");
        assertThat(runs.countAll()).isEqualTo(before);

        long again = queue.replaySeed(id, 8L).runIds().get(0);

        RunRow r = await(again, in(RunState.DONE));
        assertThat(r.seedList()).containsExactly(8L);
        assertThat(r.variant()).isEqualTo("base");
        assertThat(r.revisionId()).isEqualTo(revisionId);
        assertThat(TrialOptions.of(r)).isEqualTo(new TrialOptions(true));
    }

    @Test
    void sweep_queuesOneRunPerCountInAscendingOrder_keepingTheCountOnRerunAndReplay() throws Exception {
        List<Long> ids = queue.submitSweep(
                        scenarioId, revisionId, List.of("base"), List.of(1000, 300, 1000), List.of(5L, 6L), false, null)
                .runIds();

        assertThat(ids).hasSize(2);
        RunRow low = await(ids.get(0), in(RunState.DONE));
        RunRow high = await(ids.get(1), in(RunState.DONE));
        assertThat(low.label()).isEqualTo("base at 300 particles");
        assertThat(high.label()).isEqualTo("base at 1,000 particles");
        assertThat(TrialOptions.of(high)).isEqualTo(new TrialOptions(false, 1000));
        RunRow again = await(queue.rerun(high.id()).runIds().get(0), in(RunState.DONE));
        assertThat(again.label()).isEqualTo("base at 1,000 particles");
        RunRow replayed = await(queue.replaySeed(low.id(), 6L).runIds().get(0), in(RunState.DONE));
        assertThat(TrialOptions.of(replayed)).isEqualTo(new TrialOptions(true, 300));
    }

    @Test
    void sweep_badCounts_areRefusedNamingTheField_andQueueNothing() {
        long before = runs.countAll();

        assertThatThrownBy(() ->
                        queue.submitSweep(scenarioId, revisionId, List.of("base"), List.of(), List.of(1L), false, null))
                .isInstanceOfSatisfying(
                        RunRefused.class, e -> assertThat(e.field()).isEqualTo("particleCounts"));
        assertThatThrownBy(() -> queue.submitSweep(
                        scenarioId, revisionId, List.of("base"), List.of(300, 0), List.of(1L), false, null))
                .isInstanceOfSatisfying(
                        RunRefused.class, e -> assertThat(e.field()).isEqualTo("particleCounts"))
                .hasMessageContaining("particle count 0 is outside 1 to");
        assertThatThrownBy(() -> queue.submitSweep(
                        scenarioId,
                        revisionId,
                        List.of("base"),
                        java.util.stream.IntStream.rangeClosed(1, 13).boxed().toList(),
                        List.of(1L),
                        false,
                        null))
                .hasMessageContaining("13 counts given; at most 12");
        assertThatThrownBy(() -> queue.submitSweep(
                        scenarioId, revisionId, List.of("fast"), List.of(300), List.of(1L), false, null))
                .isInstanceOfSatisfying(
                        RunRefused.class, e -> assertThat(e.field()).isEqualTo("variants"));
        assertThat(runs.countAll()).isEqualTo(before);
    }

    @Test
    void unknownVariant_orNoSeeds_isRefusedNamingTheField_andQueuesNothing() {
        long before = runs.countAll();

        assertThatThrownBy(() ->
                        queue.submit(scenarioId, revisionId, List.of("fast"), List.of(1L), TrialOptions.resultsOnly()))
                .isInstanceOfSatisfying(
                        RunRefused.class, e -> assertThat(e.field()).isEqualTo("variants"))
                .hasMessageContaining("no settings variant named \"fast\"");
        assertThatThrownBy(() ->
                        queue.submit(scenarioId, revisionId, List.of("base"), List.of(), TrialOptions.resultsOnly()))
                .isInstanceOfSatisfying(
                        RunRefused.class, e -> assertThat(e.field()).isEqualTo("seeds"));
        assertThat(runs.countAll()).isEqualTo(before);
    }

    @Test
    void twentySubmissionsAtOnce_areEachRunOrRefused_noneLost() throws Exception {
        executor.holdRuns();
        long before = runs.countAll();
        ExecutorService clients = Executors.newFixedThreadPool(20);
        CountDownLatch go = new CountDownLatch(1);
        List<Future<Long>> outcomes = new ArrayList<>();
        try {
            for (int i = 0; i < 20; i++) {
                long seed = i;
                outcomes.add(clients.submit(() -> {
                    go.await();
                    try {
                        return queue.submit(
                                        scenarioId,
                                        revisionId,
                                        List.of("base"),
                                        List.of(seed),
                                        TrialOptions.resultsOnly())
                                .runIds()
                                .get(0);
                    } catch (QueueFull e) {
                        return -1L;
                    }
                }));
            }
            go.countDown();
            List<Long> accepted = new ArrayList<>();
            int refused = 0;
            for (Future<Long> f : outcomes) {
                long id = f.get(30, TimeUnit.SECONDS);
                if (id < 0) {
                    refused++;
                } else {
                    accepted.add(id);
                }
            }
            // two workers and three waiting places, all held: exactly five fit
            assertThat(accepted).hasSize(queue.places());
            assertThat(accepted.size() + refused).isEqualTo(20);
            assertThat(runs.countAll() - before).isEqualTo(accepted.size());

            executor.release();
            for (long id : accepted) {
                await(id, in(RunState.DONE));
            }
            assertThat(executor.finished.get()).isEqualTo(accepted.size());
        } finally {
            clients.shutdownNow();
        }
    }

    @Test
    void batchOfTwoVariants_isTakenWhole_orRefusedWhole() throws Exception {
        executor.holdRuns();
        // fill four of the five places
        for (int i = 0; i < 4; i++) {
            queue.submit(scenarioId, revisionId, List.of("base"), List.of((long) i), TrialOptions.resultsOnly());
        }
        long before = runs.countAll();
        store.save(
                scenarioId,
                1,
                Scenarios.corridor()
                        .withVariant(new dev.driftlab.scenario.SettingsVariant(
                                "wide", dev.driftlab.scenario.LocalizerSettings.defaults()))
                        .json(),
                "Ana",
                "variant");
        long rev2 = store.view(scenarioId).latest().id();

        assertThatThrownBy(() -> queue.submit(
                        scenarioId, rev2, List.of("base", "wide"), List.of(1L), TrialOptions.resultsOnly()))
                .isInstanceOf(QueueFull.class)
                .hasMessageContaining("try again");
        assertThat(runs.countAll()).isEqualTo(before);
    }
}
