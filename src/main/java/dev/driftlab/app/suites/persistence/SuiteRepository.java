package dev.driftlab.app.suites.persistence;

import dev.driftlab.app.sharing.persistence.LinkTable;
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
 * Rows of {@code suite}, {@code suite_revision}, {@code suite_link}, {@code suite_run}, {@code
 * suite_cell} and {@code sample_suite_seed}. Revisions are never updated; a suite run's result is
 * written once, by a conditional update on its state.
 */
@Repository
public class SuiteRepository {

    /** A suite's head row. */
    public record SuiteRow(long id, String name, String description, int latestRevision, OffsetDateTime updatedAt) {}

    /** One revision of a suite. */
    public record RevisionRow(
            long id,
            long suiteId,
            int number,
            String author,
            String message,
            OffsetDateTime createdAt,
            String document) {}

    /**
     * One suite run without its result document.
     *
     * @param id key
     * @param suiteId the suite
     * @param revisionId the suite revision run
     * @param revisionNumber its number
     * @param viewToken the run's own permalink token
     * @param plan the entries and profiles as resolved at submission (JSON)
     * @param state running or finished
     * @param queuedAt when submitted
     * @param finishedAt when the result was assembled
     * @param baselineId the earlier suite run compared with, if any
     * @param verdict the verdict, once finished
     * @param passing gates that held, once finished
     * @param gates gates planned, once finished
     */
    public record SuiteRunRow(
            long id,
            long suiteId,
            long revisionId,
            int revisionNumber,
            String viewToken,
            String plan,
            String state,
            OffsetDateTime queuedAt,
            Optional<OffsetDateTime> finishedAt,
            Optional<Long> baselineId,
            Optional<Verdict> verdict,
            int passing,
            int gates,
            Optional<String> localizer) {

        /** Whether the result is stored. */
        public boolean finished() {
            return state.equals("finished");
        }

        /** The verdict, or null; for templates. */
        public Verdict verdictOrNull() {
            return verdict.orElse(null);
        }
    }

    /** One cell of a suite run: its run, or the problems of an invalid cell (JSON). */
    public record CellRow(int row, int column, Optional<Long> runId, Optional<String> problems) {}

    /** A suite for the listing, with its last finished run. */
    public record Listed(SuiteRow suite, Optional<SuiteRunRow> last) {}

    private static final String RUN_SELECT = "SELECT sr.id, sr.suite_id, sr.revision_id, rev.revision_no,"
            + " sr.view_token, sr.plan, sr.state, sr.queued_at, sr.finished_at, sr.baseline_id, sr.verdict,"
            + " sr.passing, sr.gates, sr.localizer FROM suite_run sr JOIN suite_revision rev ON rev.id = sr.revision_id";

    private final JdbcClient jdbc;
    private final LinkTable links;

    public SuiteRepository(JdbcClient jdbc) {
        this.jdbc = jdbc;
        this.links = new LinkTable(jdbc, "suite_link", "suite_id");
    }

    public long insertSuite(String name, String description, OffsetDateTime now) {
        KeyHolder keys = new GeneratedKeyHolder();
        jdbc.sql("INSERT INTO suite (name, description, latest_revision, created_at, updated_at)"
                        + " VALUES (?, ?, 1, ?, ?)")
                .params(name, description, now, now)
                .update(keys, "id");
        return keyOf(keys);
    }

    public void insertRevision(
            long suiteId, int number, String author, String message, OffsetDateTime now, String document) {
        jdbc.sql("INSERT INTO suite_revision (suite_id, revision_no, author, message, created_at, document)"
                        + " VALUES (?, ?, ?, ?, ?, ?)")
                .params(suiteId, number, author, message, now, document)
                .update();
    }

    /** Moves the head from {@code base} to {@code base + 1}; false when {@code base} is no longer the latest. */
    public boolean advanceHead(long suiteId, int base, String name, String description, OffsetDateTime now) {
        return jdbc.sql("UPDATE suite SET latest_revision = ?, name = ?, description = ?, updated_at = ?"
                                + " WHERE id = ? AND latest_revision = ?")
                        .params(base + 1, name, description, now, suiteId, base)
                        .update()
                == 1;
    }

    public Optional<SuiteRow> find(long id) {
        return jdbc.sql("SELECT id, name, description, latest_revision, updated_at FROM suite WHERE id = ?")
                .param(id)
                .query(SuiteRepository::suite)
                .optional();
    }

    public Optional<RevisionRow> revision(long suiteId, int number) {
        return jdbc.sql("SELECT id, suite_id, revision_no, author, message, created_at, document FROM suite_revision"
                        + " WHERE suite_id = ? AND revision_no = ?")
                .params(suiteId, number)
                .query(SuiteRepository::revision)
                .optional();
    }

    public Optional<RevisionRow> revisionById(long id) {
        return jdbc.sql("SELECT id, suite_id, revision_no, author, message, created_at, document FROM suite_revision"
                        + " WHERE id = ?")
                .param(id)
                .query(SuiteRepository::revision)
                .optional();
    }

    public List<RevisionRow> revisions(long suiteId) {
        return jdbc.sql("SELECT id, suite_id, revision_no, author, message, created_at, document FROM suite_revision"
                        + " WHERE suite_id = ? ORDER BY revision_no DESC")
                .param(suiteId)
                .query(SuiteRepository::revision)
                .list();
    }

    /** Suites newest change first, each with its last finished run. */
    public List<SuiteRow> recent(int limit) {
        return jdbc.sql("SELECT id, name, description, latest_revision, updated_at FROM suite"
                        + " ORDER BY updated_at DESC, id DESC FETCH FIRST " + limit + " ROWS ONLY")
                .query(SuiteRepository::suite)
                .list();
    }

    /** The suite link table ({@code suite_link}), with the link queries every owner shares. */
    public LinkTable links() {
        return links;
    }

    /**
     * Stores a suite run.
     *
     * @param localizer the outside localizer every cell judges, or null for the built-in one
     */
    public long insertRun(
            long suiteId, long revisionId, String viewToken, String plan, String localizer, OffsetDateTime now) {
        KeyHolder keys = new GeneratedKeyHolder();
        jdbc.sql("INSERT INTO suite_run (suite_id, revision_id, view_token, plan, state, queued_at, localizer)"
                        + " VALUES (?, ?, ?, ?, 'running', ?, ?)")
                .params(suiteId, revisionId, viewToken, plan, now, localizer)
                .update(keys, "id");
        return keyOf(keys);
    }

    public void insertCell(long suiteRunId, int row, int column, Long runId, String problems) {
        jdbc.sql("INSERT INTO suite_cell (suite_run_id, row_no, column_no, run_id, problems) VALUES (?, ?, ?, ?, ?)")
                .params(suiteRunId, row, column, runId, problems)
                .update();
    }

    public List<CellRow> cells(long suiteRunId) {
        return jdbc.sql("SELECT row_no, column_no, run_id, problems FROM suite_cell WHERE suite_run_id = ?"
                        + " ORDER BY row_no, column_no")
                .param(suiteRunId)
                .query((rs, n) -> new CellRow(
                        rs.getInt(1),
                        rs.getInt(2),
                        Optional.ofNullable(rs.getObject(3, Long.class)),
                        Optional.ofNullable(rs.getString(4))))
                .list();
    }

    public Optional<SuiteRunRow> run(long id) {
        return jdbc.sql(RUN_SELECT + " WHERE sr.id = ?")
                .param(id)
                .query(SuiteRepository::run)
                .optional();
    }

    public Optional<SuiteRunRow> runByToken(String token) {
        return jdbc.sql(RUN_SELECT + " WHERE sr.view_token = ?")
                .param(token)
                .query(SuiteRepository::run)
                .optional();
    }

    public List<SuiteRunRow> runs(long suiteId, int limit) {
        return jdbc.sql(RUN_SELECT + " WHERE sr.suite_id = ? ORDER BY sr.id DESC FETCH FIRST " + limit + " ROWS ONLY")
                .param(suiteId)
                .query(SuiteRepository::run)
                .list();
    }

    /**
     * The latest finished run of the suite before the given one that judged the same localizer
     * (null: the built-in one): a run's automatic baseline.
     */
    public Optional<SuiteRunRow> previousFinished(long suiteId, long beforeId, String localizer) {
        return jdbc.sql(RUN_SELECT + " WHERE sr.suite_id = ? AND sr.id < ? AND sr.state = 'finished'"
                        + " AND COALESCE(sr.localizer, '') = ?"
                        + " ORDER BY sr.id DESC FETCH FIRST 1 ROWS ONLY")
                .params(suiteId, beforeId, localizer == null ? "" : localizer)
                .query(SuiteRepository::run)
                .optional();
    }

    /** Suite runs still running, oldest first, at most {@code limit}. */
    public List<SuiteRunRow> running(int limit) {
        return jdbc.sql(RUN_SELECT + " WHERE sr.state = 'running' ORDER BY sr.id FETCH FIRST " + limit + " ROWS ONLY")
                .query(SuiteRepository::run)
                .list();
    }

    /** Running suite runs of one suite. */
    public List<SuiteRunRow> running(long suiteId) {
        return jdbc.sql(RUN_SELECT + " WHERE sr.suite_id = ? AND sr.state = 'running' ORDER BY sr.id")
                .param(suiteId)
                .query(SuiteRepository::run)
                .list();
    }

    public Optional<String> result(long id) {
        return jdbc.sql("SELECT result FROM suite_run WHERE id = ? AND result IS NOT NULL")
                .param(id)
                .query(String.class)
                .optional();
    }

    /** Stores the result once; false when another process stored it first. */
    public boolean finish(
            long id, OffsetDateTime now, Long baselineId, Verdict verdict, int passing, int gates, String result) {
        return jdbc.sql("UPDATE suite_run SET state = 'finished', finished_at = ?, baseline_id = ?, verdict = ?,"
                                + " passing = ?, gates = ?, result = ? WHERE id = ? AND state = 'running'")
                        .params(now, baselineId, verdict.fileName(), passing, gates, result, id)
                        .update()
                == 1;
    }

    public boolean sampleSeeded(String file) {
        return jdbc.sql("SELECT COUNT(*) FROM sample_suite_seed WHERE file = ?")
                        .param(file)
                        .query(Long.class)
                        .single()
                > 0;
    }

    public void markSampleSeeded(String file, long suiteId, OffsetDateTime now) {
        jdbc.sql("INSERT INTO sample_suite_seed (file, suite_id, seeded_at) VALUES (?, ?, ?)")
                .params(file, suiteId, now)
                .update();
    }

    private static SuiteRow suite(ResultSet rs, int n) throws SQLException {
        return new SuiteRow(
                rs.getLong("id"),
                rs.getString("name"),
                rs.getString("description"),
                rs.getInt("latest_revision"),
                rs.getObject("updated_at", OffsetDateTime.class));
    }

    private static RevisionRow revision(ResultSet rs, int n) throws SQLException {
        return new RevisionRow(
                rs.getLong("id"),
                rs.getLong("suite_id"),
                rs.getInt("revision_no"),
                rs.getString("author"),
                rs.getString("message"),
                rs.getObject("created_at", OffsetDateTime.class),
                rs.getString("document"));
    }

    private static SuiteRunRow run(ResultSet rs, int n) throws SQLException {
        return new SuiteRunRow(
                rs.getLong("id"),
                rs.getLong("suite_id"),
                rs.getLong("revision_id"),
                rs.getInt("revision_no"),
                rs.getString("view_token"),
                rs.getString("plan"),
                rs.getString("state"),
                rs.getObject("queued_at", OffsetDateTime.class),
                Optional.ofNullable(rs.getObject("finished_at", OffsetDateTime.class)),
                Optional.ofNullable(rs.getObject("baseline_id", Long.class)),
                Optional.ofNullable(rs.getString("verdict")).flatMap(Verdict::byFileName),
                rs.getInt("passing"),
                rs.getInt("gates"),
                Optional.ofNullable(rs.getString("localizer")));
    }

    private static long keyOf(KeyHolder keys) {
        Object id = keys.getKeys() == null ? null : keys.getKeys().get("id");
        if (id == null && keys.getKeys() != null) {
            id = keys.getKeys().get("ID");
        }
        if (id instanceof Number num) {
            return num.longValue();
        }
        throw new IllegalStateException("the database returned no generated key");
    }
}
