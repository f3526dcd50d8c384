package dev.driftlab.scenario;

/** Whether a door leaves its opening free or blocks it. */
public enum DoorState {
    OPEN,
    CLOSED
}
