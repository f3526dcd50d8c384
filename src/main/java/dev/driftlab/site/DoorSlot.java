package dev.driftlab.site;

import dev.driftlab.geometry.Segment;

/**
 * A door as compiled: the segment across its gap, which blocks the gap while the door is closed.
 *
 * @param id door id from the site plan
 * @param span segment across the gap, metres
 * @param mappedClosed whether the believed map shows the door closed
 * @param actualClosed whether the door is closed in the real world at the start of a run
 */
public record DoorSlot(String id, Segment span, boolean mappedClosed, boolean actualClosed) {
    /** Checks presence. */
    public DoorSlot {
        if (id == null || span == null) {
            throw new IllegalArgumentException("door id and span must be given");
        }
    }
}
