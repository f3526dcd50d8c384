package dev.driftlab.sim;

/** What happened in a {@link SimEvent}. */
public enum EventKind {
    /** A fault with a duration began; subject is the fault id. */
    FAULT_STARTED,
    /** A fault with a duration ended; subject is the fault id. */
    FAULT_ENDED,
    /** The robot was carried to another pose; subject is the fault id. */
    KIDNAPPED,
    /** The robot was shoved; subject is the fault id. */
    BUMPED,
    /** A door opened or closed; subject is the door id. */
    DOOR_CHANGED,
    /** A clutter item appeared or vanished; subject is the clutter id. */
    CLUTTER_CHANGED,
    /** The robot's footprint reached an obstacle of the actual world and it stopped. */
    COLLISION,
    /** The robot arrived at a waypoint; subject is its index from 0. */
    WAYPOINT_REACHED,
    /** The run ended normally after the settle time. */
    ROUTE_FINISHED,
    /** The run ended after a collision and the settle time. */
    ROUTE_ABANDONED,
    /** The run hit its step bound before the route was done. */
    STEP_LIMIT_REACHED
}
