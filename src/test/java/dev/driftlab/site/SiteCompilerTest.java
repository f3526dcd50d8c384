package dev.driftlab.site;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import dev.driftlab.geometry.FreeSpace;
import dev.driftlab.geometry.GridMap;
import dev.driftlab.geometry.OccupancyGrid;
import dev.driftlab.geometry.Polygon;
import dev.driftlab.scenario.Clutter;
import dev.driftlab.scenario.Door;
import dev.driftlab.scenario.DoorState;
import dev.driftlab.scenario.Fixture;
import dev.driftlab.scenario.Room;
import dev.driftlab.scenario.SitePlan;
import java.util.List;
import org.junit.jupiter.api.Test;

class SiteCompilerTest {

    /**
     * Two 5 x 4 rooms sharing the wall x = 5, each drawn with its own outline. The door sits on
     * room A's right wall (edge 1, running from (5, 0) up to (5, 4)), centred 2 m up, 0.9 m wide.
     */
    static SitePlan twoRooms(DoorState mapped, DoorState actual, List<Clutter> clutter) {
        return new SitePlan(
                List.of(
                        new Room("a", "Room A", Polygon.rectangle(0, 0, 5, 4)),
                        new Room("b", "Room B", Polygon.rectangle(5, 0, 5, 4))),
                List.of(new Door("d1", "a", 1, 2.0, 0.9, mapped, actual)),
                List.of(new Fixture("f1", "Shelf", Polygon.rectangle(8, 3, 1, 0.5))),
                List.of(),
                clutter);
    }

    @Test
    void compile_whenDoorOnSharedWall_thenGapOpensThroughBothRooms() {
        CompiledSite site = SiteCompiler.compile(twoRooms(DoorState.OPEN, DoorState.OPEN, List.of()));

        // plane geometry: from (1, 2) straight east through the door to room B's far wall at x = 10
        assertThat(site.believedMap().exactCaster().cast(1, 2, 0, 20)).isCloseTo(9.0, within(1e-12));
        // beside the door the shared wall blocks at x = 5
        assertThat(site.believedMap().exactCaster().cast(1, 1, 0, 20)).isCloseTo(4.0, within(1e-12));
        // 4 + 4 room walls, one split in two on each side of the door
        assertThat(site.walls().size()).isEqualTo(10);
    }

    @Test
    void believedMap_whenDoorMappedClosedButActuallyOpen_thenOnlyTheMapBlocks() {
        CompiledSite site = SiteCompiler.compile(twoRooms(DoorState.CLOSED, DoorState.OPEN, List.of()));

        assertThat(site.believedMap().exactCaster().cast(1, 2, 0, 20)).isCloseTo(4.0, within(1e-12));
        assertThat(site.actualWorld().cast(1, 2, 0, 20)).isCloseTo(9.0, within(1e-12));
    }

    @Test
    void actualWorld_whenDoorChanges_thenCastsFollow() {
        ActualWorld world = SiteCompiler.compile(twoRooms(DoorState.OPEN, DoorState.OPEN, List.of()))
                .actualWorld();

        assertThat(world.setDoorClosed("d1", true)).isTrue();
        assertThat(world.cast(1, 2, 0, 20)).isCloseTo(4.0, within(1e-12));
        assertThat(world.clearance(4.8, 2, 1)).isCloseTo(0.2, within(1e-12));
        assertThat(world.setDoorClosed("d1", false)).isTrue();
        assertThat(world.cast(1, 2, 0, 20)).isCloseTo(9.0, within(1e-12));
        assertThat(world.setDoorClosed("d1", false)).isFalse();
    }

    @Test
    void actualWorld_whenClutterScheduled_thenStandsOnlyInItsWindow() {
        Clutter cart = new Clutter("c1", "Cart", Polygon.rectangle(3, 1.5, 0.5, 1), 5, 8);
        CompiledSite site = SiteCompiler.compile(twoRooms(DoorState.OPEN, DoorState.OPEN, List.of(cart)));
        ActualWorld world = site.actualWorld();

        assertThat(world.cast(1, 2, 0, 20)).isCloseTo(9.0, within(1e-12));
        assertThat(world.advanceTo(5.0)).containsExactly("c1");
        assertThat(world.cast(1, 2, 0, 20)).isCloseTo(2.0, within(1e-12));
        assertThat(world.advanceTo(7.0)).isEmpty();
        assertThat(world.advanceTo(8.0)).containsExactly("c1");
        assertThat(world.cast(1, 2, 0, 20)).isCloseTo(9.0, within(1e-12));
        // the believed map never shows clutter
        assertThat(site.believedMap().exactCaster().cast(1, 2, 0, 20)).isCloseTo(9.0, within(1e-12));
    }

    @Test
    void actualWorld_whenClutterFaultAddsItem_thenItStandsUntilItsScheduleChanges() {
        Clutter box = new Clutter("c1", "Box", Polygon.rectangle(3, 1.5, 0.5, 1), 50, Double.POSITIVE_INFINITY);
        ActualWorld world = SiteCompiler.compile(twoRooms(DoorState.OPEN, DoorState.OPEN, List.of(box)))
                .actualWorld();

        world.setClutterPresent("c1", true);
        world.advanceTo(10);
        assertThat(world.isClutterPresent("c1")).isTrue();
        assertThat(world.cast(1, 2, 0, 20)).isCloseTo(2.0, within(1e-12));
    }

    @Test
    void actualWorld_whenTimeGoesBack_thenRefuses() {
        ActualWorld world = SiteCompiler.compile(twoRooms(DoorState.OPEN, DoorState.OPEN, List.of()))
                .actualWorld();
        world.advanceTo(3);

        assertThatThrownBy(() -> world.advanceTo(2)).isInstanceOf(IllegalArgumentException.class);
        assertThatThrownBy(() -> world.setDoorClosed("nope", true)).hasMessageContaining("nope");
    }

    @Test
    void compile_whenDoorNamesMissingRoom_thenMessageNamesTheField() {
        SitePlan plan = new SitePlan(
                List.of(new Room("a", "Room A", Polygon.rectangle(0, 0, 5, 4))),
                List.of(new Door("d1", "x", 1, 2.0, 0.9, DoorState.OPEN, DoorState.OPEN)),
                List.of(),
                List.of(),
                List.of());

        assertThatThrownBy(() -> SiteCompiler.compile(plan))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessageContaining("site.doors[0].room");
    }

    @Test
    void gridMap_whenFixtureInRoomB_thenGridAndFreeSpaceExcludeIt() {
        BelievedMap map = SiteCompiler.compile(twoRooms(DoorState.OPEN, DoorState.CLOSED, List.of()))
                .believedMap();
        GridMap grid = map.gridMap(OccupancyGrid.DEFAULT_CELL_SIZE);
        FreeSpace free = grid.freeSpace(1, 2, 0.0);

        assertThat(grid.grid().isOccupiedAt(8.5, 3.25)).isTrue();
        assertThat(free.contains(8.5, 3.25)).isFalse();
        // the believed map shows the door open, so room B is reachable
        assertThat(free.contains(7, 1)).isTrue();
        assertThat(grid.field().distanceAt(2.5, 2.0)).isCloseTo(2.0, within(0.05));
    }
}
