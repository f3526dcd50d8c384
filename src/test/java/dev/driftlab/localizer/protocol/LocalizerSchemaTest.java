package dev.driftlab.localizer.protocol;

import static org.assertj.core.api.Assertions.assertThat;

import com.networknt.schema.Error;
import com.networknt.schema.InputFormat;
import com.networknt.schema.Schema;
import com.networknt.schema.SchemaRegistry;
import com.networknt.schema.SpecificationVersion;
import dev.driftlab.evaluation.EpisodeRules;
import dev.driftlab.geometry.Pose;
import dev.driftlab.scenario.LocalizerSettings;
import dev.driftlab.scenario.Scenario;
import dev.driftlab.scenario.Scenarios;
import dev.driftlab.trial.OutsideLocalizer;
import dev.driftlab.trial.TrialRunner;
import java.io.IOException;
import java.io.InputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.TreeSet;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;

/**
 * The published JSON Schemas of driftlab-localizer/1 (one per message, draft 2020-12) agree with
 * the messages really exchanged: every line of recorded trials, in both directions, validates
 * against the schema of its type, for Driftlab's own localizer (every optional part) and the sample
 * dead-reckoning localizer (none of them). Answers the reader refuses for their shape are refused by
 * the schema too, and the schema's bounds are the reader's. Oracle: the networknt
 * json-schema-validator, an independent implementation.
 */
class LocalizerSchemaTest {

    private static final List<String> TYPES =
            List.of("greeting", "hello", "refused", "odometry", "scan", "estimate", "end");
    private static final Map<String, Schema> SCHEMAS = new HashMap<>();
    private static final JsonMapper MAPPER = JsonMapper.builder().build();

    @BeforeAll
    static void loadSchemas() throws IOException {
        for (String t : TYPES) {
            try (InputStream in =
                    LocalizerSchemaTest.class.getResourceAsStream("/static/schema/localizer-1/" + t + ".schema.json")) {
                assertThat(in).as(t + " schema on the class path").isNotNull();
                SCHEMAS.put(
                        t,
                        SchemaRegistry.withDefaultDialect(SpecificationVersion.DRAFT_2020_12)
                                .getSchema(in));
            }
        }
    }

    private static List<Error> errors(String line) {
        String type = MAPPER.readTree(line).path("type").asString();
        assertThat(SCHEMAS).as("a schema for \"" + type + "\"").containsKey(type);
        return SCHEMAS.get(type).validate(line, InputFormat.JSON);
    }

    /** Runs one recorded trial through the tee wrapper and returns the lines of both directions. */
    private static List<String> exchange(Path dir, Scenario s, List<String> localizer) throws IOException {
        Path in = dir.resolve("to-localizer.jsonl");
        Path out = dir.resolve("from-localizer.jsonl");
        List<String> command = new ArrayList<>(
                List.of("sh", ChildCommands.testLocalizer("tee.sh").toString(), in.toString(), out.toString()));
        command.addAll(localizer);
        new TrialRunner(s, new OutsideLocalizer(command, ProcessLocalizer.Limits.DEFAULT))
                .run(s.allVariants().get(0), 3, frame -> {}, EpisodeRules.defaults(), () -> false);
        List<String> lines = new ArrayList<>(Files.readAllLines(in));
        lines.addAll(Files.readAllLines(out));
        lines.removeIf(String::isBlank);
        return lines;
    }

    private static Set<String> types(List<String> lines) {
        Set<String> t = new TreeSet<>();
        lines.forEach(l -> t.add(MAPPER.readTree(l).path("type").asString()));
        return t;
    }

    @Test
    void everyMessageOfTheBuiltInLocalizer_validates(@TempDir Path dir) throws IOException {
        Scenario s = Scenarios.corridor().withKidnapAt(6, Pose.of(15, 1, 0)).build();
        List<String> lines = exchange(dir, s, ChildCommands.localizerStdio());

        assertThat(types(lines)).containsExactlyInAnyOrder("greeting", "hello", "odometry", "scan", "estimate", "end");
        for (String line : lines) {
            assertThat(errors(line))
                    .as(line.substring(0, Math.min(200, line.length())))
                    .isEmpty();
        }
        JsonNode estimate = lines.stream()
                .map(MAPPER::readTree)
                .filter(n -> n.path("type").asString().equals("estimate"))
                .findFirst()
                .orElseThrow();
        assertThat(estimate.path("particles").path("x").size())
                .as("recorded: particles sent")
                .isPositive();
        assertThat(estimate.has("covariance")).isTrue();
    }

    @Test
    void everyMessageOfTheSampleDeadReckoning_validates_withAnUnknownStartToo(@TempDir Path dir) throws IOException {
        Scenario base = Scenarios.corridor().build();
        LocalizerSettings global = base.localizer()
                .withParticles(base.localizer().particles().startingAt(LocalizerSettings.Start.EVERYWHERE));
        Scenario s = Scenarios.corridor().withLocalizer(global).build();
        List<String> lines =
                exchange(dir, s, ChildCommands.singleFile(Path.of("sample-projects/localizers/DeadReckoning.java")));

        assertThat(types(lines)).contains("greeting", "hello", "estimate");
        assertThat(MAPPER.readTree(lines.get(0)).path("start").asString()).isEqualTo("unknown");
        for (String line : lines) {
            assertThat(errors(line))
                    .as(line.substring(0, Math.min(200, line.length())))
                    .isEmpty();
        }
    }

    @Test
    void answersTheReaderRefusesForTheirShape_areRefusedByTheSchemaToo() {
        String[] bad = {
            "{\"type\":\"estimate\",\"time\":1.0}",
            "{\"type\":\"estimate\",\"time\":1.0,\"pose\":{\"x\":1,\"y\":2}}",
            "{\"type\":\"estimate\",\"time\":1.0,\"pose\":{\"x\":1,\"y\":2,\"heading\":0},\"covariance\":[1,0,0,1]}",
            "{\"type\":\"estimate\",\"time\":1.0,\"pose\":{\"x\":1,\"y\":2,\"heading\":0},"
                    + "\"hypotheses\":[{\"weight\":1.5,\"pose\":{\"x\":1,\"y\":2,\"heading\":0}}]}",
            "{\"type\":\"hello\",\"name\":\"x\"}",
        };
        for (String line : bad) {
            assertThat(errors(line)).as(line).isNotEmpty();
            org.assertj.core.api.Assertions.assertThatThrownBy(() -> {
                        JsonNode n = Messages.parse(line);
                        if (Messages.type(n).equals("hello")) {
                            Messages.readHello(n);
                        } else {
                            Messages.readEstimate(n, 1.0);
                        }
                    })
                    .as(line)
                    .isInstanceOf(ProtocolException.class);
        }
    }

    @Test
    void schemaBounds_areTheReadersBounds() throws IOException {
        JsonNode estimate = schemaDoc("estimate");
        assertThat(estimate.at("/properties/hypotheses/maxItems").asInt()).isEqualTo(Messages.MAX_HYPOTHESES);
        for (String col : List.of("x", "y", "heading", "weight")) {
            assertThat(estimate.at("/properties/particles/properties/" + col + "/maxItems")
                            .asInt())
                    .isEqualTo(Messages.MAX_PARTICLES);
        }
        assertThat(schemaDoc("greeting").at("/properties/particles/maximum").asInt())
                .isEqualTo(Messages.MAX_PARTICLES);
        for (String t : TYPES) {
            assertThat(schemaDoc(t).at("/properties/type/const").asString()).isEqualTo(t);
        }
    }

    private static JsonNode schemaDoc(String type) throws IOException {
        try (InputStream in =
                LocalizerSchemaTest.class.getResourceAsStream("/static/schema/localizer-1/" + type + ".schema.json")) {
            return MAPPER.readTree(in);
        }
    }

    @Test
    void workedExchangeInTheProtocolDocument_validatesAndIsRead() throws IOException {
        String doc = Files.readString(Path.of("docs/localizer-protocol.md"));
        String block = doc.substring(doc.indexOf("```jsonl") + 8, doc.indexOf("```", doc.indexOf("```jsonl") + 8));
        List<String> lines = block.strip().lines().toList();
        assertThat(lines).hasSizeGreaterThanOrEqualTo(8);
        double scanTime = 0;
        for (String marked : lines) {
            String line = marked.substring(2);
            assertThat(errors(line)).as(line).isEmpty();
            JsonNode n = Messages.parse(line);
            switch (Messages.type(n)) {
                case "greeting" ->
                    assertThat(OccupancyRows.decode(Messages.readGreeting(n).rows(), 6))
                            .hasSize(24);
                case "hello" -> assertThat(Messages.readHello(n)).isEqualTo("my localizer");
                case "scan" -> scanTime = Messages.readTime(n);
                case "estimate" ->
                    assertThat(Messages.readEstimate(n, scanTime).pose()).isNotNull();
                default -> {}
            }
        }
    }
}
