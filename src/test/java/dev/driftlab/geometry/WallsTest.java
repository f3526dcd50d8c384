package dev.driftlab.geometry;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import java.util.List;
import org.junit.jupiter.api.Test;

class WallsTest {

    private static final Polygon ROOM = Polygon.rectangle(0, 0, 4, 3);

    private static double totalLength(List<Segment> pieces) {
        return pieces.stream().mapToDouble(Segment::length).sum();
    }

    @Test
    void pieces_whenNoOpenings_thenReturnsEveryEdgeWhole() {
        List<Segment> pieces = Walls.pieces(List.of(ROOM), List.of());

        assertThat(pieces).hasSize(4);
        assertThat(totalLength(pieces)).isCloseTo(14.0, within(1e-12));
    }

    @Test
    void pieces_whenOneOpeningInsideWall_thenSplitsThatWallAroundIt() {
        // a 0.9 m door centred 2 m along the 4 m bottom wall
        List<Segment> pieces = Walls.pieces(List.of(ROOM), List.of(Walls.gap(ROOM, 0, 2.0, 0.9)));

        assertThat(pieces).hasSize(5);
        assertThat(pieces.get(0).a()).isEqualTo(Point.of(0, 0));
        assertThat(pieces.get(0).b().x()).isCloseTo(1.55, within(1e-12));
        assertThat(pieces.get(1).a().x()).isCloseTo(2.45, within(1e-12));
        assertThat(pieces.get(1).b()).isEqualTo(Point.of(4, 0));
        assertThat(totalLength(pieces)).isCloseTo(14.0 - 0.9, within(1e-12));
    }

    @Test
    void pieces_whenOpeningsOverlap_thenTheyMerge() {
        List<Segment> pieces =
                Walls.pieces(List.of(ROOM), List.of(Walls.gap(ROOM, 1, 1.0, 1.0), Walls.gap(ROOM, 1, 1.5, 1.0)));

        // right wall (3 m) keeps [0, 0.5] and [2, 3]
        assertThat(totalLength(pieces)).isCloseTo(14.0 - 1.5, within(1e-12));
        assertThat(pieces).hasSize(5);
    }

    @Test
    void gap_whenReachingPastWallEnd_thenClipsToWall() {
        List<Segment> pieces = Walls.pieces(List.of(ROOM), List.of(Walls.gap(ROOM, 2, 3.8, 1.0)));

        assertThat(totalLength(pieces)).isCloseTo(14.0 - 0.7, within(1e-12));
    }

    @Test
    void spanOn_whenOpeningWithinOneCentimetreOfTheWallLine_thenOpensIt() {
        Segment wall = new Segment(Point.of(0, 0), Point.of(4, 0));

        assertThat(Walls.spanOn(wall, new Segment(Point.of(1, 0.0099), Point.of(2, 0.0099))))
                .hasValueSatisfying(s -> assertThat(s).containsExactly(1.0, 2.0));
        assertThat(Walls.spanOn(wall, new Segment(Point.of(1, 0.0101), Point.of(2, 0.0101))))
                .isEmpty();
        // one end near, the other 2 cm off: not along the wall
        assertThat(Walls.spanOn(wall, new Segment(Point.of(1, 0), Point.of(2, 0.02))))
                .isEmpty();
    }

    @Test
    void spanOn_whenWallOnlyPartlyBehindTheOpening_thenCutsTheOverlap() {
        Segment wall = new Segment(Point.of(0, 0), Point.of(1.5, 0));

        assertThat(Walls.spanOn(wall, new Segment(Point.of(2, 0), Point.of(1, 0))))
                .hasValueSatisfying(s -> assertThat(s).containsExactly(1.0, 1.5));
        // on the same line but beside the wall: nothing to cut
        assertThat(Walls.spanOn(wall, new Segment(Point.of(2, 0), Point.of(3, 0))))
                .isEmpty();
    }

    @Test
    void gap_whenDoorOnLeftWall_thenSpansTheOpeningInWallDirection() {
        // edge 3 runs from (0, 3) down to (0, 0)
        Segment g = Walls.gap(ROOM, 3, 1.0, 0.8);

        assertThat(g.a().x()).isCloseTo(0, within(1e-12));
        assertThat(g.a().y()).isCloseTo(2.4, within(1e-12));
        assertThat(g.b().y()).isCloseTo(1.6, within(1e-12));
    }

    @Test
    void gap_whenWallIndexOutOfRange_thenRefuses() {
        assertThatThrownBy(() -> Walls.gap(ROOM, 4, 1.0, 0.8))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessageContaining("wall index 4");
    }
}
