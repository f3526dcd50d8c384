package dev.driftlab.app.runs.persistence;

import java.sql.ResultSet;
import java.sql.SQLException;
import java.time.OffsetDateTime;
import java.util.List;
import java.util.Optional;
import org.springframework.dao.DuplicateKeyException;
import org.springframework.jdbc.core.simple.JdbcClient;
import org.springframework.stereotype.Repository;

/**
 * Rows of {@code run_unit} (which seeds each work unit runs and who ran it), {@code run_trial} (one
 * finished trial per run and seed, written once) and {@code work_process} (which processes are
 * alive). Every write is safe to repeat: a unit that runs twice changes nothing.
 */
@Repository
public class UnitRepository {

    /**
     * One work unit.
     *
     * @param runId run
     * @param unitNo number within the run, from 0
     * @param firstIndex position of its first seed in the run's seed list
     * @param seedCount how many consecutive seeds of the list it runs
     * @param state queued, running or done
     * @param worker the process that ran it last, if any
     * @param attempts how many times a process started it
     * @param progress done share of its own seeds, 0..1
     */
    public record UnitRow(
            long runId,
            int unitNo,
            int firstIndex,
            int seedCount,
            String state,
            Optional<String> worker,
            int attempts,
            double progress) {}

    /**
     * One stored trial.
     *
     * @param seed seed
     * @param outcome the executor's lossless record of the outcome
     * @param trace the per-frame trace, kept only for single-seed runs
     * @param seconds compute time of the trial
     * @param worker process that ran it
     */
    public record TrialRow(long seed, String outcome, Optional<String> trace, double seconds, String worker) {}

    private final JdbcClient jdbc;

    public UnitRepository(JdbcClient jdbc) {
        this.jdbc = jdbc;
    }

    public void insertUnit(long runId, int unitNo, int firstIndex, int seedCount) {
        jdbc.sql("INSERT INTO run_unit (run_id, unit_no, first_index, seed_count, state, attempts, progress)"
                        + " VALUES (?, ?, ?, ?, 'queued', 0, 0)")
                .params(runId, unitNo, firstIndex, seedCount)
                .update();
    }

    public Optional<UnitRow> unit(long runId, int unitNo) {
        return jdbc.sql("SELECT * FROM run_unit WHERE run_id = ? AND unit_no = ?")
                .params(runId, unitNo)
                .query(UnitRepository::unitRow)
                .optional();
    }

    public List<UnitRow> units(long runId) {
        return jdbc.sql("SELECT * FROM run_unit WHERE run_id = ? ORDER BY unit_no")
                .param(runId)
                .query(UnitRepository::unitRow)
                .list();
    }

    /** A process starts (or starts again) a unit. */
    public void unitStarted(long runId, int unitNo, String worker, OffsetDateTime now) {
        jdbc.sql("UPDATE run_unit SET state = 'running', worker = ?, attempts = attempts + 1, started_at = ?,"
                        + " finished_at = NULL WHERE run_id = ? AND unit_no = ?")
                .params(worker, now, runId, unitNo)
                .update();
    }

    public void unitProgress(long runId, int unitNo, double progress) {
        jdbc.sql("UPDATE run_unit SET progress = ? WHERE run_id = ? AND unit_no = ? AND state = 'running'")
                .params(progress, runId, unitNo)
                .update();
    }

    public void unitDone(long runId, int unitNo, OffsetDateTime now) {
        jdbc.sql("UPDATE run_unit SET state = 'done', progress = 1, finished_at = ? WHERE run_id = ? AND unit_no = ?")
                .params(now, runId, unitNo)
                .update();
    }

    /** A unit ends without finishing: its run was cancelled or failed. */
    public void unitStopped(long runId, int unitNo, OffsetDateTime now) {
        jdbc.sql("UPDATE run_unit SET state = 'stopped', finished_at = ? WHERE run_id = ? AND unit_no = ?"
                        + " AND state <> 'done'")
                .params(now, runId, unitNo)
                .update();
    }

    /** Units of a run that no process took yet end with it (cancelled or failed). */
    public int dropQueuedUnits(long runId, OffsetDateTime now) {
        return jdbc.sql("UPDATE run_unit SET state = 'stopped', finished_at = ? WHERE run_id = ? AND state = 'queued'")
                .params(now, runId)
                .update();
    }

    /**
     * Stores a finished trial once; false when that seed of the run was already stored (by an
     * earlier attempt of the same unit), in which case the stored row stays as it was.
     */
    public boolean insertTrial(
            long runId, long seed, String outcome, String trace, double seconds, String worker, OffsetDateTime now) {
        try {
            return jdbc.sql("INSERT INTO run_trial (run_id, seed, outcome, trace, seconds, worker, finished_at)"
                                    + " VALUES (?, ?, ?, ?, ?, ?, ?)")
                            .params(runId, seed, outcome, trace, seconds, worker, now)
                            .update()
                    == 1;
        } catch (DuplicateKeyException alreadyStored) {
            return false;
        }
    }

    /** Seeds of the run that have a stored trial. */
    public List<Long> storedSeeds(long runId) {
        return jdbc.sql("SELECT seed FROM run_trial WHERE run_id = ?")
                .param(runId)
                .query(Long.class)
                .list();
    }

    public long countTrials(long runId) {
        return jdbc.sql("SELECT COUNT(*) FROM run_trial WHERE run_id = ?")
                .param(runId)
                .query(Long.class)
                .single();
    }

    public List<TrialRow> trials(long runId) {
        return jdbc.sql("SELECT seed, outcome, trace, seconds, worker FROM run_trial WHERE run_id = ?")
                .param(runId)
                .query((rs, n) -> new TrialRow(
                        rs.getLong("seed"),
                        rs.getString("outcome"),
                        Optional.ofNullable(rs.getString("trace")),
                        rs.getDouble("seconds"),
                        rs.getString("worker")))
                .list();
    }

    /**
     * A process says it is alive (inserting its row on the first beat).
     *
     * @param localizers the outside localizers it offers, names separated by commas
     */
    public void heartbeat(
            String name,
            String host,
            String role,
            int threads,
            String localizers,
            OffsetDateTime started,
            OffsetDateTime now) {
        int n = jdbc.sql("UPDATE work_process SET last_seen = ?, stopped_at = NULL WHERE name = ?")
                .params(now, name)
                .update();
        if (n == 0) {
            try {
                jdbc.sql("INSERT INTO work_process (name, host, role, threads, localizers, started_at, last_seen,"
                                + " units_done, trials_done) VALUES (?, ?, ?, ?, ?, ?, ?, 0, 0)")
                        .params(name, host, role, threads, localizers, started, now)
                        .update();
            } catch (DuplicateKeyException raced) {
                // another beat of the same process inserted it first
            }
        }
    }

    public void countDone(String name, int units, int trials) {
        jdbc.sql("UPDATE work_process SET units_done = units_done + ?, trials_done = trials_done + ? WHERE name = ?")
                .params(units, trials, name)
                .update();
    }

    public void processStopped(String name, OffsetDateTime now) {
        jdbc.sql("UPDATE work_process SET stopped_at = ? WHERE name = ?")
                .params(now, name)
                .update();
    }

    private static UnitRow unitRow(ResultSet rs, int n) throws SQLException {
        return new UnitRow(
                rs.getLong("run_id"),
                rs.getInt("unit_no"),
                rs.getInt("first_index"),
                rs.getInt("seed_count"),
                rs.getString("state"),
                Optional.ofNullable(rs.getString("worker")),
                rs.getInt("attempts"),
                rs.getDouble("progress"));
    }
}
