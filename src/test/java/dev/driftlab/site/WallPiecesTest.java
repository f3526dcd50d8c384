package dev.driftlab.site;

import static org.assertj.core.api.Assertions.assertThat;

import dev.driftlab.geometry.Point;
import dev.driftlab.geometry.Segment;
import dev.driftlab.scenario.Door;
import dev.driftlab.scenario.DoorState;
import dev.driftlab.scenario.Scenarios;
import dev.driftlab.scenario.SitePlan;
import java.util.List;
import org.junit.jupiter.api.Test;

class WallPiecesTest {

    @Test
    void doorBetweenTwoRooms_opensBothWalls() {
        // the side room's bottom edge runs along the corridor's wall 2; the door must open both
        List<Segment> walls = WallPieces.of(Scenarios.corridor().build().site(), Door::mapped);

        Point doorCentre = new Point(3, 2);
        assertThat(walls).noneMatch(w -> w.distanceTo(doorCentre) < 1e-9);
    }

    @Test
    void closedDoor_leavesBothWallsWhole() {
        SitePlan site = Scenarios.corridor().build().site();

        List<Segment> walls = WallPieces.of(site, d -> DoorState.CLOSED);

        // corridor 4 edges, side room 4 edges, none cut
        assertThat(walls).hasSize(8);
        assertThat(walls).anyMatch(w -> w.distanceTo(new Point(3, 2)) < 1e-9);
    }
}
