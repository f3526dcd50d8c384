package dev.driftlab.app.runs.web;

import static org.assertj.core.api.Assertions.assertThat;

import dev.driftlab.app.PostgresDatabase;
import dev.driftlab.app.runs.WorkerBoard;
import dev.driftlab.app.runs.persistence.RunRepository;
import dev.driftlab.app.runs.persistence.WorkerRepository;
import dev.driftlab.app.scenarios.ScenarioStore;
import dev.driftlab.app.scenarios.persistence.ScenarioRepository;
import dev.driftlab.app.sharing.ShareLinks;
import dev.driftlab.app.sharing.persistence.ShareLinkRepository;
import dev.driftlab.scenario.Scenarios;
import java.time.Duration;
import java.util.Optional;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.boot.jdbc.test.autoconfigure.AutoConfigureTestDatabase;
import org.springframework.boot.jdbc.test.autoconfigure.JdbcTest;
import org.springframework.context.annotation.Import;
import org.springframework.jdbc.core.simple.JdbcClient;
import org.springframework.test.context.DynamicPropertyRegistry;
import org.springframework.test.context.DynamicPropertySource;
import org.springframework.transaction.annotation.Propagation;
import org.springframework.transaction.annotation.Transactional;

/** The workers page's queries on a real PostgreSQL server (the web tests run them on H2). */
@JdbcTest
@AutoConfigureTestDatabase(replace = AutoConfigureTestDatabase.Replace.NONE)
@Import({
    WorkRows.FixedClock.class,
    WorkerBoard.class,
    WorkerRepository.class,
    RunRepository.class,
    ScenarioStore.class,
    ScenarioRepository.class,
    ShareLinks.class,
    ShareLinkRepository.class
})
@Transactional(propagation = Propagation.NOT_SUPPORTED)
class WorkerBoardPostgresTest {

    @DynamicPropertySource
    static void postgres(DynamicPropertyRegistry registry) {
        PostgresDatabase.register(registry);
    }

    @Autowired
    WorkerBoard board;

    @Autowired
    JdbcClient jdbc;

    @Autowired
    RunRepository runs;

    @Autowired
    ScenarioStore store;

    @Test
    void snapshotAndUnitTable_readTheSameOnPostgres() {
        WorkRows rows = new WorkRows(jdbc, runs, store);
        rows.clear();
        ScenarioStore.Created c =
                store.create(Scenarios.corridor().withName("Dock aisle").json(), "Ana", "start");
        long run = rows.runningRun(c, WorkRows.seeds(11, 6));
        rows.process("test-alive", "rack-a", "worker", 4, Duration.ofSeconds(1), false);
        rows.process("test-lost", "rack-b", "worker", 4, Duration.ofSeconds(30), false);
        rows.unit(run, 0, 0, 2, "done", "test-alive", 1, 1);
        rows.unit(run, 1, 2, 2, "running", "test-alive", 1, 0.5);
        rows.unit(run, 2, 4, 2, "running", "test-lost", 2, 0.25);
        rows.trial(run, 11, Duration.ofSeconds(10));
        rows.trial(run, 12, Duration.ofMinutes(4));
        rows.queued("a", false);
        rows.queued("b", true);

        WorkerBoard.Snapshot s = board.snapshot();
        WorkerBoard.UnitTable t = board.units(runs.find(run).orElseThrow());

        assertThat(s.workers()).extracting(WorkerBoard.Worker::name).containsExactly("test-alive", "test-lost");
        assertThat(s.workers().get(0).state()).isEqualTo(WorkerBoard.Liveness.ALIVE);
        assertThat(s.workers().get(1).state()).isEqualTo(WorkerBoard.Liveness.LOST);
        assertThat(s.workers().get(0).running())
                .containsExactly(new WorkerBoard.Current(
                        run, 2, 0.5, Optional.of("Dock aisle"), Optional.of("/s/" + c.viewToken() + "/runs/" + run)));
        assertThat(s.unitsWaiting()).isEqualTo(1);
        assertThat(s.trialsLastMinute()).isEqualTo(1);
        assertThat(s.trialsLastTenMinutes()).isEqualTo(2);
        assertThat(t.counts().total()).isEqualTo(3);
        assertThat(t.rows())
                .extracting(WorkerBoard.UnitRow::state)
                .containsExactly("done", "running", "waiting to run again: its process was lost");
        assertThat(t.rows()).extracting(WorkerBoard.UnitRow::seeds).containsExactly("11 to 12", "13 to 14", "15 to 16");
    }
}
