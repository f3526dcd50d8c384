package dev.driftlab.sim;

/**
 * Whether one scheduled fault fired during a run, and if not, why not.
 *
 * @param id the fault's id
 * @param fired whether its trigger was met
 * @param time seconds from the start when it fired, NaN when it did not
 * @param reason plain words: empty when it fired, otherwise why it did not ("the trial ended first,
 *     at 37.2 s", "the robot never entered carpet-west", "scheduled after the route's end")
 */
public record FaultFiring(String id, boolean fired, double time, String reason) {
    /** Checks presence. */
    public FaultFiring {
        if (id == null || reason == null) {
            throw new IllegalArgumentException("id and reason must be given");
        }
    }
}
