package dev.driftlab.sim;

/**
 * Receives a run as it is simulated, in time order. For each step time the order is: events, then
 * the scan if one is due, then the step. Every method has an empty default.
 */
public interface SimListener {

    /** Called once per internal step. */
    default void onStep(SimStep step) {}

    /** Called for each rangefinder scan; the scan is immutable and may be kept. */
    default void onScan(RangeScan scan) {}

    /** Called for each logged event. */
    default void onEvent(SimEvent event) {}
}
