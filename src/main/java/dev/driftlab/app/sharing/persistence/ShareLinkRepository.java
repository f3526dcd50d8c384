package dev.driftlab.app.sharing.persistence;

import java.time.OffsetDateTime;
import java.util.List;
import java.util.Optional;
import org.springframework.jdbc.core.simple.JdbcClient;
import org.springframework.stereotype.Repository;

/** Rows of {@code share_link}: one token per link, revoked links kept with their revoke time. */
@Repository
public class ShareLinkRepository {

    /**
     * One link row.
     *
     * @param token the URL-safe token
     * @param scenarioId scenario it opens
     * @param access {@code view} or {@code edit}
     * @param createdAt when issued
     * @param revoked whether it no longer opens anything
     */
    public record LinkRow(String token, long scenarioId, String access, OffsetDateTime createdAt, boolean revoked) {}

    private final JdbcClient jdbc;

    public ShareLinkRepository(JdbcClient jdbc) {
        this.jdbc = jdbc;
    }

    public void insert(String token, long scenarioId, String access, OffsetDateTime now) {
        jdbc.sql("INSERT INTO share_link (token, scenario_id, access, created_at) VALUES (?, ?, ?, ?)")
                .params(token, scenarioId, access, now)
                .update();
    }

    /** The link when it exists and is not revoked. */
    public Optional<LinkRow> findActive(String token) {
        return jdbc.sql("SELECT token, scenario_id, access, created_at, revoked_at FROM share_link"
                        + " WHERE token = ? AND revoked_at IS NULL")
                .param(token)
                .query(ShareLinkRepository::row)
                .optional();
    }

    /** Active links of a scenario. */
    public List<LinkRow> activeFor(long scenarioId) {
        return jdbc.sql("SELECT token, scenario_id, access, created_at, revoked_at FROM share_link"
                        + " WHERE scenario_id = ? AND revoked_at IS NULL ORDER BY created_at")
                .param(scenarioId)
                .query(ShareLinkRepository::row)
                .list();
    }

    /** Active view tokens of many scenarios at once, for the listing (which never shows an edit token). */
    public List<LinkRow> activeViewLinks() {
        return jdbc.sql("SELECT token, scenario_id, access, created_at, revoked_at FROM share_link"
                        + " WHERE access = 'view' AND revoked_at IS NULL")
                .query(ShareLinkRepository::row)
                .list();
    }

    /** Active view links of the given scenarios only (an empty list asks for none). */
    public List<LinkRow> activeViewLinks(java.util.Collection<Long> scenarioIds) {
        if (scenarioIds.isEmpty()) {
            return List.of();
        }
        return jdbc.sql("SELECT token, scenario_id, access, created_at, revoked_at FROM share_link"
                        + " WHERE access = 'view' AND revoked_at IS NULL AND scenario_id IN (:ids)")
                .param("ids", List.copyOf(scenarioIds))
                .query(ShareLinkRepository::row)
                .list();
    }

    /** When a link of this kind of the scenario was last revoked, if ever. */
    public Optional<OffsetDateTime> lastRevoked(long scenarioId, String access) {
        // no row rather than a row holding null when nothing was revoked
        return jdbc.sql("SELECT revoked_at FROM share_link WHERE scenario_id = ? AND access = ?"
                        + " AND revoked_at IS NOT NULL ORDER BY revoked_at DESC FETCH FIRST 1 ROWS ONLY")
                .params(scenarioId, access)
                .query((rs, n) -> rs.getObject(1, OffsetDateTime.class))
                .optional();
    }

    /** Revokes the active links of one kind; returns how many were revoked. */
    public int revoke(long scenarioId, String access, OffsetDateTime now) {
        return jdbc.sql(
                        "UPDATE share_link SET revoked_at = ? WHERE scenario_id = ? AND access = ? AND revoked_at IS NULL")
                .params(now, scenarioId, access)
                .update();
    }

    private static LinkRow row(java.sql.ResultSet rs, int n) throws java.sql.SQLException {
        return new LinkRow(
                rs.getString("token"),
                rs.getLong("scenario_id"),
                rs.getString("access"),
                rs.getObject("created_at", OffsetDateTime.class),
                rs.getObject("revoked_at", OffsetDateTime.class) != null);
    }
}
