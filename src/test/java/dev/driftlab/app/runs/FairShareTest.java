package dev.driftlab.app.runs;

import static org.assertj.core.api.Assertions.assertThat;

import dev.driftlab.app.DriftlabApplication;
import dev.driftlab.app.runs.persistence.RunRepository;
import dev.driftlab.app.runs.persistence.UnitRepository;
import dev.driftlab.app.scenarios.ScenarioStore;
import java.nio.file.Path;
import java.time.Duration;
import java.util.List;
import java.util.stream.LongStream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.springframework.boot.WebApplicationType;
import org.springframework.boot.builder.SpringApplicationBuilder;
import org.springframework.context.ConfigurableApplicationContext;

/**
 * Fair sharing between runs, with the real localizer on one unit thread: the units of every run are
 * numbered, and a unit's priority falls with its number, so the engine takes the first unit of each
 * waiting run before the later units of a long one (round robin between runs). A 5-seed run
 * submitted behind a 300-seed batch starts within seconds and is done long before the batch is.
 */
class FairShareTest {

    @TempDir
    Path dataDir;

    @Test
    void aSmallRunSubmittedBehindABigBatch_startsWithinSeconds_andIsDoneBeforeIt() throws Exception {
        try (ConfigurableApplicationContext app = new SpringApplicationBuilder(DriftlabApplication.class)
                .web(WebApplicationType.NONE)
                .run(
                        "--spring.datasource.url=jdbc:h2:file:" + dataDir.toAbsolutePath() + "/driftlab",
                        "--driftlab.runs.workers=1",
                        // one seed per unit (about a second of work each)
                        "--driftlab.runs.unit-work=1",
                        "--spring.main.banner-mode=off")) {
            ScenarioStore store = app.getBean(ScenarioStore.class);
            RunQueue queue = app.getBean(RunQueue.class);
            RunRepository runs = app.getBean(RunRepository.class);
            UnitRepository units = app.getBean(UnitRepository.class);
            ScenarioStore.ScenarioView hall = store.search("Storage hall", 1).get(0);
            ScenarioStore.ScenarioView office = store.search("carpet", 1).get(0);

            List<Long> many = LongStream.rangeClosed(1, 300).boxed().toList();
            long big = queue.submit(
                            hall.head().id(), hall.latest().id(), List.of("base"), many, TrialOptions.resultsOnly())
                    .runIds()
                    .get(0);
            waitFor(() -> units.countTrials(big) >= 2, Duration.ofSeconds(60));

            long submitted = System.nanoTime();
            long small = queue.submit(
                            office.head().id(),
                            office.latest().id(),
                            List.of("base"),
                            List.of(1L, 2L, 3L, 4L, 5L),
                            TrialOptions.resultsOnly())
                    .runIds()
                    .get(0);
            waitFor(() -> runs.find(small).orElseThrow().startedAt().isPresent(), Duration.ofSeconds(30));
            double startedAfter = (System.nanoTime() - submitted) / 1e9;
            waitFor(() -> runs.find(small).orElseThrow().state().equals("done"), Duration.ofSeconds(60));
            double doneAfter = (System.nanoTime() - submitted) / 1e9;
            long bigTrials = units.countTrials(big);

            // one unit of the batch may be under way, plus a poll of the engine (1 s)
            assertThat(startedAfter).as("seconds until the small run started").isLessThan(5.0);
            // round robin: at most one unit of the batch between two of the small run's units
            assertThat(doneAfter).as("seconds until the small run was done").isLessThan(30.0);
            assertThat(bigTrials).as("trials of the batch done meanwhile").isLessThan(60);
            assertThat(runs.find(big).orElseThrow().state()).isEqualTo("running");
            queue.cancel(big);
        }
    }

    private static void waitFor(java.util.function.BooleanSupplier done, Duration limit) throws InterruptedException {
        long deadline = System.nanoTime() + limit.toNanos();
        while (!done.getAsBoolean()) {
            assertThat(System.nanoTime()).as("waited " + limit).isLessThan(deadline);
            Thread.sleep(50);
        }
    }
}
