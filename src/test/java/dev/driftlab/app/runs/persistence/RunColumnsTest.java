package dev.driftlab.app.runs.persistence;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.util.List;
import org.junit.jupiter.api.Test;

class RunColumnsTest {

    @Test
    void options_writeOnlyWhatDiffersFromTheVariant_andReadBack() {
        String plain = RunColumns.optionsJson(new RunColumns.Options(true, 0));
        String sweep = RunColumns.optionsJson(new RunColumns.Options(false, 1000));

        assertThat(plain).isEqualTo("{\"recordFrames\":true}");
        assertThat(sweep).isEqualTo("{\"recordFrames\":false,\"particles\":1000}");
        assertThat(RunColumns.options(plain)).isEqualTo(new RunColumns.Options(true, 0));
        assertThat(RunColumns.options(sweep)).isEqualTo(new RunColumns.Options(false, 1000));
    }

    @Test
    void options_writtenByHandEarlier_withSpacesOrUnknownKeys_stillRead() {
        assertThat(RunColumns.options("{ \"recordFrames\" : true, \"particles\" : 300 }"))
                .isEqualTo(new RunColumns.Options(true, 300));
        assertThat(RunColumns.options("{\"recordFrames\":false,\"later\":{\"x\":1}}"))
                .isEqualTo(new RunColumns.Options(false, 0));
    }

    @Test
    void options_emptyAreTheVariantsOwnWithoutFrames_andOnesThatDoNotReadAreRefused() {
        assertThat(RunColumns.options("")).isEqualTo(new RunColumns.Options(false, 0));
        assertThatThrownBy(() -> RunColumns.options("not json"))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessageContaining("stored options");
        assertThatThrownBy(() -> RunColumns.options("null")).isInstanceOf(IllegalArgumentException.class);
    }

    @Test
    void seeds_areAJsonArray_andCommaTextOfEarlierRunsStillReads() {
        String json = RunColumns.seedsJson(List.of(7L, -8L, Long.MAX_VALUE));

        assertThat(json).isEqualTo("[7,-8," + Long.MAX_VALUE + "]");
        assertThat(RunColumns.seeds(json)).containsExactly(7L, -8L, Long.MAX_VALUE);
        assertThat(RunColumns.seeds("7, 8,9")).containsExactly(7L, 8L, 9L);
        assertThat(RunColumns.seeds(" ")).isEmpty();
    }

    @Test
    void seeds_thatDoNotRead_areRefusedNamingTheColumn() {
        assertThatThrownBy(() -> RunColumns.seeds("[1,\"x\"]"))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessageContaining("stored seeds");
        assertThatThrownBy(() -> RunColumns.seeds("1,,2")).isInstanceOf(IllegalArgumentException.class);
        assertThatThrownBy(() -> RunColumns.seeds("[1,null]")).isInstanceOf(IllegalArgumentException.class);
    }
}
