package dev.driftlab.site;

import dev.driftlab.geometry.Polygon;
import dev.driftlab.geometry.RayCaster;
import dev.driftlab.geometry.SegmentCaster;
import dev.driftlab.geometry.SegmentSet;
import java.util.ArrayList;
import java.util.List;

/**
 * What is really there at the current time: walls and fixtures (fixed), doors in their current
 * state and clutter that currently stands. Mutable and not thread-safe: one per simulated run.
 *
 * <p>The fixed part is indexed once. Doors and clutter form a small second index that is rebuilt
 * only when one of them changes, so that changes stay cheap on large sites.
 */
public final class ActualWorld implements RayCaster {

    private final CompiledSite site;
    private final SegmentCaster fixed;
    private final boolean[] doorClosed;
    private final boolean[] clutterPresent;
    private double time;
    private SegmentCaster changing;
    private boolean dirty = true;

    ActualWorld(CompiledSite site) {
        this.site = site;
        SegmentSet.Builder b = SegmentSet.builder().addAll(site.walls());
        for (Polygon f : site.fixtures()) {
            b.addOutline(f);
        }
        this.fixed = SegmentCaster.of(b.build());
        this.doorClosed = new boolean[site.doors().size()];
        for (int k = 0; k < doorClosed.length; k++) {
            doorClosed[k] = site.doors().get(k).actualClosed();
        }
        this.clutterPresent = new boolean[site.clutter().size()];
        for (int k = 0; k < clutterPresent.length; k++) {
            clutterPresent[k] = site.clutter().get(k).scheduledAt(0);
        }
    }

    /** Current time in seconds. */
    public double time() {
        return time;
    }

    /**
     * Moves the clock forward and applies clutter schedule changes crossed on the way. A fault
     * that changed an item's presence stays in force until the item's schedule next changes.
     *
     * @param t new time in seconds, not before the current time
     * @return ids of clutter whose presence changed (empty in the common case)
     * @throws IllegalArgumentException if t lies before the current time
     */
    public List<String> advanceTo(double t) {
        if (!(t >= time)) {
            throw new IllegalArgumentException("time must not go back: " + t + " < " + time);
        }
        List<String> changed = List.of();
        for (int k = 0; k < clutterPresent.length; k++) {
            ClutterItem c = site.clutter().get(k);
            boolean before = c.scheduledAt(time);
            boolean now = c.scheduledAt(t);
            if (before != now && clutterPresent[k] != now) {
                clutterPresent[k] = now;
                dirty = true;
                if (changed.isEmpty()) {
                    changed = new ArrayList<>();
                }
                changed.add(c.id());
            }
        }
        time = t;
        return changed;
    }

    /**
     * Opens or closes a door.
     *
     * @return whether the state changed
     * @throws IllegalArgumentException if no door has that id
     */
    public boolean setDoorClosed(String doorId, boolean closed) {
        int k = doorIndex(doorId);
        if (doorClosed[k] == closed) {
            return false;
        }
        doorClosed[k] = closed;
        dirty = true;
        return true;
    }

    /** Whether the door is closed now. */
    public boolean isDoorClosed(String doorId) {
        return doorClosed[doorIndex(doorId)];
    }

    /**
     * Puts a clutter item in or out of the world.
     *
     * @return whether the presence changed
     * @throws IllegalArgumentException if no clutter has that id
     */
    public boolean setClutterPresent(String clutterId, boolean present) {
        int k = clutterIndex(clutterId);
        if (clutterPresent[k] == present) {
            return false;
        }
        clutterPresent[k] = present;
        dirty = true;
        return true;
    }

    /** Whether the clutter item stands in the world now. */
    public boolean isClutterPresent(String clutterId) {
        return clutterPresent[clutterIndex(clutterId)];
    }

    private int doorIndex(String id) {
        for (int k = 0; k < doorClosed.length; k++) {
            if (site.doors().get(k).id().equals(id)) {
                return k;
            }
        }
        throw new IllegalArgumentException("no door \"" + id + "\"");
    }

    private int clutterIndex(String id) {
        for (int k = 0; k < clutterPresent.length; k++) {
            if (site.clutter().get(k).id().equals(id)) {
                return k;
            }
        }
        throw new IllegalArgumentException("no clutter \"" + id + "\"");
    }

    /** Every blocking segment now: walls, fixture edges, closed doors, standing clutter. */
    public SegmentSet segments() {
        return fixed.segments().concat(changingSegments());
    }

    private SegmentSet changingSegments() {
        SegmentSet.Builder b = SegmentSet.builder();
        for (int k = 0; k < doorClosed.length; k++) {
            if (doorClosed[k]) {
                b.add(site.doors().get(k).span());
            }
        }
        for (int k = 0; k < clutterPresent.length; k++) {
            if (clutterPresent[k]) {
                b.addOutline(site.clutter().get(k).outline());
            }
        }
        return b.build();
    }

    private SegmentCaster changing() {
        if (dirty) {
            SegmentSet s = changingSegments();
            changing = s.size() == 0 ? null : SegmentCaster.of(s);
            dirty = false;
        }
        return changing;
    }

    /** {@inheritDoc} Sees walls, fixtures, closed doors and standing clutter. */
    @Override
    public double cast(double x, double y, double angle, double maxRange) {
        double r = fixed.cast(x, y, angle, maxRange);
        SegmentCaster c = changing();
        return c == null ? r : c.cast(x, y, angle, r);
    }

    /**
     * Distance in metres from a point to the nearest blocking segment, or {@code limit} when
     * nothing is nearer.
     */
    public double clearance(double x, double y, double limit) {
        double d = fixed.clearance(x, y, limit);
        SegmentCaster c = changing();
        return c == null ? d : c.clearance(x, y, d);
    }
}
