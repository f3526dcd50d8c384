package dev.driftlab.app.editor.web;

import static org.assertj.core.api.Assertions.assertThat;

import dev.driftlab.scenario.Limits;
import java.util.Optional;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;

/**
 * The editor's settings forms offer the ranges of the scenario's limits table, which the validator
 * and the JSON Schema read too ({@code LimitsTest}): a value the form's min and max allow is one the
 * validator accepts, and the other way round.
 */
class SettingsSectionTest {

    static Stream<Limits.Field> limits() {
        return Limits.FIELDS.stream();
    }

    @ParameterizedTest
    @MethodSource("limits")
    void formField_offersTheTablesRange(Limits.Field limit) {
        Optional<SettingsSection.Field> field = formField(limit.path());
        if (field.isEmpty()) {
            return;
        }
        SettingsSection.Field f = field.get();
        assertThat(Double.parseDouble(f.min())).as("min of %s", limit.path()).isEqualTo(limit.min());
        assertThat(Double.parseDouble(f.max())).as("max of %s", limit.path()).isEqualTo(limit.max());
        assertThat(f.kind())
                .as("kind of %s", limit.path())
                .isEqualTo(limit.whole() ? SettingsSection.Kind.INTEGER : SettingsSection.Kind.NUMBER);
        assertThat(f.unit()).isEqualTo(limit.unit());
        assertThat(f.range()).isEqualTo(limit.rangeText());
    }

    @Test
    void everyBoundedNumberInput_hasARowInTheTable() {
        for (SettingsSection s : SettingsSection.values()) {
            for (SettingsSection.Field f : s.fields()) {
                if (!f.min().isEmpty()) {
                    String path = s.key() + "." + f.key();
                    assertThat(Limits.FIELDS.stream().anyMatch(l -> l.path().equals(path)))
                            .as(path)
                            .isTrue();
                }
            }
        }
    }

    @Test
    void formerDisagreements_nowFollowTheValidator() {
        // the form once stopped at 2 m and 200 m while files allowed 5 m and 100 m
        assertThat(formField("robot.wheelbase").orElseThrow().max()).isEqualTo("5");
        assertThat(formField("rangefinder.maxRange").orElseThrow().max()).isEqualTo("100");
    }

    private static Optional<SettingsSection.Field> formField(String path) {
        for (SettingsSection s : SettingsSection.values()) {
            for (SettingsSection.Field f : s.fields()) {
                if (path.equals(s.key() + "." + f.key())) {
                    return Optional.of(f);
                }
            }
        }
        return Optional.empty();
    }
}
