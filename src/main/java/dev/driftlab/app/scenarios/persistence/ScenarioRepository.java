package dev.driftlab.app.scenarios.persistence;

import java.sql.ResultSet;
import java.sql.SQLException;
import java.time.OffsetDateTime;
import java.util.List;
import java.util.Optional;
import org.springframework.jdbc.core.simple.JdbcClient;
import org.springframework.jdbc.support.GeneratedKeyHolder;
import org.springframework.jdbc.support.KeyHolder;
import org.springframework.stereotype.Repository;

/** Rows of {@code scenario}, {@code scenario_revision} and {@code sample_seed}. Revisions are never updated. */
@Repository
public class ScenarioRepository {

    /**
     * A scenario's head row.
     *
     * @param id key
     * @param name name of the latest revision
     * @param description description of the latest revision
     * @param latestRevision number of the latest revision, from 1
     * @param createdAt when created
     * @param updatedAt when the latest revision was saved
     */
    public record ScenarioRow(
            long id,
            String name,
            String description,
            int latestRevision,
            OffsetDateTime createdAt,
            OffsetDateTime updatedAt) {}

    /**
     * One saved revision without its document.
     *
     * @param id key
     * @param scenarioId scenario
     * @param number 1, 2, ... within the scenario
     * @param author free-text author name
     * @param message what the author said about the change
     * @param createdAt when saved
     */
    public record RevisionRow(
            long id, long scenarioId, int number, String author, String message, OffsetDateTime createdAt) {}

    private static final String REVISION_COLUMNS = "id, scenario_id, revision_no, author, message, created_at";

    private final JdbcClient jdbc;

    public ScenarioRepository(JdbcClient jdbc) {
        this.jdbc = jdbc;
    }

    public long insertScenario(String name, String description, OffsetDateTime now) {
        KeyHolder keys = new GeneratedKeyHolder();
        jdbc.sql("INSERT INTO scenario (name, description, latest_revision, created_at, updated_at)"
                        + " VALUES (?, ?, 1, ?, ?)")
                .params(name, description, now, now)
                .update(keys, "id");
        return keyOf(keys);
    }

    public long insertRevision(
            long scenarioId, int number, String author, String message, OffsetDateTime now, String document) {
        KeyHolder keys = new GeneratedKeyHolder();
        jdbc.sql("INSERT INTO scenario_revision (scenario_id, revision_no, author, message, created_at, document)"
                        + " VALUES (?, ?, ?, ?, ?, ?)")
                .params(scenarioId, number, author, message, now, document)
                .update(keys, "id");
        return keyOf(keys);
    }

    /**
     * Moves the head from {@code expected} to {@code expected + 1}; the compare-and-set that makes
     * concurrent saves on the same base revision produce exactly one winner.
     *
     * @return whether this caller won
     */
    public boolean advanceHead(long scenarioId, int expected, String name, String description, OffsetDateTime now) {
        return jdbc.sql("UPDATE scenario SET latest_revision = ?, name = ?, description = ?, updated_at = ?"
                                + " WHERE id = ? AND latest_revision = ?")
                        .params(expected + 1, name, description, now, scenarioId, expected)
                        .update()
                == 1;
    }

    public Optional<ScenarioRow> find(long id) {
        return jdbc.sql(
                        "SELECT id, name, description, latest_revision, created_at, updated_at FROM scenario WHERE id = ?")
                .param(id)
                .query(ScenarioRepository::scenario)
                .optional();
    }

    /** Scenarios whose name or description contains the text (case-insensitive), newest change first. */
    public List<ScenarioRow> search(String text, int limit) {
        return search(text, 0, limit);
    }

    /** One page of the search: skips {@code offset} matches, newest change first. */
    public List<ScenarioRow> search(String text, int offset, int limit) {
        String pattern = "%"
                + text.toLowerCase(java.util.Locale.ROOT)
                        .replace("!", "!!")
                        .replace("%", "!%")
                        .replace("_", "!_")
                + "%";
        return jdbc.sql("SELECT id, name, description, latest_revision, created_at, updated_at FROM scenario"
                        + " WHERE LOWER(name) LIKE ? ESCAPE '!' OR LOWER(description) LIKE ? ESCAPE '!'"
                        + " ORDER BY updated_at DESC, id DESC OFFSET " + Math.max(0, offset) + " ROWS FETCH FIRST "
                        + limit + " ROWS ONLY")
                .params(pattern, pattern)
                .query(ScenarioRepository::scenario)
                .list();
    }

    public List<RevisionRow> revisions(long scenarioId) {
        return jdbc.sql("SELECT " + REVISION_COLUMNS
                        + " FROM scenario_revision WHERE scenario_id = ? ORDER BY revision_no DESC")
                .param(scenarioId)
                .query(ScenarioRepository::revision)
                .list();
    }

    public Optional<RevisionRow> revision(long scenarioId, int number) {
        return jdbc.sql("SELECT " + REVISION_COLUMNS
                        + " FROM scenario_revision WHERE scenario_id = ? AND revision_no = ?")
                .params(scenarioId, number)
                .query(ScenarioRepository::revision)
                .optional();
    }

    public Optional<RevisionRow> revisionById(long id) {
        return jdbc.sql("SELECT " + REVISION_COLUMNS + " FROM scenario_revision WHERE id = ?")
                .param(id)
                .query(ScenarioRepository::revision)
                .optional();
    }

    /** The JSON text of a revision. */
    public Optional<String> document(long revisionId) {
        return jdbc.sql("SELECT document FROM scenario_revision WHERE id = ?")
                .param(revisionId)
                .query(String.class)
                .optional();
    }

    public boolean sampleSeeded(String file) {
        return jdbc.sql("SELECT COUNT(*) FROM sample_seed WHERE file = ?")
                        .param(file)
                        .query(Long.class)
                        .single()
                > 0;
    }

    public void markSampleSeeded(String file, long scenarioId, OffsetDateTime now) {
        jdbc.sql("INSERT INTO sample_seed (file, scenario_id, seeded_at) VALUES (?, ?, ?)")
                .params(file, scenarioId, now)
                .update();
    }

    /** The scenario each loaded sample became, by sample file name. */
    public java.util.Map<String, Long> sampleScenarios() {
        java.util.Map<String, Long> out = new java.util.TreeMap<>();
        jdbc.sql("SELECT file, scenario_id FROM sample_seed")
                .query((rs, n) -> out.put(rs.getString(1), rs.getLong(2)))
                .list();
        return out;
    }

    public long count() {
        return jdbc.sql("SELECT COUNT(*) FROM scenario").query(Long.class).single();
    }

    private static long keyOf(KeyHolder keys) {
        Object id = keys.getKeys() == null ? null : keys.getKeys().get("id");
        if (id == null) {
            id = keys.getKeys() == null ? null : keys.getKeys().get("ID");
        }
        if (id instanceof Number n) {
            return n.longValue();
        }
        throw new IllegalStateException("the database returned no generated key");
    }

    private static ScenarioRow scenario(ResultSet rs, int n) throws SQLException {
        return new ScenarioRow(
                rs.getLong("id"),
                rs.getString("name"),
                rs.getString("description"),
                rs.getInt("latest_revision"),
                rs.getObject("created_at", OffsetDateTime.class),
                rs.getObject("updated_at", OffsetDateTime.class));
    }

    private static RevisionRow revision(ResultSet rs, int n) throws SQLException {
        return new RevisionRow(
                rs.getLong("id"),
                rs.getLong("scenario_id"),
                rs.getInt("revision_no"),
                rs.getString("author"),
                rs.getString("message"),
                rs.getObject("created_at", OffsetDateTime.class));
    }
}
