package dev.driftlab.app.suites;

import dev.driftlab.app.sharing.Access;
import dev.driftlab.app.sharing.ReadOnlyLink;

/**
 * What one presented suite token opens.
 *
 * @param suiteId the suite
 * @param access view (open, run, read reports) or edit (also change the list, profiles and links)
 * @param token the token presented
 */
public record SuiteGrant(long suiteId, Access access, String token) {

    /** Whether the holder may change the suite. */
    public boolean canEdit() {
        return access.canEdit();
    }

    /** This grant, or {@link ReadOnlyLink} for a view link. */
    public SuiteGrant requireEdit() {
        access.requireEdit(ReadOnlyLink.SUITE);
        return this;
    }
}
