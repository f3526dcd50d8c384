package dev.driftlab.app.sharing;

/**
 * What one presented token opens.
 *
 * @param scenarioId the scenario
 * @param access view or edit
 * @param token the token presented, for building links back
 */
public record Grant(long scenarioId, Access access, String token) {

    /** Whether the holder may change the scenario and its links. */
    public boolean canEdit() {
        return access.canEdit();
    }

    /** This grant, or {@link ReadOnlyLink} when it only allows viewing. */
    public Grant requireEdit() {
        access.requireEdit(ReadOnlyLink.SCENARIO);
        return this;
    }
}
