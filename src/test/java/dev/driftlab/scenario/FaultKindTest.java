package dev.driftlab.scenario;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.EnumSource;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;
import tools.jackson.databind.node.ObjectNode;

/** The list of fault kinds agrees with the reader, the writer and the published JSON Schema. */
class FaultKindTest {

    private static final JsonMapper JSON = JsonMapper.builder().build();
    private static final Path SCHEMA = Path.of("src/main/resources/static/schema/scenario-1.schema.json");

    @Test
    void schema_namesExactlyTheKindsOfTheList() throws IOException {
        List<String> inSchema = new ArrayList<>();
        for (JsonNode branch : JSON.readTree(Files.readString(SCHEMA))
                .path("$defs")
                .path("fault")
                .path("oneOf")) {
            inSchema.add(branch.path("properties").path("kind").path("const").asString());
        }
        assertThat(inSchema)
                .containsExactlyElementsOf(Arrays.stream(FaultKind.values())
                        .map(FaultKind::fileName)
                        .toList());
    }

    @ParameterizedTest
    @EnumSource(FaultKind.class)
    void schema_offersEveryFieldOfTheKind(FaultKind kind) throws IOException {
        JsonNode branch = null;
        for (JsonNode b : JSON.readTree(Files.readString(SCHEMA))
                .path("$defs")
                .path("fault")
                .path("oneOf")) {
            if (b.path("properties").path("kind").path("const").asString().equals(kind.fileName())) {
                branch = b;
            }
        }
        assertThat(branch).as(kind.fileName()).isNotNull();
        for (FaultKind.Field f : kind.fields()) {
            assertThat(branch.path("properties").has(f.key().split("\\.")[0]))
                    .as("%s.%s", kind.fileName(), f.key())
                    .isTrue();
        }
    }

    @ParameterizedTest
    @EnumSource(FaultKind.class)
    void everyKind_readsAndWritesUnderItsFileName(FaultKind kind) {
        // the reader maps file words to enum constants by lower case with hyphens (JsonFields)
        assertThat(kind.fileName()).isEqualTo(JsonFields.fileName(kind));
        ObjectNode fault = JSON.createObjectNode();
        fault.put("id", "f");
        fault.put("kind", kind.fileName());
        fault.put("at", 1.0);
        for (FaultKind.Field f : kind.fields()) {
            String[] key = f.key().split("\\.");
            ObjectNode parent = key.length == 1
                    ? fault
                    : fault.has(key[0]) ? (ObjectNode) fault.get(key[0]) : fault.putObject(key[0]);
            String leaf = key[key.length - 1];
            switch (f.type()) {
                case "ref" -> parent.put(leaf, f.source().equals("doors") ? "side-door" : "box");
                case "number" -> parent.put(leaf, ((Number) f.initial()).doubleValue());
                case "bool" -> parent.put(leaf, (Boolean) f.initial());
                case "choice" -> {
                    assertThat(FaultKind.CHOICES.get(f.source())).contains((String) f.initial());
                    parent.put(leaf, (String) f.initial());
                }
                default -> throw new AssertionError("unknown field type " + f.type());
            }
        }
        String doc = Docs.corridor().set("faults", "[" + fault + "]").json();
        Scenario read = ScenarioJson.read(doc);
        assertThat(FaultKind.of(read.faults().get(0))).isEqualTo(kind);
        JsonNode written =
                JSON.readTree(ScenarioJson.write(read)).path("faults").get(0);
        assertThat(written.path("kind").asString()).isEqualTo(kind.fileName());
    }

    @Test
    void target_isTheKidnapsSetDownPose_andNoOtherKindSetsOne() {
        // the editor draws, picks and places fault[target] for every kind with one (common practice,
        // no source: the behaviour the editor had when it spelled "kidnap" itself)
        assertThat(FaultKind.KIDNAP.target()).isEqualTo("to");
        assertThat(Arrays.stream(FaultKind.values()).filter(k -> !k.target().isEmpty()))
                .containsExactly(FaultKind.KIDNAP);
    }

    @Test
    void clutterFault_isCalledClutter_notClutterChange() {
        // the player once derived kind names from class names and showed "clutter-change"
        assertThat(FaultKind.of(new Fault.ClutterChange("c", new Trigger.AtTime(1), "box", true))
                        .fileName())
                .isEqualTo("clutter");
    }
}
