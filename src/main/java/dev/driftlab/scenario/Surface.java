package dev.driftlab.scenario;

/** Kind of floor surface in a floor zone. The slip and noise figures are set per zone. */
public enum Surface {
    TILE,
    CARPET,
    RUG,
    THRESHOLD_STRIP,
    RUBBER_MAT,
    WET_FLOOR
}
