package dev.driftlab.app.runs;

import static org.assertj.core.api.Assertions.assertThat;

import dev.driftlab.app.DriftlabApplication;
import dev.driftlab.app.runs.persistence.RunRepository;
import dev.driftlab.app.scenarios.ScenarioStore;
import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.springframework.boot.WebApplicationType;
import org.springframework.boot.builder.SpringApplicationBuilder;
import org.springframework.context.ConfigurableApplicationContext;

/** A server stopped in the middle of runs leaves them interrupted after the next start, ready to run again. */
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
    void serverStoppedMidRun_leavesRunningAndQueuedRunsInterrupted_afterRestart() throws Exception {
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
                            v.head().id(), v.latest().id(), List.of("base"), List.of(2L), TrialOptions.resultsOnly())
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
            RunQueue queue = second.getBean(RunQueue.class);
            assertThat(runs.find(running).orElseThrow().state()).isEqualTo("interrupted");
            assertThat(runs.find(waiting).orElseThrow().state()).isEqualTo("interrupted");
            assertThat(runs.find(waiting).orElseThrow().failure()).contains("run it again");

            long again = queue.rerun(waiting).runIds().get(0);
            long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(20);
            while (!runs.find(again).orElseThrow().state().equals("done") && System.nanoTime() < deadline) {
                Thread.sleep(10);
            }
            assertThat(runs.find(again).orElseThrow().state()).isEqualTo("done");
            // the samples were loaded once, not again on the second start
            assertThat(second.getBean(ScenarioStore.class).search("Storage hall", 10))
                    .hasSize(1);
        }
    }
}
