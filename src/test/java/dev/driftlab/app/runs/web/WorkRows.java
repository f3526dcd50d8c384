package dev.driftlab.app.runs.web;

import dev.driftlab.app.runs.WorkUnits;
import dev.driftlab.app.runs.persistence.RunColumns;
import dev.driftlab.app.runs.persistence.RunRepository;
import dev.driftlab.app.scenarios.ScenarioStore;
import dev.driftlab.app.sharing.Tokens;
import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.time.OffsetDateTime;
import java.time.ZoneOffset;
import java.util.List;
import java.util.stream.LongStream;
import org.springframework.boot.test.context.TestConfiguration;
import org.springframework.context.annotation.Bean;
import org.springframework.jdbc.core.simple.JdbcClient;

/**
 * Rows of the work tables written straight into the database, as worker processes on other
 * machines would write them, at a fixed time so that alive, lost and throughput are exact. The
 * runs made here have no scheduled units, so the test context's own engine never touches them.
 */
final class WorkRows {

    /** The time every test of these tables sees as now. */
    static final OffsetDateTime NOW = OffsetDateTime.of(2031, 5, 4, 10, 0, 0, 0, ZoneOffset.UTC);

    /** The fixed clock for the whole context: pages, engine heartbeats and stored rows alike. */
    @TestConfiguration
    static class FixedClock {
        @Bean
        Clock clock() {
            return Clock.fixed(Instant.from(NOW), ZoneOffset.UTC);
        }
    }

    /** Prefix of every process name written here, so a test removes exactly its own rows. */
    static final String PREFIX = "test-";

    private final JdbcClient jdbc;
    private final RunRepository runs;
    private final ScenarioStore store;

    WorkRows(JdbcClient jdbc, RunRepository runs, ScenarioStore store) {
        this.jdbc = jdbc;
        this.runs = runs;
        this.store = store;
    }

    /** Removes what earlier tests wrote: processes, trials, waiting units and their runs. */
    void clear() {
        jdbc.sql("DELETE FROM work_process WHERE name LIKE ?")
                .param(PREFIX + "%")
                .update();
        jdbc.sql("DELETE FROM scheduled_tasks WHERE task_instance LIKE ?")
                .param(PREFIX + "%")
                .update();
        jdbc.sql("DELETE FROM run").update();
    }

    /** A process that said it was alive {@code silent} before now (and stopped, when asked). */
    void process(String name, String host, String role, int threads, Duration silent, boolean stopped) {
        OffsetDateTime last = NOW.minus(silent);
        jdbc.sql("INSERT INTO work_process (name, host, role, threads, started_at, last_seen, stopped_at,"
                        + " units_done, trials_done) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?)")
                .params(
                        name,
                        host,
                        role,
                        threads,
                        NOW.minusHours(1).plusMinutes(1),
                        last,
                        stopped ? last.plusSeconds(1) : null,
                        3,
                        9)
                .update();
    }

    /** A running run of the scenario over the seeds, without units yet. */
    long runningRun(ScenarioStore.Created c, List<Long> seeds) {
        long id = runs.insert(
                c.scenarioId(),
                store.view(c.scenarioId()).latest().id(),
                Tokens.next(),
                Tokens.next(),
                "base",
                RunColumns.seedsJson(seeds),
                RunColumns.optionsJson(new RunColumns.Options(false, 0)),
                NOW.minusMinutes(5));
        runs.markRunning(id, NOW.minusMinutes(4));
        return id;
    }

    static List<Long> seeds(long first, int count) {
        return LongStream.range(first, first + count).boxed().toList();
    }

    /** A unit row in a given state. */
    void unit(
            long runId,
            int unitNo,
            int firstIndex,
            int seedCount,
            String state,
            String worker,
            int attempts,
            double progress) {
        jdbc.sql("INSERT INTO run_unit (run_id, unit_no, first_index, seed_count, state, worker, attempts, progress)"
                        + " VALUES (?, ?, ?, ?, ?, ?, ?, ?)")
                .params(runId, unitNo, firstIndex, seedCount, state, worker, attempts, progress)
                .update();
    }

    /** A stored trial that finished {@code ago} before now. */
    void trial(long runId, long seed, Duration ago) {
        jdbc.sql("INSERT INTO run_trial (run_id, seed, outcome, seconds, worker, finished_at)"
                        + " VALUES (?, ?, '{}', 1.5, ?, ?)")
                .params(runId, seed, PREFIX + "alive", NOW.minus(ago))
                .update();
    }

    /** An engine queue entry, taken by a process or not; due far ahead so no engine runs it. */
    void queued(String instance, boolean picked) {
        jdbc.sql("INSERT INTO scheduled_tasks (task_name, task_instance, execution_time, picked, picked_by, version,"
                        + " priority) VALUES (?, ?, ?, ?, ?, 1, 1)")
                .params(
                        WorkUnits.TASK,
                        PREFIX + instance,
                        OffsetDateTime.of(2199, 1, 1, 0, 0, 0, 0, ZoneOffset.UTC),
                        picked,
                        picked ? PREFIX + "alive" : null)
                .update();
    }
}
