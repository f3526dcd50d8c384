package dev.driftlab.site;

import dev.driftlab.geometry.Polygon;
import dev.driftlab.geometry.SegmentSet;
import java.util.List;

/**
 * A site plan compiled into geometry, in metres: room walls with all door gaps open, the doors
 * that may close those gaps, the fixtures and the clutter. Immutable; build the two worlds from
 * it with {@link #believedMap()} and {@link #actualWorld()}.
 */
public final class CompiledSite {

    private final SegmentSet walls;
    private final List<DoorSlot> doors;
    private final List<Polygon> fixtures;
    private final List<ClutterItem> clutter;

    CompiledSite(SegmentSet walls, List<DoorSlot> doors, List<Polygon> fixtures, List<ClutterItem> clutter) {
        this.walls = walls;
        this.doors = List.copyOf(doors);
        this.fixtures = List.copyOf(fixtures);
        this.clutter = List.copyOf(clutter);
    }

    /** Room walls with every door gap left open. */
    public SegmentSet walls() {
        return walls;
    }

    /** Doors in site-plan order. */
    public List<DoorSlot> doors() {
        return doors;
    }

    /** Fixture outlines in site-plan order. */
    public List<Polygon> fixtures() {
        return fixtures;
    }

    /** Clutter in site-plan order. */
    public List<ClutterItem> clutter() {
        return clutter;
    }

    /**
     * The map the localizer is given: walls, doors closed where the map shows them closed,
     * fixtures; no clutter.
     */
    public BelievedMap believedMap() {
        SegmentSet.Builder b = SegmentSet.builder().addAll(walls);
        for (DoorSlot d : doors) {
            if (d.mappedClosed()) {
                b.add(d.span());
            }
        }
        for (Polygon f : fixtures) {
            b.addOutline(f);
        }
        return new BelievedMap(b.build(), fixtures);
    }

    /** A fresh actual world at time 0: doors in their actual state, clutter by its schedule. */
    public ActualWorld actualWorld() {
        return new ActualWorld(this);
    }
}
