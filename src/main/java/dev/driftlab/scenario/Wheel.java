package dev.driftlab.scenario;

/** Which drive wheel a fault acts on. */
public enum Wheel {
    LEFT,
    RIGHT,
    BOTH
}
