package dev.driftlab.app.runs.persistence;

import java.sql.ResultSet;
import java.sql.SQLException;
import java.time.OffsetDateTime;
import java.util.Arrays;
import java.util.List;
import java.util.Optional;
import java.util.TreeSet;
import org.springframework.jdbc.core.simple.JdbcClient;
import org.springframework.stereotype.Repository;

/**
 * Reads for watching the work: the processes that execute units with what each runs now, the
 * queue, throughput, and one run's units. Each method is one query whatever the number of
 * processes or units, so the workers page costs the same with one worker or a hundred.
 */
@Repository
public class WorkerRepository {

    /**
     * One process row.
     *
     * @param name its engine name
     * @param host host name
     * @param role "server" or "worker"
     * @param threads unit threads
     * @param startedAt when it started
     * @param lastSeen its last heartbeat
     * @param stoppedAt when it said it stopped, if it did (a later heartbeat clears it)
     * @param unitsDone units it finished
     * @param trialsDone trials it finished
     * @param localizers the outside localizers it offers, by name
     */
    public record ProcessLine(
            String name,
            String host,
            String role,
            int threads,
            OffsetDateTime startedAt,
            OffsetDateTime lastSeen,
            Optional<OffsetDateTime> stoppedAt,
            long unitsDone,
            long trialsDone,
            List<String> localizers) {}

    /**
     * A unit a process runs now.
     *
     * @param worker the process
     * @param runId run
     * @param scenarioId the run's scenario
     * @param scenarioName the scenario's current name
     * @param unitNo number within the run, from 0
     * @param progress done share of the unit's seeds, 0..1
     */
    public record RunningUnit(
            String worker, long runId, long scenarioId, String scenarioName, int unitNo, double progress) {}

    /**
     * One unit of a run with what is known of the process that ran it last.
     *
     * @param unitNo number within the run, from 0
     * @param firstIndex position of its first seed in the run's seed list
     * @param seedCount how many consecutive seeds it runs
     * @param state queued, running or done
     * @param worker the process that ran it last, if any
     * @param attempts how many times a process started it
     * @param progress done share of its own seeds, 0..1
     * @param workerLastSeen that process's last heartbeat, if it has a row
     * @param workerStoppedAt when that process said it stopped, if it did
     */
    public record UnitLine(
            int unitNo,
            int firstIndex,
            int seedCount,
            String state,
            Optional<String> worker,
            int attempts,
            double progress,
            Optional<OffsetDateTime> workerLastSeen,
            Optional<OffsetDateTime> workerStoppedAt) {}

    /**
     * How many of a run's units are in each state.
     *
     * @param queued waiting for a process
     * @param running taken by a process
     * @param done finished
     */
    public record UnitCounts(long queued, long running, long done) {
        public long total() {
            return queued + running + done;
        }
    }

    /**
     * Trials finished recently, over all runs and processes.
     *
     * @param lastMinute in the last minute
     * @param lastTenMinutes in the last ten minutes
     */
    public record Throughput(long lastMinute, long lastTenMinutes) {}

    private final JdbcClient jdbc;

    public WorkerRepository(JdbcClient jdbc) {
        this.jdbc = jdbc;
    }

    /**
     * Processes seen since a time: those whose last heartbeat is after {@code aliveSince} and that
     * did not say they stopped first, then the rest by name; at most {@code limit}.
     */
    public List<ProcessLine> processes(OffsetDateTime seenSince, OffsetDateTime aliveSince, int limit) {
        return jdbc.sql("SELECT name, host, role, threads, started_at, last_seen, stopped_at, units_done, trials_done,"
                        + " localizers"
                        + " FROM work_process WHERE last_seen >= ?"
                        + " ORDER BY CASE WHEN stopped_at IS NULL AND last_seen >= ? THEN 0 ELSE 1 END, role, name"
                        + " FETCH FIRST " + Math.max(1, limit) + " ROWS ONLY")
                .params(seenSince, aliveSince)
                .query((rs, n) -> new ProcessLine(
                        rs.getString("name"),
                        rs.getString("host"),
                        rs.getString("role"),
                        rs.getInt("threads"),
                        rs.getObject("started_at", OffsetDateTime.class),
                        rs.getObject("last_seen", OffsetDateTime.class),
                        Optional.ofNullable(rs.getObject("stopped_at", OffsetDateTime.class)),
                        rs.getLong("units_done"),
                        rs.getLong("trials_done"),
                        names(rs.getString("localizers"))))
                .list();
    }

    /**
     * The outside localizers offered by processes alive now (heartbeat after {@code aliveSince},
     * not stopped), each name once, in order.
     */
    public List<String> offeredLocalizers(OffsetDateTime aliveSince) {
        TreeSet<String> out = new TreeSet<>();
        jdbc.sql("SELECT localizers FROM work_process WHERE last_seen >= ? AND stopped_at IS NULL AND localizers <> ''")
                .params(aliveSince)
                .query(String.class)
                .list()
                .forEach(text -> out.addAll(names(text)));
        return List.copyOf(out);
    }

    /** Names stored separated by commas. */
    private static List<String> names(String text) {
        if (text == null || text.isBlank()) {
            return List.of();
        }
        return Arrays.stream(text.split(","))
                .map(String::strip)
                .filter(x -> !x.isEmpty())
                .toList();
    }

    /**
     * The units of running runs held by processes seen since a time, with their run's scenario:
     * one query over the process list (the unit index is keyed by worker), not one per process.
     */
    public List<RunningUnit> runningUnits(OffsetDateTime seenSince, int limit) {
        return jdbc.sql("SELECT u.worker, u.run_id, r.scenario_id, s.name AS scenario_name, u.unit_no, u.progress"
                        + " FROM work_process p"
                        + " JOIN run_unit u ON u.worker = p.name AND u.state = 'running'"
                        + " JOIN run r ON r.id = u.run_id AND r.state = 'running'"
                        + " JOIN scenario s ON s.id = r.scenario_id"
                        + " WHERE p.last_seen >= ?"
                        + " ORDER BY u.worker, u.run_id, u.unit_no"
                        + " FETCH FIRST " + Math.max(1, limit) + " ROWS ONLY")
                .param(seenSince)
                .query((rs, n) -> new RunningUnit(
                        rs.getString("worker"),
                        rs.getLong("run_id"),
                        rs.getLong("scenario_id"),
                        rs.getString("scenario_name"),
                        rs.getInt("unit_no"),
                        rs.getDouble("progress")))
                .list();
    }

    /**
     * Units waiting in the engine's own queue: not taken by any process (new units, and units
     * put back after their process stopped or failed). Cancelled runs' units are deleted there.
     *
     * @param taskNames SQL {@code LIKE} pattern of the task names counted
     */
    public long unitsWaiting(String taskNames) {
        return jdbc.sql("SELECT COUNT(*) FROM scheduled_tasks WHERE task_name LIKE ? AND picked = ?")
                .params(taskNames, false)
                .query(Long.class)
                .single();
    }

    /** Trials finished since each of two times (the later first), in one pass over the time index. */
    public Throughput trialsFinished(OffsetDateTime sinceShort, OffsetDateTime sinceLong) {
        return jdbc.sql("SELECT COALESCE(SUM(CASE WHEN finished_at >= ? THEN 1 ELSE 0 END), 0) AS short_count,"
                        + " COUNT(*) AS long_count FROM run_trial WHERE finished_at >= ?")
                .params(sinceShort, sinceLong)
                .query((rs, n) -> new Throughput(rs.getLong("short_count"), rs.getLong("long_count")))
                .single();
    }

    /** The first {@code limit} units of a run by number, each with its last process's heartbeat. */
    public List<UnitLine> units(long runId, int limit) {
        return jdbc.sql("SELECT u.unit_no, u.first_index, u.seed_count, u.state, u.worker, u.attempts, u.progress,"
                        + " p.last_seen, p.stopped_at"
                        + " FROM run_unit u LEFT JOIN work_process p ON p.name = u.worker"
                        + " WHERE u.run_id = ? ORDER BY u.unit_no"
                        + " FETCH FIRST " + Math.max(1, limit) + " ROWS ONLY")
                .param(runId)
                .query(WorkerRepository::unitLine)
                .list();
    }

    /** How many of a run's units are in each state. */
    public UnitCounts unitCounts(long runId) {
        return jdbc.sql("SELECT COALESCE(SUM(CASE WHEN state = 'queued' THEN 1 ELSE 0 END), 0) AS queued,"
                        + " COALESCE(SUM(CASE WHEN state = 'running' THEN 1 ELSE 0 END), 0) AS running,"
                        + " COALESCE(SUM(CASE WHEN state = 'done' THEN 1 ELSE 0 END), 0) AS done"
                        + " FROM run_unit WHERE run_id = ?")
                .param(runId)
                .query((rs, n) -> new UnitCounts(rs.getLong("queued"), rs.getLong("running"), rs.getLong("done")))
                .single();
    }

    private static UnitLine unitLine(ResultSet rs, int n) throws SQLException {
        return new UnitLine(
                rs.getInt("unit_no"),
                rs.getInt("first_index"),
                rs.getInt("seed_count"),
                rs.getString("state"),
                Optional.ofNullable(rs.getString("worker")),
                rs.getInt("attempts"),
                rs.getDouble("progress"),
                Optional.ofNullable(rs.getObject("last_seen", OffsetDateTime.class)),
                Optional.ofNullable(rs.getObject("stopped_at", OffsetDateTime.class)));
    }
}
