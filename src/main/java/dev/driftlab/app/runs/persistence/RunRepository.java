package dev.driftlab.app.runs.persistence;

import dev.driftlab.evaluation.Verdict;
import java.sql.ResultSet;
import java.sql.SQLException;
import java.time.OffsetDateTime;
import java.util.List;
import java.util.Optional;
import org.springframework.jdbc.core.simple.JdbcClient;
import org.springframework.jdbc.support.GeneratedKeyHolder;
import org.springframework.jdbc.support.KeyHolder;
import org.springframework.stereotype.Repository;

/**
 * Rows of {@code run} and {@code run_frame_chunk}. Every state change is a conditional update on
 * the state it leaves, so a cancel racing a worker can never be overwritten.
 */
@Repository
public class RunRepository {

    /**
     * One run without its result document.
     *
     * @param id key
     * @param scenarioId scenario
     * @param revisionId exact revision run
     * @param revisionNumber its number within the scenario
     * @param batchKey shared by the runs submitted together
     * @param viewToken token of the run's own view link
     * @param variant settings variant
     * @param seeds seeds as stored (see {@link RunColumns#seeds})
     * @param options options as stored (see {@link RunColumns#options})
     * @param state state word
     * @param progress done share 0..1
     * @param progressMessage last progress text
     * @param queuedAt when accepted
     * @param startedAt when a worker took it, if it did
     * @param finishedAt when it stopped, if it did
     * @param hasResult whether a result document is stored
     * @param failure plain reason for failed or interrupted runs, else empty
     * @param verdict the verdict of a run that finished with a result; empty for other runs, and for
     *     runs stored before verdicts were (until {@link #missingVerdicts} has filled them in)
     * @param profile the profile document of a suite cell, merged into the revision's document
     *     before its trials run; empty for every other run
     */
    public record RunRow(
            long id,
            long scenarioId,
            long revisionId,
            int revisionNumber,
            String batchKey,
            String viewToken,
            String variant,
            String seeds,
            String options,
            String state,
            double progress,
            String progressMessage,
            OffsetDateTime queuedAt,
            Optional<OffsetDateTime> startedAt,
            Optional<OffsetDateTime> finishedAt,
            boolean hasResult,
            String failure,
            Optional<Verdict> verdict,
            Optional<String> profile) {

        /** The variant as run: its name, plus the fixed particle count of a sweep run. */
        public String label() {
            int p = storedOptions().particles();
            String base =
                    p > 0 ? variant + " at " + String.format(java.util.Locale.ROOT, "%,d", p) + " particles" : variant;
            String localizer = storedOptions().localizer();
            String v = localizer == null ? base : base + ", localizer " + localizer;
            return profile.map(doc -> v + " under profile " + profileName(doc)).orElse(v);
        }

        private static String profileName(String doc) {
            try {
                return dev.driftlab.scenario.Profile.read(doc).name();
            } catch (dev.driftlab.scenario.ScenarioException unreadable) {
                return "(unreadable)";
            }
        }

        /** The seeds, in the order they run. */
        public List<Long> seedList() {
            return RunColumns.seeds(seeds);
        }

        /** The seeds for people: comma-separated. */
        public String seedText() {
            return seedList().stream().map(String::valueOf).collect(java.util.stream.Collectors.joining(","));
        }

        /** The options: frames kept, fixed particle count. */
        public RunColumns.Options storedOptions() {
            return RunColumns.options(options);
        }

        /** The verdict, or null when there is none; for templates. */
        public Verdict verdictOrNull() {
            return verdict.orElse(null);
        }
    }

    private static final String SELECT = "SELECT run.id, run.scenario_id, run.revision_id, rev.revision_no,"
            + " run.batch_key, run.view_token, run.variant, run.seeds, run.options, run.state, run.progress,"
            + " run.progress_message, run.queued_at, run.started_at, run.finished_at,"
            + " CASE WHEN run.result IS NULL THEN FALSE ELSE TRUE END AS has_result, run.failure, run.verdict,"
            + " run.profile FROM run JOIN scenario_revision rev ON rev.id = run.revision_id";

    private final JdbcClient jdbc;

    public RunRepository(JdbcClient jdbc) {
        this.jdbc = jdbc;
    }

    public long insert(
            long scenarioId,
            long revisionId,
            String batchKey,
            String viewToken,
            String variant,
            String seeds,
            String options,
            OffsetDateTime now) {
        return insert(scenarioId, revisionId, batchKey, viewToken, variant, seeds, options, null, now);
    }

    /** Inserts a queued run; {@code profile} is a suite cell's profile document, or null. */
    public long insert(
            long scenarioId,
            long revisionId,
            String batchKey,
            String viewToken,
            String variant,
            String seeds,
            String options,
            String profile,
            OffsetDateTime now) {
        KeyHolder keys = new GeneratedKeyHolder();
        jdbc.sql("INSERT INTO run (scenario_id, revision_id, batch_key, view_token, variant, seeds, options, profile,"
                        + " state, progress, progress_message, queued_at)"
                        + " VALUES (?, ?, ?, ?, ?, ?, ?, ?, 'queued', 0, '', ?)")
                .params(scenarioId, revisionId, batchKey, viewToken, variant, seeds, options, profile, now)
                .update(keys, "id");
        Object id = keys.getKeys() == null ? null : keys.getKeys().get("id");
        if (id == null && keys.getKeys() != null) {
            id = keys.getKeys().get("ID");
        }
        if (id instanceof Number n) {
            return n.longValue();
        }
        throw new IllegalStateException("the database returned no generated key");
    }

    /** queued -> running when a process starts its first unit; false when it was already running or ended. */
    public boolean markRunning(long id, OffsetDateTime now) {
        return jdbc.sql("UPDATE run SET state = 'running', started_at = ?, progress_message = 'started'"
                                + " WHERE id = ? AND state = 'queued'")
                        .params(now, id)
                        .update()
                == 1;
    }

    /**
     * Sets a running run's progress to the seed-weighted mean of its units' progress, with the
     * message of the unit that reported last.
     */
    public void progressFromUnits(long id, int seeds, String message) {
        // read, then write: one UPDATE with a sub-select over run_unit made H2 sessions of two
        // runs wait on each other's locks until their time-out
        double done = jdbc.sql("SELECT COALESCE(SUM(progress * seed_count), 0) FROM run_unit WHERE run_id = ?")
                .param(id)
                .query(Double.class)
                .single();
        jdbc.sql("UPDATE run SET progress = ?, progress_message = ? WHERE id = ? AND state = 'running'")
                .params(Math.min(1, done / Math.max(1, seeds)), message, id)
                .update();
    }

    /** Whether the run is queued or running; false for ended and unknown runs. */
    public boolean active(long id) {
        return jdbc.sql("SELECT COUNT(*) FROM run WHERE id = ? AND state IN ('queued', 'running')")
                        .param(id)
                        .query(Long.class)
                        .single()
                > 0;
    }

    /** Of the given runs, those no longer queued or running (cancelled, failed, done, gone). */
    public java.util.Set<Long> ended(java.util.Collection<Long> ids) {
        if (ids.isEmpty()) {
            return java.util.Set.of();
        }
        java.util.Set<Long> still = new java.util.HashSet<>(
                jdbc.sql("SELECT id FROM run WHERE state IN ('queued', 'running') AND id IN (:ids)")
                        .param("ids", ids)
                        .query(Long.class)
                        .list());
        java.util.Set<Long> out = new java.util.HashSet<>(ids);
        out.removeAll(still);
        return out;
    }

    /**
     * Locks a running run's row until the transaction ends, so that only one process assembles its
     * result; false when the run is no longer running.
     */
    public boolean lockRunning(long id) {
        return !jdbc.sql("SELECT id FROM run WHERE id = ? AND state = 'running' FOR UPDATE")
                .param(id)
                .query(Long.class)
                .list()
                .isEmpty();
    }

    public void progress(long id, double fraction, String message) {
        jdbc.sql("UPDATE run SET progress = ?, progress_message = ? WHERE id = ? AND state = 'running'")
                .params(fraction, message, id)
                .update();
    }

    /** running -> done, with the result and its verdict. */
    public boolean finishDone(long id, OffsetDateTime now, String result, Verdict verdict) {
        return jdbc.sql("UPDATE run SET state = 'done', finished_at = ?, result = ?, verdict = ?, failure = NULL,"
                                + " progress = 1 WHERE id = ? AND state = 'running'")
                        .params(now, result, verdict.fileName(), id)
                        .update()
                == 1;
    }

    /** running -> a final state without a result (failed, cancelled, interrupted), with the reason. */
    public boolean finish(long id, String state, OffsetDateTime now, String failure) {
        return jdbc.sql("UPDATE run SET state = ?, finished_at = ?, result = NULL, failure = ?"
                                + " WHERE id = ? AND state = 'running'")
                        .params(state, now, failure.isEmpty() ? null : failure, id)
                        .update()
                == 1;
    }

    /** Runs that have a result but no stored verdict: those stored before verdicts were. */
    public List<Long> missingVerdicts() {
        return jdbc.sql("SELECT id FROM run WHERE verdict IS NULL AND result IS NOT NULL ORDER BY id")
                .query(Long.class)
                .list();
    }

    /** Sets the verdict of a run that has none yet. */
    public void fillVerdict(long id, Verdict verdict) {
        jdbc.sql("UPDATE run SET verdict = ? WHERE id = ? AND verdict IS NULL")
                .params(verdict.fileName(), id)
                .update();
    }

    /** queued or running -> cancelled; false when the run had already ended. */
    public boolean cancelActive(long id, OffsetDateTime now) {
        return jdbc.sql("UPDATE run SET state = 'cancelled', finished_at = ?, result = NULL, failure = NULL"
                                + " WHERE id = ? AND state IN ('queued', 'running')")
                        .params(now, id)
                        .update()
                == 1;
    }

    /**
     * Marks queued or running runs that have no work units as interrupted: runs stored by a server
     * version that kept its queue in memory, which nothing would ever pick up. Runs with units are
     * resumed by the work engine instead.
     */
    public int interruptLeftovers(OffsetDateTime now, String reason) {
        return jdbc.sql("UPDATE run SET state = 'interrupted', finished_at = ?, failure = ?"
                        + " WHERE (state = 'queued' OR state = 'running')"
                        + " AND NOT EXISTS (SELECT 1 FROM run_unit u WHERE u.run_id = run.id)")
                .params(now, reason)
                .update();
    }

    /** Runs queued or running on the whole server. */
    public long countActiveAll() {
        return jdbc.sql("SELECT COUNT(*) FROM run WHERE state IN ('queued', 'running')")
                .query(Long.class)
                .single();
    }

    public Optional<RunRow> find(long id) {
        return jdbc.sql(SELECT + " WHERE run.id = ?")
                .param(id)
                .query(RunRepository::row)
                .optional();
    }

    public Optional<RunRow> findByViewToken(String token) {
        return jdbc.sql(SELECT + " WHERE run.view_token = ?")
                .param(token)
                .query(RunRepository::row)
                .optional();
    }

    public List<RunRow> forScenario(long scenarioId, int limit) {
        return jdbc.sql(SELECT + " WHERE run.scenario_id = ? ORDER BY run.id DESC FETCH FIRST " + limit + " ROWS ONLY")
                .param(scenarioId)
                .query(RunRepository::row)
                .list();
    }

    public List<RunRow> forBatch(String batchKey) {
        return jdbc.sql(SELECT + " WHERE run.batch_key = ? ORDER BY run.id")
                .param(batchKey)
                .query(RunRepository::row)
                .list();
    }

    /** Runs of a scenario that are queued or running now. */
    public long countActive(long scenarioId) {
        return jdbc.sql("SELECT COUNT(*) FROM run WHERE scenario_id = ? AND state IN ('queued', 'running')")
                .param(scenarioId)
                .query(Long.class)
                .single();
    }

    public long countAll() {
        return jdbc.sql("SELECT COUNT(*) FROM run").query(Long.class).single();
    }

    public Optional<String> result(long id) {
        return jdbc.sql("SELECT result FROM run WHERE id = ? AND result IS NOT NULL")
                .param(id)
                .query(String.class)
                .optional();
    }

    /**
     * Stores a frame chunk once. A unit that runs again records the same trial again (a trial is a
     * pure function of revision, variant and seed), so a chunk already stored is left as it is.
     */
    public void insertChunk(long runId, int chunk, byte[] data) {
        try {
            jdbc.sql("INSERT INTO run_frame_chunk (run_id, chunk, data) VALUES (?, ?, ?)")
                    .params(runId, chunk, data)
                    .update();
        } catch (org.springframework.dao.DuplicateKeyException alreadyStored) {
            // written by an earlier attempt of the same unit
        }
    }

    public List<Integer> chunkIndexes(long runId) {
        return jdbc.sql("SELECT chunk FROM run_frame_chunk WHERE run_id = ? ORDER BY chunk")
                .param(runId)
                .query(Integer.class)
                .list();
    }

    public Optional<byte[]> chunk(long runId, int chunk) {
        return jdbc.sql("SELECT data FROM run_frame_chunk WHERE run_id = ? AND chunk = ?")
                .params(runId, chunk)
                .query((rs, n) -> rs.getBytes(1))
                .optional();
    }

    private static RunRow row(ResultSet rs, int n) throws SQLException {
        return new RunRow(
                rs.getLong("id"),
                rs.getLong("scenario_id"),
                rs.getLong("revision_id"),
                rs.getInt("revision_no"),
                rs.getString("batch_key"),
                rs.getString("view_token"),
                rs.getString("variant"),
                rs.getString("seeds"),
                rs.getString("options"),
                rs.getString("state"),
                rs.getDouble("progress"),
                rs.getString("progress_message"),
                rs.getObject("queued_at", OffsetDateTime.class),
                Optional.ofNullable(rs.getObject("started_at", OffsetDateTime.class)),
                Optional.ofNullable(rs.getObject("finished_at", OffsetDateTime.class)),
                rs.getBoolean("has_result"),
                Optional.ofNullable(rs.getString("failure")).orElse(""),
                Optional.ofNullable(rs.getString("verdict")).flatMap(Verdict::byFileName),
                Optional.ofNullable(rs.getString("profile")));
    }
}
