package dev.driftlab.scenario;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Locale;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;
import tools.jackson.databind.node.ObjectNode;

/**
 * The limits table is the one home of every numeric setting's range: the validator refuses exactly
 * what the table refuses, with the table's message, and the published JSON Schema carries the same
 * bounds. The editor's forms are checked against the table in {@code SettingsSectionTest}.
 */
class LimitsTest {

    private static final JsonMapper JSON = JsonMapper.builder().build();
    private static final Path SCHEMA = Path.of("src/main/resources/static/schema/scenario-1.schema.json");
    private static final String[] BOUNDS = {"minimum", "exclusiveMinimum", "maximum", "exclusiveMaximum"};

    static Stream<Limits.Field> fields() {
        return Limits.FIELDS.stream();
    }

    @ParameterizedTest
    @MethodSource("fields")
    void validator_refusesExactlyWhatTheTableRefuses(Limits.Field f) {
        double step = f.whole() ? 1 : 0.001;
        for (double v : new double[] {f.min(), f.max(), (f.min() + f.max()) / 2, f.min() - step, f.max() + step}) {
            double value = f.whole() ? Math.floor(v) : v;
            List<Problem> atPath = ownErrors(f, value);
            if (f.accepts(value)) {
                assertThat(atPath).as("%s = %s", f.path(), value).isEmpty();
            } else {
                assertThat(atPath)
                        .as("%s = %s", f.path(), value)
                        .contains(Problem.error(f.path(), f.problem(value).orElseThrow()));
            }
        }
    }

    @Test
    void table_hasOneRowPerPath_andSaneRanges() {
        assertThat(Limits.FIELDS.stream().map(Limits.Field::path).distinct().count())
                .isEqualTo(Limits.FIELDS.size());
        for (Limits.Field f : Limits.FIELDS) {
            assertThat(f.min()).as(f.path()).isLessThan(f.max());
            assertThat(f.accepts((f.min() + f.max()) / 2) || f.whole())
                    .as(f.path())
                    .isTrue();
        }
    }

    @Test
    void problem_wordsEachShapeOfRange() {
        assertThat(Limits.field("robot.wheelbase").problem(0)).contains("must be more than 0 m, got 0");
        assertThat(Limits.field("robot.wheelbase").problem(6)).contains("6 m is more than the maximum of 5 m");
        assertThat(Limits.field("localizer.particles.count").problem(0)).contains("must be at least 1, got 0");
        assertThat(Limits.field("localizer.particles.count").problem(1.5)).contains("1.5 is not a whole number");
        assertThat(Limits.field("localizer.recovery.slowRate").problem(1))
                .contains("1 must lie strictly between 0 and 1");
        assertThat(Limits.field("localizer.particles.confidence").problem(0.4))
                .contains("0.4 is out of range; allowed 0.5 to 0.9999 (below 0.5 the particle count bound is"
                        + " meaningless)");
        assertThat(Limits.field("localizer.particles.confidence").problem(0.9999))
                .isEmpty();
    }

    /**
     * Regenerates the schema's numeric bounds from the table and compares with the published file.
     * On a difference the regenerated schema is written to {@code target/} to be copied over.
     * Oracle for the meaning of the keywords: JSON Schema draft 2020-12 validation vocabulary,
     * sections 6.2.2 to 6.2.5 (minimum and maximum inclusive, the exclusive forms strict).
     */
    @Test
    void schema_carriesTheTablesBounds() throws IOException {
        JsonNode published = JSON.readTree(Files.readString(SCHEMA));
        ObjectNode regenerated = (ObjectNode) published.deepCopy();
        for (Limits.Field f : Limits.FIELDS) {
            ObjectNode node = schemaNode(regenerated, f.path());
            assertThat(node).as("schema entry of %s", f.path()).isNotNull();
            node.remove(List.of(BOUNDS));
            node.put("type", f.whole() ? "integer" : "number");
            node.set(f.minOpen() ? "exclusiveMinimum" : "minimum", number(f.min()));
            node.set(f.maxOpen() ? "exclusiveMaximum" : "maximum", number(f.max()));
        }
        // read back, so numbers compare as the file's parser types them (5 as an int, not a long)
        regenerated = (ObjectNode) JSON.readTree(JSON.writeValueAsString(regenerated));
        if (!regenerated.equals(published)) {
            Path out = Path.of("target", SCHEMA.getFileName().toString());
            Files.createDirectories(out.getParent());
            Files.writeString(out, JSON.writerWithDefaultPrettyPrinter().writeValueAsString(regenerated));
            for (Limits.Field f : Limits.FIELDS) {
                assertThat(schemaNode((ObjectNode) published, f.path()))
                        .as("schema bounds of %s; the regenerated schema is in %s", f.path(), out)
                        .isEqualTo(schemaNode(regenerated, f.path()));
            }
        }
        assertThat(regenerated).isEqualTo(published);
    }

    /** The schema node of a file path: localizer settings are one definition shared by variants. */
    static ObjectNode schemaNode(ObjectNode schema, String path) {
        String[] parts = path.split("\\.");
        JsonNode n = parts[0].equals("localizer")
                ? schema.path("$defs").path("localizer")
                : schema.path("properties").path(parts[0]);
        for (int i = 1; i < parts.length; i++) {
            n = n.path("properties").path(parts[i]);
        }
        return n.isObject() ? (ObjectNode) n : null;
    }

    private static JsonNode number(double v) {
        return v == Math.rint(v) && Math.abs(v) < 1e15
                ? JSON.getNodeFactory().numberNode((long) v)
                : JSON.getNodeFactory().numberNode(v);
    }

    /** Errors the validator reports at the field's own path, leaving out rules that tie fields together. */
    private static List<Problem> ownErrors(Limits.Field f, double value) {
        String text = f.whole() ? String.format(Locale.ROOT, "%d", (long) value) : Double.toString(value);
        Docs doc = Docs.corridor();
        ensureParents(doc, f.path());
        ScenarioFiles.Checked checked =
                ScenarioFiles.check(doc.set(f.path(), text).json());
        return checked.report().problems().stream()
                .filter(Problem::isError)
                .filter(p -> p.path().equals(f.path()))
                .filter(p -> !crossRule(p.message()))
                .toList();
    }

    /** Messages of rules between fields (count within its bounds, rates in order, grid size). */
    private static boolean crossRule(String message) {
        return message.contains("maxCount")
                || message.contains("fastRate")
                || message.contains("rangefinder's")
                || message.contains("grid cells")
                || message.contains("cannot match the map");
    }

    private static void ensureParents(Docs doc, String path) {
        String[] parts = path.split("\\.");
        StringBuilder p = new StringBuilder();
        for (int i = 0; i < parts.length - 1; i++) {
            if (i > 0) {
                p.append('.');
            }
            p.append(parts[i]);
            doc.ensureObject(p.toString());
        }
    }
}
