package dev.driftlab.site;

import dev.driftlab.geometry.Polygon;
import dev.driftlab.geometry.Segment;
import dev.driftlab.geometry.Walls;
import dev.driftlab.scenario.Door;
import dev.driftlab.scenario.DoorState;
import dev.driftlab.scenario.Room;
import dev.driftlab.scenario.SitePlan;
import java.util.ArrayList;
import java.util.List;
import java.util.function.Function;

/**
 * The wall pieces of a site plan: room walls with door openings cut out by {@link Walls}' rule (a
 * door opens every wall lying within 1 cm along its opening). The site compiler, the site-plan and
 * frame drawings, the run player and the editor's live check all take their walls from here, so
 * what is drawn as a passage is a passage in the simulated world.
 */
public final class WallPieces {

    private WallPieces() {}

    /**
     * The wall pieces with the openings of the doors in state {@link DoorState#OPEN} cut out. A
     * door in another state leaves its walls whole (the leaf stands in the opening). Doors that fit
     * no wall are skipped (the validator reports them), so this never throws on a plan that was
     * read.
     *
     * @param plan the site plan
     * @param state which state of each door counts: {@code Door::mapped} for the believed map,
     *     {@code Door::actual} for the real world at the start, {@code d -> DoorState.OPEN} for every
     *     gap
     */
    public static List<Segment> of(SitePlan plan, Function<Door, DoorState> state) {
        List<Polygon> outlines = new ArrayList<>(plan.rooms().size());
        for (Room r : plan.rooms()) {
            outlines.add(r.outline());
        }
        List<Segment> openings = new ArrayList<>();
        for (Door d : plan.doors()) {
            if (state.apply(d) == DoorState.OPEN) {
                plan.opening(d).ifPresent(openings::add);
            }
        }
        return Walls.pieces(outlines, openings);
    }
}
