package dev.driftlab.app.sharing.persistence;

import java.time.OffsetDateTime;
import org.springframework.jdbc.core.simple.JdbcClient;
import org.springframework.jdbc.support.GeneratedKeyHolder;
import org.springframework.jdbc.support.KeyHolder;

/** Owners for link tests: a bare head row in {@code scenario} or {@code suite} (the same columns). */
public final class LinkOwners {

    private LinkOwners() {}

    /** Inserts a head row and returns its id. */
    public static long insert(JdbcClient jdbc, String ownerTable, OffsetDateTime at) {
        KeyHolder keys = new GeneratedKeyHolder();
        jdbc.sql("INSERT INTO " + ownerTable + " (name, description, latest_revision, created_at, updated_at)"
                        + " VALUES ('Owner', '', 1, ?, ?)")
                .params(at, at)
                .update(keys, "id");
        Object id = keys.getKeys().containsKey("id")
                ? keys.getKeys().get("id")
                : keys.getKeys().get("ID");
        return ((Number) id).longValue();
    }
}
