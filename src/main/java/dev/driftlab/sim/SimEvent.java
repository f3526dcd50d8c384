package dev.driftlab.sim;

/**
 * Something that happened during a run, for the run log.
 *
 * @param time seconds from the run start
 * @param kind what happened
 * @param subject id of the fault, door, clutter or waypoint concerned; empty when none
 * @param detail plain-words description
 */
public record SimEvent(double time, EventKind kind, String subject, String detail) {
    /** Checks presence. */
    public SimEvent {
        if (kind == null || subject == null || detail == null) {
            throw new IllegalArgumentException("kind, subject and detail must be given (may be empty strings)");
        }
    }
}
