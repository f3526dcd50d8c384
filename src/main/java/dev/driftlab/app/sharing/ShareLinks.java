package dev.driftlab.app.sharing;

import dev.driftlab.app.sharing.persistence.ShareLinkRepository;
import java.time.Clock;
import java.time.OffsetDateTime;
import java.util.HashMap;
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

    private final ShareLinkRepository links;
    private final Clock clock;

    public ShareLinks(ShareLinkRepository links, Optional<Clock> clock) {
        this.links = links;
        this.clock = clock.orElse(Clock.systemUTC());
    }

    /** Issues a view and an edit link for a new scenario. */
    @Transactional
    public Links issueBoth(long scenarioId) {
        OffsetDateTime now = OffsetDateTime.now(clock);
        String view = Tokens.next();
        String edit = Tokens.next();
        links.insert(view, scenarioId, Access.VIEW.word(), now);
        links.insert(edit, scenarioId, Access.EDIT.word(), now);
        return new Links(Optional.of(view), Optional.of(edit));
    }

    /** What a token opens; empty for malformed, unknown and revoked tokens alike. */
    @Transactional(readOnly = true)
    public Optional<Grant> resolve(String token) {
        if (!Tokens.wellFormed(token)) {
            return Optional.empty();
        }
        return links.findActive(token)
                .flatMap(r -> Access.of(r.access()).map(a -> new Grant(r.scenarioId(), a, token)));
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
        Optional<String> view = Optional.empty();
        Optional<String> edit = Optional.empty();
        for (ShareLinkRepository.LinkRow r : links.activeFor(scenarioId)) {
            if (r.access().equals(Access.VIEW.word())) {
                view = Optional.of(r.token());
            } else if (r.access().equals(Access.EDIT.word())) {
                edit = Optional.of(r.token());
            }
        }
        return new Links(view, edit);
    }

    /**
     * Active view token per scenario id, for the listing: a listing shows view links only, since
     * anyone who can open the home page would otherwise be able to change every scenario.
     */
    @Transactional(readOnly = true)
    public Map<Long, String> viewTokens() {
        Map<Long, String> m = new HashMap<>();
        for (ShareLinkRepository.LinkRow r : links.activeViewLinks()) {
            m.put(r.scenarioId(), r.token());
        }
        return m;
    }

    /**
     * Active view token of each of the given scenarios that has one, for pages that list a few
     * scenarios the way the home page does (the workers page): view links only, never edit links.
     */
    @Transactional(readOnly = true)
    public Map<Long, String> viewTokens(java.util.Collection<Long> scenarioIds) {
        Map<Long, String> m = new HashMap<>();
        for (ShareLinkRepository.LinkRow r : links.activeViewLinks(scenarioIds)) {
            m.put(r.scenarioId(), r.token());
        }
        return m;
    }

    /**
     * Since when the run links of a scenario are closed: every run queued before its view link was
     * last revoked (or reissued, which revokes the old one). Whoever held the old view link could
     * have copied the run links it showed, so closing the view link closes those too; runs queued
     * afterwards get working links, and nothing reopens the closed ones.
     */
    @Transactional(readOnly = true)
    public Optional<OffsetDateTime> runLinksClosedBefore(long scenarioId) {
        return links.lastRevoked(scenarioId, Access.VIEW.word());
    }

    /** Revokes the current link of one kind (if any) and issues a new one; returns the new token. */
    @Transactional
    public String reissue(long scenarioId, Access access) {
        OffsetDateTime now = OffsetDateTime.now(clock);
        links.revoke(scenarioId, access.word(), now);
        String token = Tokens.next();
        links.insert(token, scenarioId, access.word(), now);
        return token;
    }

    /** Revokes the current link of one kind; the old token then answers 404 everywhere. */
    @Transactional
    public void revoke(long scenarioId, Access access) {
        links.revoke(scenarioId, access.word(), OffsetDateTime.now(clock));
    }
}
