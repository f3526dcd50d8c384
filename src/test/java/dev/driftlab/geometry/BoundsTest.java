package dev.driftlab.geometry;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.util.List;
import org.junit.jupiter.api.Test;

class BoundsTest {

    @Test
    void around_whenPointsGiven_thenTheSmallestBoxHoldingThem() {
        Bounds b = Bounds.around(List.of(Point.of(2, -1), Point.of(-3, 4), Point.of(0.5, 0.5)));

        assertThat(b).isEqualTo(new Bounds(-3, -1, 2, 4));
        assertThat(b.width()).isEqualTo(5);
        assertThat(b.height()).isEqualTo(5);
    }

    @Test
    void paddedAndUnion_whenCombined_thenGrowOnEverySide() {
        Bounds room = new Bounds(0, 0, 4, 3);

        assertThat(room.padded(1)).isEqualTo(new Bounds(-1, -1, 5, 4));
        assertThat(room.union(Bounds.of(6, -2))).isEqualTo(new Bounds(0, -2, 6, 3));
    }

    @Test
    void contains_whenOnTheEdge_thenInside() {
        Bounds b = new Bounds(0, 0, 4, 3);

        assertThat(b.contains(4, 3)).isTrue();
        assertThat(b.contains(0, 1.5)).isTrue();
        assertThat(b.contains(4.000001, 1)).isFalse();
        assertThat(b.contains(1, -1e-9)).isFalse();
    }

    @Test
    void constructor_whenMaximumBelowMinimum_thenNamesTheField() {
        assertThatThrownBy(() -> new Bounds(0, 0, -1, 1))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessageContaining("maxX");
        assertThatThrownBy(() -> new Bounds(0, 2, 1, 1))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessageContaining("maxY");
        assertThatThrownBy(() -> new Bounds(Double.NaN, 0, 1, 1))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessageContaining("minX NaN");
        assertThatThrownBy(() -> new Bounds(0, 0, 1, 1).padded(-0.5))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessageContaining("margin");
        assertThatThrownBy(() -> Bounds.around(List.of())).isInstanceOf(IllegalArgumentException.class);
    }
}
