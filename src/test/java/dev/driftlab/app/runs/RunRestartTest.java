package dev.driftlab.app.runs;

import static org.assertj.core.api.Assertions.assertThat;

import dev.driftlab.app.DriftlabApplication;
import dev.driftlab.app.runs.persistence.RunRepository;
import dev.driftlab.app.runs.persistence.UnitRepository;
import dev.driftlab.app.scenarios.ScenarioStore;
import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.springframework.boot.WebApplicationType;
import org.springframework.boot.builder.SpringApplicationBuilder;
import org.springframework.context.ConfigurableApplicationContext;

/**
 * A server stopped in the middle of runs resumes them on its next start: the units it held go back
 * in the queue (the engine hands them out again), the waiting ones were never taken, and every
 * seed ends up with exactly one trial.
 */
class RunRestartTest {

    @TempDir
    Path dataDir;

    private ConfigurableApplicationContext start() {
        return new SpringApplicationBuilder(DriftlabApplication.class)
                .web(WebApplicationType.SERVLET)
                .sources(ScriptedTrialExecutor.class)
                // command-line arguments outrank the test configuration file
                .run(
                        "--spring.datasource.url=jdbc:h2:file:" + dataDir.toAbsolutePath() + "/driftlab",
                        "--driftlab.runs.workers=1",
                        "--driftlab.runs.queue-capacity=2",
                        "--server.port=0",
                        "--spring.main.banner-mode=off");
    }

    @Test
    void serverStoppedMidRun_resumesRunningAndQueuedRuns_afterRestart() throws Exception {
        long running;
        long waiting;
        try (ConfigurableApplicationContext first = start()) {
            ScriptedTrialExecutor executor = first.getBean(ScriptedTrialExecutor.class);
            executor.holdRuns();
            ScenarioStore store = first.getBean(ScenarioStore.class);
            RunQueue queue = first.getBean(RunQueue.class);
            RunRepository runs = first.getBean(RunRepository.class);
            ScenarioStore.ScenarioView v = store.search("Storage hall", 1).get(0);
            running = queue.submit(
                            v.head().id(), v.latest().id(), List.of("base"), List.of(1L), TrialOptions.resultsOnly())
                    .runIds()
                    .get(0);
            waiting = queue.submit(
                            v.head().id(),
                            v.latest().id(),
                            List.of("base"),
                            List.of(2L, 3L),
                            TrialOptions.resultsOnly())
                    .runIds()
                    .get(0);
            long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(20);
            while (!runs.find(running).orElseThrow().state().equals("running") && System.nanoTime() < deadline) {
                Thread.sleep(10);
            }
            assertThat(runs.find(running).orElseThrow().state()).isEqualTo("running");
            assertThat(runs.find(waiting).orElseThrow().state()).isEqualTo("queued");
        }

        try (ConfigurableApplicationContext second = start()) {
            RunRepository runs = second.getBean(RunRepository.class);
            UnitRepository units = second.getBean(UnitRepository.class);
            long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(40);
            while ((!runs.find(running).orElseThrow().state().equals("done")
                            || !runs.find(waiting).orElseThrow().state().equals("done"))
                    && System.nanoTime() < deadline) {
                Thread.sleep(20);
            }
            assertThat(runs.find(running).orElseThrow().state()).isEqualTo("done");
            assertThat(runs.find(waiting).orElseThrow().state()).isEqualTo("done");
            assertThat(units.storedSeeds(running)).containsExactly(1L);
            assertThat(units.storedSeeds(waiting)).containsExactlyInAnyOrder(2L, 3L);
            // the unit the first server held was started again by the second
            assertThat(units.units(running).get(0).attempts()).isEqualTo(2);
            // the samples were loaded once, not again on the second start
            assertThat(second.getBean(ScenarioStore.class).search("Storage hall", 10))
                    .hasSize(1);
        }
    }
}
