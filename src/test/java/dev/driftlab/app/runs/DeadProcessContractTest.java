package dev.driftlab.app.runs;

import static org.assertj.core.api.Assertions.assertThat;

import dev.driftlab.app.DriftlabApplication;
import dev.driftlab.app.runs.persistence.RunRepository;
import dev.driftlab.app.runs.persistence.UnitRepository;
import dev.driftlab.app.scenarios.ScenarioStore;
import java.nio.file.Path;
import java.time.OffsetDateTime;
import java.util.List;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.springframework.boot.WebApplicationType;
import org.springframework.boot.builder.SpringApplicationBuilder;
import org.springframework.context.ConfigurableApplicationContext;
import org.springframework.jdbc.core.simple.JdbcClient;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;

/**
 * The work units' contract on the embedded H2 database, in one process: a process that died
 * holding units (its heartbeat stopped, one unit's trial already stored) leaves them to the next
 * process, which takes them again once the heartbeat is late; a unit run twice stores nothing new;
 * the run ends with every seed once and the result of one uninterrupted run. The same contract
 * across processes on PostgreSQL, with a real SIGKILL, is {@code WorkersAcrossProcessesE2ETest}.
 */
class DeadProcessContractTest {

    private static final String DEAD = "gone-host/4242/zz";

    @TempDir
    Path dataDir;

    private ConfigurableApplicationContext start(boolean execute) {
        return new SpringApplicationBuilder(DriftlabApplication.class)
                .web(WebApplicationType.NONE)
                .run(
                        "--spring.datasource.url=jdbc:h2:file:" + dataDir.toAbsolutePath() + "/driftlab",
                        "--driftlab.runs.execute=" + execute,
                        "--driftlab.runs.workers=1",
                        "--driftlab.runs.unit-work=1",
                        "--spring.main.banner-mode=off");
    }

    @Test
    void unitsHeldByADeadProcess_areTakenAgain_andEverySeedIsStoredOnce() throws Exception {
        List<Long> seeds = List.of(1L, 2L, 3L, 4L);
        long runId;
        String document;
        TrialRecord storedBeforeDeath;
        try (ConfigurableApplicationContext setup = start(false)) {
            ScenarioStore store = setup.getBean(ScenarioStore.class);
            ScenarioStore.ScenarioView v = store.search("Storage hall", 1).get(0);
            document = store.documentOfRevision(v.latest().id()).orElseThrow();
            runId = setup.getBean(RunQueue.class)
                    .submit(v.head().id(), v.latest().id(), List.of("base"), seeds, TrialOptions.resultsOnly())
                    .runIds()
                    .get(0);
            // a process took units 0 and 1, stored unit 0's trial, and died before saying so
            EngineTrialExecutorTest.Recording ctx = new EngineTrialExecutorTest.Recording(2);
            new EngineTrialExecutor()
                    .runSeeds(new TrialRequest(document, "base", seeds, TrialOptions.resultsOnly()), List.of(1L), ctx);
            storedBeforeDeath = ctx.trials.get(1L);
            JdbcClient jdbc = JdbcClient.create(setup.getBean(javax.sql.DataSource.class));
            OffsetDateTime longAgo = OffsetDateTime.now().minusMinutes(10);
            for (int unit = 0; unit < 2; unit++) {
                assertThat(jdbc.sql("UPDATE scheduled_tasks SET picked = TRUE, picked_by = ?, last_heartbeat = ?,"
                                        + " version = version + 1 WHERE task_instance = ?")
                                .params(DEAD, longAgo, WorkUnits.instanceId(runId, unit))
                                .update())
                        .isEqualTo(1);
                setup.getBean(UnitRepository.class).unitStarted(runId, unit, DEAD, longAgo);
            }
            setup.getBean(UnitRepository.class)
                    .insertTrial(
                            runId,
                            1L,
                            storedBeforeDeath.outcome(),
                            storedBeforeDeath.trace(),
                            storedBeforeDeath.seconds(),
                            DEAD,
                            longAgo);
            setup.getBean(RunRepository.class).markRunning(runId, longAgo);
        }

        try (ConfigurableApplicationContext next = start(true)) {
            RunRepository runs = next.getBean(RunRepository.class);
            UnitRepository units = next.getBean(UnitRepository.class);
            long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(90);
            while (!runs.find(runId).orElseThrow().state().equals("done") && System.nanoTime() < deadline) {
                Thread.sleep(50);
            }
            assertThat(runs.find(runId).orElseThrow().state()).isEqualTo("done");
            assertThat(units.storedSeeds(runId)).containsExactlyInAnyOrderElementsOf(seeds);
            // the seed stored before the process died is the row it wrote: running it again changed nothing
            UnitRepository.TrialRow first = units.trials(runId).stream()
                    .filter(t -> t.seed() == 1L)
                    .findFirst()
                    .orElseThrow();
            assertThat(first.worker()).isEqualTo(DEAD);
            assertThat(first.outcome()).isEqualTo(storedBeforeDeath.outcome());
            assertThat(units.units(runId).get(0).attempts()).isEqualTo(2);
            assertThat(units.units(runId).get(1).attempts()).isEqualTo(2);
            assertThat(units.units(runId).get(1).worker()).isPresent().get().isNotEqualTo(DEAD);
            assertThat(units.units(runId).get(2).attempts()).isEqualTo(1);

            EngineTrialExecutor engine = new EngineTrialExecutor();
            EngineTrialExecutorTest.Recording ctx = new EngineTrialExecutorTest.Recording(2);
            TrialRequest request = new TrialRequest(document, "base", seeds, TrialOptions.resultsOnly());
            engine.runSeeds(request, seeds, ctx);
            String alone = engine.assemble(
                            request, seeds.stream().map(ctx.trials::get).toList())
                    .resultJson();
            assertThat(withoutTimings(runs.result(runId).orElseThrow())).isEqualTo(withoutTimings(alone));
        }
    }

    private static JsonNode withoutTimings(String result) {
        return dev.driftlab.report.ResultDocs.withoutTimings(
                JsonMapper.builder().build().readTree(result));
    }
}
