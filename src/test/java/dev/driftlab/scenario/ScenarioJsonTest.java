package dev.driftlab.scenario;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;

class ScenarioJsonTest {

    static Stream<Path> samples() throws IOException {
        try (Stream<Path> files = Files.list(Path.of("sample-projects"))) {
            List<Path> list =
                    files.filter(p -> p.toString().endsWith(".json")).sorted().toList();
            assertThat(list).hasSizeGreaterThanOrEqualTo(4);
            return list.stream();
        }
    }

    @ParameterizedTest
    @MethodSource("samples")
    void sample_roundTrips_equalRecordsAndStableText(Path file) throws IOException {
        Scenario read = ScenarioJson.read(Files.readString(file));
        String written = ScenarioJson.write(read);
        Scenario again = ScenarioJson.read(written);

        assertThat(again).isEqualTo(read);
        assertThat(ScenarioJson.write(again)).isEqualTo(written);
    }

    @ParameterizedTest
    @MethodSource("samples")
    void sample_isValidWithoutErrors(Path file) throws IOException {
        ScenarioFiles.Checked checked = ScenarioFiles.check(Files.readString(file));

        assertThat(checked.report().errors()).isEmpty();
        assertThat(checked.ok()).isTrue();
    }

    @Test
    void degreesInFile_becomeRadiansInside() {
        String json = Docs.corridor()
                .set("route.start.heading", "90")
                .set("rangefinder.fieldOfView", "180")
                .json();

        Scenario s = ScenarioJson.read(json);

        assertThat(s.route().start().heading()).isCloseTo(Math.PI / 2, org.assertj.core.data.Offset.offset(1e-15));
        assertThat(s.rangefinder().fieldOfView()).isCloseTo(Math.PI, org.assertj.core.data.Offset.offset(1e-15));
    }

    @Test
    void variant_mergesOntoBaseSettings_andWritesOnlyItsChanges() {
        String json = Docs.corridor()
                .set("variants", "[{\"name\":\"few\",\"localizer\":{\"particles\":{\"count\":300}}}]")
                .json();

        Scenario s = ScenarioJson.read(json);
        SettingsVariant v = s.variants().get(0);

        assertThat(v.settings().particles().count()).isEqualTo(300);
        assertThat(v.settings().rangeModel()).isEqualTo(s.localizer().rangeModel());
        String written = ScenarioJson.write(s);
        String variantPart = written.substring(written.indexOf("\"variants\""), written.indexOf("\"gates\""));
        assertThat(variantPart.replaceAll("\\s", ""))
                .isEqualTo("\"variants\":[{\"name\":\"few\",\"localizer\":{\"particles\":{\"count\":300}}}],");
    }

    @Test
    void unknownKey_isReportedWithItsPath() {
        String json = Docs.corridor()
                .set("route.waypoints[0]", "{\"x\":18,\"y\":1,\"dwel\":3}")
                .json();

        assertThatThrownBy(() -> ScenarioJson.read(json))
                .isInstanceOf(ScenarioException.class)
                .satisfies(e -> assertThat(((ScenarioException) e).problems()).anySatisfy(p -> {
                    assertThat(p.path()).isEqualTo("route.waypoints[0].dwel");
                    assertThat(p.message()).startsWith("unknown key");
                }));
    }

    @Test
    void newerFormatVersion_isRefusedWithAClearMessage() {
        String json = Docs.corridor().set("format", "\"driftlab-scenario/7\"").json();

        assertThatThrownBy(() -> ScenarioJson.read(json))
                .isInstanceOf(ScenarioException.class)
                .hasMessageContaining("format: version 7 is newer than this Driftlab reads (1)");
    }

    @Test
    void missingFormat_isRefused() {
        String json = Docs.corridor().remove("format").json();

        assertThatThrownBy(() -> ScenarioJson.read(json)).hasMessageContaining("format: is required");
    }

    @Test
    void malformedJson_namesLineAndColumn() {
        assertThatThrownBy(() -> ScenarioJson.read("{\n  \"format\": \"driftlab-scenario/1\",\n  \"name\": }"))
                .isInstanceOf(ScenarioException.class)
                .hasMessageContaining("(document): is not valid JSON at line 3");
    }

    @Test
    void hugeNumber_isNotFinite_andNamed() {
        String json = Scenarios.corridor().json().replace("\"wheelbase\" : 0.4", "\"wheelbase\" : 1e400");

        assertThatThrownBy(() -> ScenarioJson.read(json))
                .hasMessageContaining("robot.wheelbase: must be a finite number");
    }

    @Test
    void wrongTypes_allReportedAtOnce() {
        String json = Docs.corridor()
                .set("robot.wheelbase", "\"wide\"")
                .set("rangefinder.beams", "2.5")
                .set("site.doors[0].mapped", "\"ajar\"")
                .json();

        assertThatThrownBy(() -> ScenarioJson.read(json))
                .isInstanceOf(ScenarioException.class)
                .satisfies(e -> assertThat(((ScenarioException) e).problems())
                        .extracting(Problem::path)
                        .contains("robot.wheelbase", "rangefinder.beams", "site.doors[0].mapped"));
    }

    @Test
    void unknownWheel_namesTheChoices() {
        String json = Docs.corridor()
                .set("faults", "[{\"id\":\"s\",\"kind\":\"stall\",\"at\":5,\"wheel\":\"middle\",\"duration\":1}]")
                .json();

        assertThatThrownBy(() -> ScenarioJson.read(json))
                .hasMessageContaining("faults[0].wheel: must be one of left, right, both, got \"middle\"");
    }

    @Test
    void faultWithTwoTriggers_isRefused() {
        String json = Docs.corridor()
                .set("faults", "[{\"id\":\"b\",\"kind\":\"blackout\",\"at\":5,\"enters\":\"side\",\"duration\":1}]")
                .json();

        assertThatThrownBy(() -> ScenarioJson.read(json)).hasMessageContaining("faults[0]: has more than one trigger");
    }
}
