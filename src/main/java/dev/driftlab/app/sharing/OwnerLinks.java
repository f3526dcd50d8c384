package dev.driftlab.app.sharing;

import dev.driftlab.app.sharing.persistence.LinkTable;
import java.time.Clock;
import java.time.OffsetDateTime;
import java.util.Collection;
import java.util.EnumMap;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;

/**
 * The rules of view and edit links, the same for every kind of thing shared by link: scenarios
 * ({@link ShareLinks}) and suites (the suite store), each over its own {@link LinkTable}. A new
 * owner gets one link of each {@link Access}; a token opens something only when it is well formed
 * ({@link Tokens}), known and not revoked; reissuing a link revokes the old one of that kind first;
 * listings see view links only. Not a bean: the callers hold the transactions.
 */
public final class OwnerLinks {

    /**
     * What one presented token opens.
     *
     * @param ownerId the scenario or suite
     * @param access view or edit
     * @param token the token presented
     */
    public record Opened(long ownerId, Access access, String token) {}

    /**
     * A new owner's two links.
     *
     * @param view the view token
     * @param edit the edit token
     */
    public record Issued(String view, String edit) {}

    private final LinkTable table;
    private final Clock clock;

    public OwnerLinks(LinkTable table, Clock clock) {
        this.table = table;
        this.clock = clock;
    }

    /** Issues a view and an edit link for a new owner. */
    public Issued issueBoth(long ownerId) {
        OffsetDateTime now = OffsetDateTime.now(clock);
        String view = Tokens.next();
        String edit = Tokens.next();
        table.insert(view, ownerId, Access.VIEW.word(), now);
        table.insert(edit, ownerId, Access.EDIT.word(), now);
        return new Issued(view, edit);
    }

    /** What a token opens; empty for malformed, unknown and revoked tokens alike. */
    public Optional<Opened> resolve(String token) {
        if (!Tokens.wellFormed(token)) {
            return Optional.empty();
        }
        return table.findActive(token).flatMap(r -> Access.of(r.access()).map(a -> new Opened(r.ownerId(), a, token)));
    }

    /** What a token opens, or {@link LinkNotFound}. */
    public Opened require(String token) {
        return resolve(token).orElseThrow(LinkNotFound::new);
    }

    /** The active link of each kind the owner has (a revoked kind is absent). */
    public Map<Access, String> current(long ownerId) {
        Map<Access, String> out = new EnumMap<>(Access.class);
        for (LinkTable.LinkRow r : table.activeFor(ownerId)) {
            Access.of(r.access()).ifPresent(a -> out.put(a, r.token()));
        }
        return out;
    }

    /** Active view token per owner, for listings of every owner. */
    public Map<Long, String> viewTokens() {
        return byOwner(table.activeViewLinks());
    }

    /** Active view token of each of the given owners that has one. */
    public Map<Long, String> viewTokens(Collection<Long> ownerIds) {
        return byOwner(table.activeViewLinks(ownerIds));
    }

    /** When a link of this kind of the owner was last revoked (or reissued), if ever. */
    public Optional<OffsetDateTime> lastRevoked(long ownerId, Access access) {
        return table.lastRevoked(ownerId, access.word());
    }

    /** Revokes the current link of one kind (if any) and issues a new one; returns the new token. */
    public String reissue(long ownerId, Access access) {
        String token = Tokens.next();
        table.reissue(ownerId, access.word(), token, OffsetDateTime.now(clock));
        return token;
    }

    /** Revokes the current link of one kind; the old token then opens nothing. */
    public void revoke(long ownerId, Access access) {
        table.revoke(ownerId, access.word(), OffsetDateTime.now(clock));
    }

    private static Map<Long, String> byOwner(List<LinkTable.LinkRow> rows) {
        Map<Long, String> m = new HashMap<>();
        for (LinkTable.LinkRow r : rows) {
            m.put(r.ownerId(), r.token());
        }
        return m;
    }
}
