package dev.driftlab.app.sharing.persistence;

import org.springframework.jdbc.core.simple.JdbcClient;
import org.springframework.stereotype.Repository;

/**
 * Rows of {@code share_link}, the links of scenarios: one token per link, revoked links kept with
 * their revoke time. The queries are the shared ones of {@link LinkTable}.
 */
@Repository
public class ShareLinkRepository {

    private final LinkTable links;

    public ShareLinkRepository(JdbcClient jdbc) {
        this.links = new LinkTable(jdbc, "share_link", "scenario_id");
    }

    /** The scenario link table. */
    public LinkTable links() {
        return links;
    }
}
