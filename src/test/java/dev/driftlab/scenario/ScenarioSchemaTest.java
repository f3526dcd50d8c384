package dev.driftlab.scenario;

import static org.assertj.core.api.Assertions.assertThat;

import com.networknt.schema.Error;
import com.networknt.schema.InputFormat;
import com.networknt.schema.Schema;
import com.networknt.schema.SchemaRegistry;
import com.networknt.schema.SpecificationVersion;
import java.io.IOException;
import java.io.InputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.stream.Stream;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;

/**
 * The published JSON Schema (draft 2020-12) agrees with the reader: every sample and every file the
 * writer produces validates; documents the reader refuses for their shape are refused by the
 * schema too. Oracle: the networknt json-schema-validator, an independent implementation.
 */
class ScenarioSchemaTest {

    private static Schema schema;

    @BeforeAll
    static void loadSchema() throws IOException {
        try (InputStream in = ScenarioSchemaTest.class.getResourceAsStream("/static/schema/scenario-1.schema.json")) {
            assertThat(in).as("schema on the classpath").isNotNull();
            schema = SchemaRegistry.withDefaultDialect(SpecificationVersion.DRAFT_2020_12)
                    .getSchema(in);
        }
    }

    static Stream<Path> samples() throws IOException {
        return ScenarioJsonTest.samples();
    }

    private static List<Error> errors(String json) {
        return schema.validate(json, InputFormat.JSON);
    }

    @ParameterizedTest
    @MethodSource("samples")
    void everySample_validatesAgainstTheSchema(Path file) throws IOException {
        assertThat(errors(Files.readString(file))).isEmpty();
    }

    @ParameterizedTest
    @MethodSource("samples")
    void writtenSample_validatesAgainstTheSchema(Path file) throws IOException {
        String written = ScenarioJson.write(ScenarioJson.read(Files.readString(file)));

        assertThat(errors(written)).isEmpty();
    }

    @Test
    void everyFaultKind_validates() {
        String json = Docs.corridor().set("faults", """
                        [{"id":"a","kind":"slip","at":1,"wheel":"left","fraction":0.2,"duration":1},
                         {"id":"b","kind":"stall","enters":"side","wheel":"right","duration":1,"encoderSeesIt":true},
                         {"id":"c","kind":"kidnap","at":2,"to":{"x":10,"y":1,"heading":90}},
                         {"id":"d","kind":"bump","near":{"x":5,"y":1,"radius":0.5},"forward":0.1},
                         {"id":"e","kind":"door-change","at":3,"door":"side-door","state":"closed"},
                         {"id":"f","kind":"blackout","at":4,"duration":2},
                         {"id":"g","kind":"noise-burst","at":4,"duration":2,"factor":5},
                         {"id":"h","kind":"spurious-max-range","at":4,"duration":2,"share":0.3}]""").json();

        assertThat(errors(json)).isEmpty();
        assertThat(ScenarioFiles.check(json).report().errors()).isEmpty();
    }

    @Test
    void unknownKey_isRefusedByBoth() {
        String json = Docs.corridor().set("robot.wheelDiameter", "0.15").json();

        assertThat(errors(json)).isNotEmpty();
        assertThat(ScenarioFiles.check(json).ok()).isFalse();
    }

    @Test
    void newerFormat_isRefusedByBoth() {
        String json = Docs.corridor().set("format", "\"driftlab-scenario/2\"").json();

        assertThat(errors(json)).isNotEmpty();
        assertThat(ScenarioFiles.check(json).ok()).isFalse();
    }

    @Test
    void faultWithoutTrigger_isRefusedByBoth() {
        String json = Docs.corridor()
                .set("faults", "[{\"id\":\"f\",\"kind\":\"blackout\",\"duration\":2}]")
                .json();

        assertThat(errors(json)).isNotEmpty();
        assertThat(ScenarioFiles.check(json).ok()).isFalse();
    }

    @Test
    void kldConfidenceLimits_areTheValidatorsOwn() {
        // the schema's minimum and maximum must be Limits.MIN_CONFIDENCE and MAX_CONFIDENCE:
        // values just inside pass both, values just outside fail both
        for (String ok : List.of("0.5", "0.9999")) {
            String json =
                    Docs.corridor().set("localizer.particles.confidence", ok).json();
            assertThat(errors(json)).as("schema, %s", ok).isEmpty();
            assertThat(ScenarioFiles.check(json).ok()).as("validator, %s", ok).isTrue();
        }
        for (String bad : List.of("0.4999", "0.99991")) {
            String json =
                    Docs.corridor().set("localizer.particles.confidence", bad).json();
            assertThat(errors(json)).as("schema, %s", bad).isNotEmpty();
            assertThat(ScenarioFiles.check(json).ok()).as("validator, %s", bad).isFalse();
        }
        assertThat(Limits.MIN_CONFIDENCE).isEqualTo(0.5);
        assertThat(Limits.MAX_CONFIDENCE).isEqualTo(0.9999);
    }

    @Test
    void gateMetricList_isTheSchemasList() throws IOException {
        try (InputStream in = ScenarioSchemaTest.class.getResourceAsStream("/static/schema/scenario-1.schema.json")) {
            var doc = tools.jackson.databind.json.JsonMapper.builder().build().readTree(in);
            List<String> listed = new java.util.ArrayList<>();
            doc.findValues("metric").forEach(m -> m.path("enum").forEach(v -> listed.add(v.asString())));

            assertThat(listed)
                    .containsExactlyElementsOf(java.util.Arrays.stream(GateMetric.values())
                            .map(GateMetric::fileName)
                            .toList());
        }
    }
}
