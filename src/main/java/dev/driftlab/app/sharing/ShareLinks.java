package dev.driftlab.app.sharing;

import dev.driftlab.app.sharing.persistence.ShareLinkRepository;
import java.time.Clock;
import java.time.OffsetDateTime;
import java.util.Map;
import java.util.Optional;
import org.springframework.stereotype.Service;
import org.springframework.transaction.annotation.Transactional;

/** Issues, resolves, revokes and reissues the view and edit links of scenarios. */
@Service
public class ShareLinks {

    /**
     * The active links of a scenario; either may be absent after a revoke.
     *
     * @param view view token
     * @param edit edit token
     */
    public record Links(Optional<String> view, Optional<String> edit) {}

    private final OwnerLinks links;

    public ShareLinks(ShareLinkRepository links, Optional<Clock> clock) {
        this.links = new OwnerLinks(links.links(), clock.orElse(Clock.systemUTC()));
    }

    /** Issues a view and an edit link for a new scenario. */
    @Transactional
    public Links issueBoth(long scenarioId) {
        OwnerLinks.Issued issued = links.issueBoth(scenarioId);
        return new Links(Optional.of(issued.view()), Optional.of(issued.edit()));
    }

    /** What a token opens; empty for malformed, unknown and revoked tokens alike. */
    @Transactional(readOnly = true)
    public Optional<Grant> resolve(String token) {
        return links.resolve(token).map(o -> new Grant(o.ownerId(), o.access(), o.token()));
    }

    /** What a token opens, or {@link LinkNotFound}. */
    public Grant require(String token) {
        return resolve(token).orElseThrow(LinkNotFound::new);
    }

    /** The grant of an edit token, {@link ReadOnlyLink} for a view token, {@link LinkNotFound} otherwise. */
    public Grant requireEdit(String token) {
        return require(token).requireEdit();
    }

    /** The active links of a scenario. */
    @Transactional(readOnly = true)
    public Links current(long scenarioId) {
        Map<Access, String> active = links.current(scenarioId);
        return new Links(Optional.ofNullable(active.get(Access.VIEW)), Optional.ofNullable(active.get(Access.EDIT)));
    }

    /**
     * Active view token per scenario id, for the listing: a listing shows view links only, since
     * anyone who can open the home page would otherwise be able to change every scenario.
     */
    @Transactional(readOnly = true)
    public Map<Long, String> viewTokens() {
        return links.viewTokens();
    }

    /**
     * Active view token of each of the given scenarios that has one, for pages that list a few
     * scenarios the way the home page does (the workers page): view links only, never edit links.
     */
    @Transactional(readOnly = true)
    public Map<Long, String> viewTokens(java.util.Collection<Long> scenarioIds) {
        return links.viewTokens(scenarioIds);
    }

    /**
     * Since when the run links of a scenario are closed: every run queued before its view link was
     * last revoked (or reissued, which revokes the old one). Whoever held the old view link could
     * have copied the run links it showed, so closing the view link closes those too; runs queued
     * afterwards get working links, and nothing reopens the closed ones.
     */
    @Transactional(readOnly = true)
    public Optional<OffsetDateTime> runLinksClosedBefore(long scenarioId) {
        return links.lastRevoked(scenarioId, Access.VIEW);
    }

    /** Revokes the current link of one kind (if any) and issues a new one; returns the new token. */
    @Transactional
    public String reissue(long scenarioId, Access access) {
        return links.reissue(scenarioId, access);
    }

    /** Revokes the current link of one kind; the old token then answers 404 everywhere. */
    @Transactional
    public void revoke(long scenarioId, Access access) {
        links.revoke(scenarioId, access);
    }
}
