package dev.driftlab.app.suites;

import static org.assertj.core.api.Assertions.assertThat;

import dev.driftlab.app.DriftlabApplication;
import dev.driftlab.app.runs.persistence.RunRepository;
import dev.driftlab.app.scenarios.ScenarioStore;
import dev.driftlab.app.sharing.ShareLinks;
import dev.driftlab.app.suites.persistence.SuiteRepository.SuiteRunRow;
import dev.driftlab.evaluation.EpisodeRules;
import dev.driftlab.report.SuiteReport;
import dev.driftlab.trial.BatchProgress;
import dev.driftlab.trial.SuiteResult;
import dev.driftlab.trial.SuiteRunner;
import java.nio.file.Path;
import java.time.Duration;
import java.util.List;
import java.util.Map;
import java.util.concurrent.atomic.AtomicBoolean;
import java.util.function.BooleanSupplier;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.springframework.boot.WebApplicationType;
import org.springframework.boot.builder.SpringApplicationBuilder;
import org.springframework.context.ConfigurableApplicationContext;
import tools.jackson.databind.json.JsonMapper;

/**
 * A suite run on the real engine: every cell is an ordinary run cut into work units, and the suite
 * result assembled from the cells' stored trials equals the core's own {@link SuiteRunner} on the
 * same plan (which {@code SuiteRunnerTest} holds equal to each scenario's batch alone), gate by gate
 * and trial by trial. A second run pairs with the first as its baseline.
 */
class SuiteRunEngineTest {

    @TempDir
    Path dataDir;

    @Test
    void twoSamplesOnTwoSeedsWithAProfile_matrixEqualsTheCoreRunner_andTheNextRunHasItAsBaseline() throws Exception {
        try (ConfigurableApplicationContext app = new SpringApplicationBuilder(DriftlabApplication.class)
                .web(WebApplicationType.NONE)
                .run(
                        "--spring.datasource.url=jdbc:h2:file:" + dataDir.toAbsolutePath() + "/driftlab",
                        "--driftlab.runs.workers=2",
                        // one seed per unit, so each cell runs in two units
                        "--driftlab.runs.unit-work=1",
                        "--spring.main.banner-mode=off")) {
            ScenarioStore scenarios = app.getBean(ScenarioStore.class);
            ShareLinks links = app.getBean(ShareLinks.class);
            SuiteStore store = app.getBean(SuiteStore.class);
            SuiteRuns runs = app.getBean(SuiteRuns.class);
            SuiteSamples samples = app.getBean(SuiteSamples.class);
            RunRepository runRows = app.getBean(RunRepository.class);
            Map<String, Long> loaded = scenarios.sampleScenarios();
            String office =
                    links.current(loaded.get("office-carpet-stall.json")).view().orElseThrow();
            String clinic = links.current(loaded.get("clinic-corridor-lookalike-doors.json"))
                    .view()
                    .orElseThrow();
            JsonMapper json = JsonMapper.builder().build();
            SuiteDocument doc = new SuiteDocument(
                    "Two samples",
                    "",
                    2,
                    1L,
                    List.of(new SuiteDocument.Entry(office, null, null), new SuiteDocument.Entry(clinic, null, null)),
                    List.of(json.readTree(samples.profile("fewer-particles.profile.json")
                            .orElseThrow()
                            .json())));
            SuiteStore.Created created = store.create(doc, "Ana", "two samples");

            SuiteRunRow first = runs.submit(created.suiteId(), null);
            SuiteRunRow done = waitFinished(runs, first);
            SuiteReport report = runs.report(done);

            // the same plan through the core's runner, in this process
            SuiteStore.Checked checked =
                    store.check(store.view(created.suiteId()).document());
            SuiteResult core = new SuiteRunner(2)
                    .run(checked.plan(), EpisodeRules.defaults(), BatchProgress.NONE, new AtomicBoolean());
            SuiteResult web = report.result();

            assertThat(web.cancelled()).isFalse();
            assertThat(web.finished()).isEqualTo(8).isEqualTo(core.finished());
            assertThat(web.tallies()).isEqualTo(core.tallies());
            assertThat(web.verdict()).isEqualTo(core.verdict());
            for (int r = 0; r < core.rows().size(); r++) {
                // lossless trial records: equal bit for bit, and so every gate's verdict and interval
                assertThat(web.rows().get(r).trials())
                        .isEqualTo(core.rows().get(r).trials());
                assertThat(web.rows().get(r).summary().verdicts())
                        .isEqualTo(core.rows().get(r).summary().verdicts());
            }
            // each cell is an ordinary run of its own batch; the profile's runs carry the profile
            assertThat(runs.progress(done).rows()).allSatisfy(row -> {
                assertThat(row.cells()).hasSize(2);
                assertThat(row.cells().get(0).run().orElseThrow().profile()).isEmpty();
                assertThat(row.cells().get(1).run().orElseThrow().label())
                        .isEqualTo("base under profile fewer particles");
                assertThat(runRows.forBatch(
                                row.cells().get(1).run().orElseThrow().batchKey()))
                        .hasSize(1);
            });
            assertThat(done.verdict()).contains(web.verdict());
            assertThat(runs.result(done).orElseThrow()).contains("driftlab-suite-result/1");

            // the next run compares with this one: the same trials, so nothing flipped
            SuiteRunRow second = waitFinished(runs, runs.submit(created.suiteId(), null));
            assertThat(second.baselineId()).contains(done.id());
            SuiteReport again = runs.report(second);
            assertThat(again.baseline()).isPresent();
            assertThat(again.baselineChanges()).isEmpty();
            assertThat(again.history()).hasSize(1);
            assertThat(again.history().get(0).passing())
                    .isEqualTo(report.point().passing());
        }
    }

    private static SuiteRunRow waitFinished(SuiteRuns runs, SuiteRunRow run) throws InterruptedException {
        long end = System.nanoTime() + Duration.ofSeconds(240).toNanos();
        // nobody asks for the result: the server's settler stores it once every cell has ended
        BooleanSupplier done = () -> runs.of(run.suiteId(), run.id()).finished();
        while (!done.getAsBoolean()) {
            if (System.nanoTime() > end) {
                throw new AssertionError("suite run " + run.id() + " did not finish in 240 s");
            }
            Thread.sleep(200);
        }
        return runs.of(run.suiteId(), run.id());
    }
}
