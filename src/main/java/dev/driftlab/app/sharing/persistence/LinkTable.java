package dev.driftlab.app.sharing.persistence;

import java.sql.ResultSet;
import java.sql.SQLException;
import java.time.OffsetDateTime;
import java.util.Collection;
import java.util.List;
import java.util.Optional;
import java.util.regex.Pattern;
import org.springframework.jdbc.core.simple.JdbcClient;

/**
 * The queries of one table of view and edit links, written once for every kind of owner: {@code
 * share_link} (scenarios) and {@code suite_link} (suites). Each such table has the columns {@code
 * token, <owner>, access, created_at, revoked_at}; a revoked link keeps its row with its revoke
 * time. Each owner keeps its own table so that its links go with it ({@code ON DELETE CASCADE}).
 */
public final class LinkTable {

    /**
     * One link row.
     *
     * @param token the URL-safe token
     * @param ownerId the scenario or suite it opens
     * @param access {@code view} or {@code edit}
     * @param createdAt when issued
     * @param revoked whether it no longer opens anything
     */
    public record LinkRow(String token, long ownerId, String access, OffsetDateTime createdAt, boolean revoked) {}

    /** Table and column names go into SQL text, so only plain lower-case names are taken. */
    private static final Pattern NAME = Pattern.compile("[a-z][a-z_]{0,62}");

    private final JdbcClient jdbc;
    private final String table;
    private final String owner;
    private final String select;

    /**
     * @param table the link table, such as {@code share_link}
     * @param ownerColumn its column naming the owner, such as {@code scenario_id}
     */
    public LinkTable(JdbcClient jdbc, String table, String ownerColumn) {
        if (!NAME.matcher(table).matches()) {
            throw new IllegalArgumentException("table: \"" + table + "\" is not a plain lower-case table name");
        }
        if (!NAME.matcher(ownerColumn).matches()) {
            throw new IllegalArgumentException(
                    "ownerColumn: \"" + ownerColumn + "\" is not a plain lower-case column name");
        }
        this.jdbc = jdbc;
        this.table = table;
        this.owner = ownerColumn;
        this.select = "SELECT token, " + owner + ", access, created_at, revoked_at FROM " + table;
    }

    /** Stores one new, active link. */
    public void insert(String token, long ownerId, String access, OffsetDateTime now) {
        jdbc.sql("INSERT INTO " + table + " (token, " + owner + ", access, created_at) VALUES (?, ?, ?, ?)")
                .params(token, ownerId, access, now)
                .update();
    }

    /** The link when it exists and is not revoked. */
    public Optional<LinkRow> findActive(String token) {
        return jdbc.sql(select + " WHERE token = ? AND revoked_at IS NULL")
                .param(token)
                .query(this::row)
                .optional();
    }

    /** Active links of one owner, oldest first. */
    public List<LinkRow> activeFor(long ownerId) {
        return jdbc.sql(select + " WHERE " + owner + " = ? AND revoked_at IS NULL ORDER BY created_at")
                .param(ownerId)
                .query(this::row)
                .list();
    }

    /** Active view links of every owner (never an edit link: listings show view links only). */
    public List<LinkRow> activeViewLinks() {
        return jdbc.sql(select + " WHERE access = 'view' AND revoked_at IS NULL")
                .query(this::row)
                .list();
    }

    /** Active view links of the given owners only (an empty list asks for none). */
    public List<LinkRow> activeViewLinks(Collection<Long> ownerIds) {
        if (ownerIds.isEmpty()) {
            return List.of();
        }
        return jdbc.sql(select + " WHERE access = 'view' AND revoked_at IS NULL AND " + owner + " IN (:ids)")
                .param("ids", List.copyOf(ownerIds))
                .query(this::row)
                .list();
    }

    /** When a link of this kind of the owner was last revoked, if ever. */
    public Optional<OffsetDateTime> lastRevoked(long ownerId, String access) {
        // no row rather than a row holding null when nothing was revoked
        return jdbc.sql("SELECT revoked_at FROM " + table + " WHERE " + owner + " = ? AND access = ?"
                        + " AND revoked_at IS NOT NULL ORDER BY revoked_at DESC FETCH FIRST 1 ROWS ONLY")
                .params(ownerId, access)
                .query((rs, n) -> rs.getObject(1, OffsetDateTime.class))
                .optional();
    }

    /** Revokes the active links of one kind; returns how many were revoked. */
    public int revoke(long ownerId, String access, OffsetDateTime now) {
        return jdbc.sql("UPDATE " + table + " SET revoked_at = ? WHERE " + owner
                        + " = ? AND access = ? AND revoked_at IS NULL")
                .params(now, ownerId, access)
                .update();
    }

    /** Revokes the active links of one kind and stores {@code token} in their place. */
    public void reissue(long ownerId, String access, String token, OffsetDateTime now) {
        revoke(ownerId, access, now);
        insert(token, ownerId, access, now);
    }

    private LinkRow row(ResultSet rs, int n) throws SQLException {
        return new LinkRow(
                rs.getString("token"),
                rs.getLong(owner),
                rs.getString("access"),
                rs.getObject("created_at", OffsetDateTime.class),
                rs.getObject("revoked_at", OffsetDateTime.class) != null);
    }
}
