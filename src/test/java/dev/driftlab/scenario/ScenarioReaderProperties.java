package dev.driftlab.scenario;

import static org.assertj.core.api.Assertions.assertThat;

import dev.driftlab.site.CompiledSite;
import dev.driftlab.site.SiteCompiler;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.EnumMap;
import java.util.List;
import java.util.Map;
import java.util.SplittableRandom;
import java.util.function.BiFunction;
import java.util.stream.IntStream;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;
import tools.jackson.databind.node.ArrayNode;
import tools.jackson.databind.node.JsonNodeFactory;
import tools.jackson.databind.node.ObjectNode;

/**
 * Fuzzes the scenario reader, the validator and the site compiler with generated documents: random
 * token soup, random JSON trees in the scenario's vocabulary, byte-level splices of the sample
 * projects and structural mutations of them (values replaced by wrong types, non-finite and huge
 * numbers, keys removed or unknown keys added, outlines that cross themselves). Whatever comes in:
 *
 * <ul>
 *   <li>{@link ScenarioJson#read} returns a scenario or throws {@link ScenarioException} with at
 *       least one error, each problem with a path and a message;
 *   <li>{@link ScenarioValidator#validate} returns a report and never throws;
 *   <li>{@link SiteCompiler#compile} compiles every site the validator found free of errors, and
 *       otherwise throws nothing but {@link IllegalArgumentException} naming a door field the
 *       validator also refused;
 *   <li>{@link ScenarioFiles#check} never throws and agrees with the above.
 * </ul>
 *
 * Every generator draws from a {@link SplittableRandom} with a fixed seed, so a failure names the
 * generator, seed and index that reproduce it.
 */
class ScenarioReaderProperties {

    private static final JsonMapper MAPPER = JsonMapper.builder().build();

    private static final List<String> SAMPLES = loadSamples();

    /** Documents the generated tests push through per run, at least. */
    static final int MIN_GENERATED = 10_000;

    /** How far a document got. */
    enum Stage {
        REFUSED_BY_READER,
        REFUSED_BY_VALIDATOR,
        ACCEPTED
    }

    // ---------------------------------------------------------------- contract

    /** Runs one document through reader, validator, compiler and check; fails on any breach. */
    static Stage check(String doc) {
        return check(doc, true);
    }

    /**
     * Runs one document through reader, validator and compiler, and with {@code alsoFiles} through
     * {@link ScenarioFiles#check} too (which repeats the reading and validation).
     */
    static Stage check(String doc, boolean alsoFiles) {
        Stage stage = stageOf(doc);
        if (!alsoFiles) {
            return stage;
        }
        ScenarioFiles.Checked checked = ScenarioFiles.check(doc);
        assertThat(checked.report()).isNotNull();
        assertThat(checked.ok()).as("ScenarioFiles.check agrees").isEqualTo(stage == Stage.ACCEPTED);
        assertThat(checked.scenario().isPresent()).isEqualTo(stage != Stage.REFUSED_BY_READER);
        return stage;
    }

    private static Stage stageOf(String doc) {
        Scenario scenario;
        try {
            scenario = ScenarioJson.read(doc);
        } catch (ScenarioException e) {
            assertThat(e.problems()).anySatisfy(p -> assertThat(p.isError()).isTrue());
            // the path is empty when the whole document is at fault
            assertThat(e.problems()).allSatisfy(p -> assertThat(p.message()).isNotBlank());
            return Stage.REFUSED_BY_READER;
        }
        assertThat(scenario).isNotNull();
        ValidationReport report = ScenarioValidator.validate(scenario);
        assertThat(report.problems()).allSatisfy(p -> assertThat(p.message()).isNotBlank());
        CompiledSite compiled;
        try {
            compiled = SiteCompiler.compile(scenario.site());
        } catch (IllegalArgumentException e) {
            // SiteCompiler's documented refusal, naming the door field: a door on a missing room or
            // wall. The validator must have refused the scenario already (perhaps for the room's
            // outline rather than the door).
            assertThat(report.hasErrors())
                    .as("compiler refused a site the validator passed: %s", e.getMessage())
                    .isTrue();
            assertThat(e.getMessage()).matches("site\\.doors\\[\\d+]\\.(room|wall|width): .+");
            return Stage.REFUSED_BY_VALIDATOR;
        }
        assertThat(compiled).isNotNull();
        return report.hasErrors() ? Stage.REFUSED_BY_VALIDATOR : Stage.ACCEPTED;
    }

    // ---------------------------------------------------------------- explicit edge cases

    static Stream<Arguments> edgeCases() {
        String sample = SAMPLES.get(0);
        String corridor = Scenarios.corridor().json();
        List<Arguments> cases = new ArrayList<>();
        cases.add(Arguments.of("null document", null, Stage.REFUSED_BY_READER));
        cases.add(Arguments.of("empty", "", Stage.REFUSED_BY_READER));
        cases.add(Arguments.of("blank", " \n\t ", Stage.REFUSED_BY_READER));
        cases.add(Arguments.of("json null", "null", Stage.REFUSED_BY_READER));
        cases.add(Arguments.of("empty object", "{}", Stage.REFUSED_BY_READER));
        cases.add(Arguments.of("empty array", "[]", Stage.REFUSED_BY_READER));
        cases.add(Arguments.of("bare string", "\"driftlab-scenario/1\"", Stage.REFUSED_BY_READER));
        cases.add(Arguments.of("bare number", "1", Stage.REFUSED_BY_READER));
        cases.add(Arguments.of("byte order mark", "\uFEFF" + corridor, null));
        cases.add(Arguments.of("truncated at half", sample.substring(0, sample.length() / 2), Stage.REFUSED_BY_READER));
        cases.add(Arguments.of("truncated by one", sample.substring(0, sample.length() - 1), null));
        cases.add(Arguments.of("trailing garbage", corridor + "}", Stage.REFUSED_BY_READER));
        cases.add(Arguments.of("two documents", corridor + corridor, Stage.REFUSED_BY_READER));
        cases.add(Arguments.of("deep array nesting", "[".repeat(100_000), Stage.REFUSED_BY_READER));
        cases.add(Arguments.of(
                "deep object nesting", "{\"a\":".repeat(50_000) + "1" + "}".repeat(50_000), Stage.REFUSED_BY_READER));
        cases.add(Arguments.of(
                "deep nesting in a field",
                Docs.of(corridor).set("name", "[".repeat(400) + "]".repeat(400)).json(),
                Stage.REFUSED_BY_READER));
        cases.add(Arguments.of(
                "wrong format",
                Docs.of(corridor).set("format", "\"driftlab-scenario/99\"").json(),
                Stage.REFUSED_BY_READER));
        cases.add(Arguments.of(
                "format is a number", Docs.of(corridor).set("format", "1").json(), Stage.REFUSED_BY_READER));
        cases.add(Arguments.of(
                "unknown top-level key",
                Docs.of(corridor).set("colour", "\"red\"").json(),
                Stage.REFUSED_BY_READER));
        cases.add(Arguments.of(
                "unknown nested key", Docs.of(corridor).set("robot.wings", "2").json(), Stage.REFUSED_BY_READER));
        cases.add(Arguments.of(
                "duplicate key",
                "{\"name\":\"a\"," + corridor.substring(corridor.indexOf('{') + 1),
                Stage.REFUSED_BY_READER));
        cases.add(Arguments.of(
                "site is a string", Docs.of(corridor).set("site", "\"big\"").json(), Stage.REFUSED_BY_READER));
        cases.add(Arguments.of(
                "rooms is an object", Docs.of(corridor).set("site.rooms", "{}").json(), Stage.REFUSED_BY_READER));
        cases.add(Arguments.of(
                "corner is a string",
                Docs.of(corridor).set("site.rooms[0].outline[0]", "\"0,0\"").json(),
                Stage.REFUSED_BY_READER));
        cases.add(Arguments.of(
                "corner has one number",
                Docs.of(corridor).set("site.rooms[0].outline[0]", "[1]").json(),
                Stage.REFUSED_BY_READER));
        cases.add(Arguments.of("missing site", Docs.of(corridor).remove("site").json(), Stage.REFUSED_BY_READER));
        for (String raw : List.of("NaN", "Infinity", "-Infinity", "1e400", "-1e400")) {
            cases.add(Arguments.of(
                    "bare " + raw + " as a corner",
                    rawAt(corridor, "site.rooms[0].outline[1]", "[" + raw + ",0]"),
                    Stage.REFUSED_BY_READER));
        }
        cases.add(Arguments.of(
                "NaN as a string",
                Docs.of(corridor).set("site.rooms[0].outline[1]", "[\"NaN\",0]").json(),
                Stage.REFUSED_BY_READER));
        cases.add(Arguments.of(
                "huge corner",
                Docs.of(corridor).set("site.rooms[0].outline[1]", "[1e300,0]").json(),
                Stage.REFUSED_BY_VALIDATOR));
        cases.add(Arguments.of(
                "huge integer",
                Docs.of(corridor)
                        .set("site.rooms[0].outline[1]", "[99999999999999999999999999999999,0]")
                        .json(),
                Stage.REFUSED_BY_VALIDATOR));
        cases.add(Arguments.of(
                "tiny door",
                Docs.of(sample).set("site.doors[0].width", "1e-300").json(),
                null));
        cases.add(Arguments.of(
                "self-crossing room",
                Docs.of(corridor)
                        .set(
                                "site.rooms[0].outline",
                                bowTie(MAPPER.readTree(corridor)
                                        .get("site")
                                        .get("rooms")
                                        .get(0)
                                        .get("outline")
                                        .toString()))
                        .json(),
                Stage.REFUSED_BY_VALIDATOR));
        cases.add(Arguments.of(
                "room of two corners",
                Docs.of(corridor).set("site.rooms[0].outline", "[[0,0],[1,0]]").json(),
                Stage.REFUSED_BY_VALIDATOR));
        cases.add(Arguments.of(
                "room of one repeated corner",
                Docs.of(corridor)
                        .set("site.rooms[0].outline", "[[1,1],[1,1],[1,1],[1,1]]")
                        .json(),
                Stage.REFUSED_BY_VALIDATOR));
        cases.add(Arguments.of(
                "no rooms", Docs.of(corridor).set("site.rooms", "[]").json(), Stage.REFUSED_BY_VALIDATOR));
        cases.add(Arguments.of(
                "door on a missing room",
                Docs.of(sample).set("site.doors[0].room", "\"nowhere\"").json(),
                Stage.REFUSED_BY_VALIDATOR));
        cases.add(Arguments.of(
                "door on a missing wall",
                Docs.of(sample).set("site.doors[0].wall", "99").json(),
                Stage.REFUSED_BY_VALIDATOR));
        cases.add(Arguments.of(
                "door on wall -1",
                Docs.of(sample).set("site.doors[0].wall", "-1").json(),
                Stage.REFUSED_BY_VALIDATOR));
        cases.add(Arguments.of(
                "negative door width",
                Docs.of(sample).set("site.doors[0].width", "-0.9").json(),
                null));
        cases.add(Arguments.of(
                "door wall as a fraction",
                Docs.of(sample).set("site.doors[0].wall", "1.5").json(),
                null));
        cases.add(Arguments.of(
                "very long name",
                Docs.of(corridor).set("name", "\"" + "x".repeat(200_000) + "\"").json(),
                null));
        cases.add(Arguments.of(
                "control characters", rawAt(corridor, "name", "\"\u0000\u0001\""), Stage.REFUSED_BY_READER));
        cases.add(Arguments.of(
                "lone surrogate escape",
                Docs.of(corridor).set("name", "\"\\ud800\"").json(),
                null));
        for (int i = 0; i < SAMPLES.size(); i++) {
            cases.add(Arguments.of("sample " + i + " as shipped", SAMPLES.get(i), Stage.ACCEPTED));
        }
        cases.add(Arguments.of("corridor builder", corridor, Stage.ACCEPTED));
        return cases.stream();
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("edgeCases")
    void edgeCase_failsOnlyAsDocumented(String name, String doc, Stage expected) {
        Stage stage = check(doc);
        if (expected != null) {
            assertThat(stage).as(name).isEqualTo(expected);
        }
    }

    // ---------------------------------------------------------------- generated documents

    /** A generator: draws the next document from the random source. */
    enum Generator {
        TOKEN_SOUP(ScenarioReaderProperties::tokenSoup),
        RANDOM_TREE(ScenarioReaderProperties::randomTree),
        SPLICED_SAMPLE(ScenarioReaderProperties::splicedSample),
        MUTATED_SAMPLE(ScenarioReaderProperties::mutatedSample);

        private final BiFunction<SplittableRandom, Integer, String> next;

        Generator(BiFunction<SplittableRandom, Integer, String> next) {
            this.next = next;
        }

        String next(SplittableRandom random, int index) {
            return next.apply(random, index);
        }
    }

    /** Generator, fixed seed, number of documents. */
    static Stream<Arguments> batches() {
        return Stream.of(
                Arguments.of(Generator.TOKEN_SOUP, 0x5EED_0001L, 1_000),
                Arguments.of(Generator.TOKEN_SOUP, 0x5EED_0002L, 1_000),
                Arguments.of(Generator.RANDOM_TREE, 0x5EED_0003L, 1_000),
                Arguments.of(Generator.RANDOM_TREE, 0x5EED_0004L, 1_000),
                Arguments.of(Generator.SPLICED_SAMPLE, 0x5EED_0005L, 1_500),
                Arguments.of(Generator.SPLICED_SAMPLE, 0x5EED_0006L, 1_500),
                Arguments.of(Generator.MUTATED_SAMPLE, 0x5EED_0007L, 1_500),
                Arguments.of(Generator.MUTATED_SAMPLE, 0x5EED_0008L, 1_500));
    }

    @Test
    void batches_addUpToTheRequiredNumberOfDocuments() {
        int total = batches().mapToInt(a -> (Integer) a.get()[2]).sum();
        assertThat(total).isGreaterThanOrEqualTo(MIN_GENERATED);
    }

    @ParameterizedTest(name = "{0} seed {1} x{2}")
    @MethodSource("batches")
    void generated_failOnlyAsDocumented(Generator generator, long seed, int count) {
        SplittableRandom random = new SplittableRandom(seed);
        Map<Stage, Integer> seen = new EnumMap<>(Stage.class);
        IntStream.range(0, count).forEach(i -> {
            String doc = generator.next(random, i);
            try {
                // ScenarioFiles.check repeats reading and validation: every tenth document is enough
                seen.merge(check(doc, i % 10 == 0), 1, Integer::sum);
            } catch (Throwable t) {
                throw new AssertionError(
                        generator + " seed " + Long.toHexString(seed) + " document " + i + ": " + t + "\n"
                                + abbreviate(doc),
                        t);
            }
        });
        assertThat(seen.values().stream().mapToInt(Integer::intValue).sum()).isEqualTo(count);
        // The generators must reach past the parser, or the validator and compiler go untested.
        switch (generator) {
            case TOKEN_SOUP -> assertThat(seen).containsOnlyKeys(Stage.REFUSED_BY_READER);
            case RANDOM_TREE, SPLICED_SAMPLE ->
                assertThat(seen.getOrDefault(Stage.REFUSED_BY_READER, 0)).isGreaterThan(count / 2);
            case MUTATED_SAMPLE -> {
                assertThat(seen.getOrDefault(Stage.REFUSED_BY_VALIDATOR, 0)).isGreaterThan(count / 20);
                assertThat(seen.getOrDefault(Stage.ACCEPTED, 0)).isGreaterThan(count / 20);
            }
        }
    }

    private static final String[] TOKENS = {
        "{",
        "}",
        "[",
        "]",
        ",",
        ":",
        "\"format\"",
        "\"driftlab-scenario/1\"",
        "\"site\"",
        "\"rooms\"",
        "\"outline\"",
        "\"doors\"",
        "\"route\"",
        "\"start\"",
        "\"x\"",
        "\"id\"",
        "1e400",
        "-0",
        "NaN",
        "Infinity",
        "null",
        "true",
        "\"\"",
        "0.5",
        "9999999999999999999999",
        "\"kind\"",
        "\"kidnap\"",
        "\"",
        "\\",
        "\"\\u0000\"",
        " ",
        "\n",
        "/*",
        "'"
    };

    /** Up to 80 tokens of scenario vocabulary and JSON punctuation in any order. */
    private static String tokenSoup(SplittableRandom random, int index) {
        int n = random.nextInt(81);
        StringBuilder sb = new StringBuilder();
        for (int i = 0; i < n; i++) {
            sb.append(TOKENS[random.nextInt(TOKENS.length)]);
        }
        // Soup that happens to be a valid scenario is practically impossible: it would need a site,
        // a robot and a route. Keep it a document the reader must refuse.
        return sb.toString();
    }

    private static final String[] KEYS = {
        "format",
        "name",
        "description",
        "site",
        "rooms",
        "id",
        "outline",
        "doors",
        "room",
        "wall",
        "along",
        "width",
        "mapped",
        "actual",
        "fixtures",
        "floorZones",
        "clutter",
        "robot",
        "rangefinder",
        "route",
        "start",
        "waypoints",
        "faults",
        "kind",
        "at",
        "localizer",
        "variants",
        "gates",
        "settings",
        "x",
        "y",
        "heading",
        "unknown"
    };

    /** A random JSON tree whose keys come from the scenario's vocabulary, mostly with a right format. */
    private static String randomTree(SplittableRandom random, int index) {
        ObjectNode root = JsonNodeFactory.instance.objectNode();
        if (random.nextInt(10) < 8) {
            root.put("format", ScenarioJson.FORMAT);
        }
        int keys = random.nextInt(8);
        for (int i = 0; i < keys; i++) {
            root.set(KEYS[random.nextInt(KEYS.length)], randomNode(random, 4));
        }
        return withRawValues(MAPPER.writeValueAsString(root), random);
    }

    private static JsonNode randomNode(SplittableRandom random, int depth) {
        JsonNodeFactory f = JsonNodeFactory.instance;
        int pick = random.nextInt(depth <= 0 ? 6 : 9);
        return switch (pick) {
            case 0 -> f.nullNode();
            case 1 -> f.booleanNode(random.nextBoolean());
            case 2 -> f.numberNode(randomNumber(random));
            case 3 -> f.numberNode(random.nextInt(-3, 12));
            case 4 ->
                f.textNode(
                        random.nextBoolean()
                                ? KEYS[random.nextInt(KEYS.length)]
                                : RAW_MARK + random.nextInt(RAW.length));
            case 5 -> f.textNode("");
            case 6, 7 -> {
                ArrayNode a = f.arrayNode();
                int n = random.nextInt(6);
                for (int i = 0; i < n; i++) {
                    a.add(randomNode(random, depth - 1));
                }
                yield a;
            }
            default -> {
                ObjectNode o = f.objectNode();
                int n = random.nextInt(5);
                for (int i = 0; i < n; i++) {
                    o.set(KEYS[random.nextInt(KEYS.length)], randomNode(random, depth - 1));
                }
                yield o;
            }
        };
    }

    private static final String[] SPLICES = {
        "",
        "0",
        "-1",
        "1e308",
        "1e400",
        "-1e400",
        "NaN",
        "Infinity",
        "\"",
        "null",
        "[]",
        "{}",
        "[[0,0],[1,1],[0,1],[1,0]]",
        "\"x\"",
        "true",
        "99999999999",
        "0.000000001",
        ",\"extra\":1",
        "\"closed\"",
        "\"kidnap\"",
        "]",
        "}",
        "[[",
        ":"
    };

    /** A sample project with a random cut, insertion or truncation somewhere in its text. */
    private static String splicedSample(SplittableRandom random, int index) {
        String s = SAMPLES.get(random.nextInt(SAMPLES.size()));
        int at = random.nextInt(s.length() + 1);
        return switch (random.nextInt(4)) {
            case 0 -> s.substring(0, at); // truncated
            case 1 -> s.substring(0, at) + SPLICES[random.nextInt(SPLICES.length)] + s.substring(at);
            default -> {
                int end = Math.min(s.length(), at + random.nextInt(41));
                yield s.substring(0, at) + SPLICES[random.nextInt(SPLICES.length)] + s.substring(end);
            }
        };
    }

    /** A sample project (or the corridor) with one to three structural changes. */
    private static String mutatedSample(SplittableRandom random, int index) {
        int base = random.nextInt(SAMPLES.size() + 1);
        String text = base == SAMPLES.size() ? CORRIDOR : SAMPLES.get(base);
        JsonNode root = MAPPER.readTree(text);
        int changes = 1 + random.nextInt(3);
        for (int c = 0; c < changes; c++) {
            List<Slot> slots = new ArrayList<>();
            collect(root, slots);
            mutate(slots.get(random.nextInt(slots.size())), random, root);
        }
        return withRawValues(MAPPER.writeValueAsString(root), random);
    }

    private static final String CORRIDOR = Scenarios.corridor().json();

    /** A place in the tree: a key of an object or an index of an array, and what is there. */
    private record Slot(JsonNode parent, String key, int index, JsonNode value) {}

    private static void collect(JsonNode node, List<Slot> out) {
        if (node instanceof ObjectNode o) {
            for (String name : o.propertyNames()) {
                out.add(new Slot(o, name, -1, o.get(name)));
                collect(o.get(name), out);
            }
        } else if (node instanceof ArrayNode a) {
            for (int i = 0; i < a.size(); i++) {
                out.add(new Slot(a, null, i, a.get(i)));
                collect(a.get(i), out);
            }
        }
    }

    private static void mutate(Slot slot, SplittableRandom random, JsonNode root) {
        JsonNodeFactory f = JsonNodeFactory.instance;
        JsonNode v = slot.value();
        switch (random.nextInt(10)) {
            case 0 -> remove(slot);
            case 1 -> {
                if (slot.parent() instanceof ObjectNode o) {
                    o.put("unknown" + random.nextInt(3), 1);
                } else {
                    ((ArrayNode) slot.parent()).add(v.deepCopy());
                }
            }
            case 2 -> replace(slot, randomNode(random, 2));
            case 3 -> replace(slot, f.textNode(RAW_MARK + random.nextInt(RAW.length)));
            case 4 -> {
                if (v.isArray() && v.size() >= 3 && v.get(0).isArray()) {
                    replace(slot, MAPPER.readTree(bowTie(v.toString())));
                } else if (v.isArray()) {
                    ((ArrayNode) v).removeAll();
                } else {
                    replace(slot, f.arrayNode().add(v.deepCopy()));
                }
            }
            case 5 -> {
                if (v.isString()) {
                    // another id from the document, so references still resolve (or resolve wrongly)
                    List<String> ids = new ArrayList<>();
                    root.findValues("id").stream().filter(JsonNode::isString).forEach(n -> ids.add(n.asString()));
                    replace(slot, f.textNode(ids.isEmpty() ? "" : ids.get(random.nextInt(ids.size()))));
                } else {
                    replace(slot, f.textNode(v.toString()));
                }
            }
            default -> {
                // the commonest useful change: a number nudged, scaled, negated or zeroed
                if (v.isNumber()) {
                    double d = v.asDouble();
                    double[] options = {
                        d + random.nextDouble(-1, 1),
                        d * random.nextDouble(0, 3),
                        -d,
                        0,
                        d * 1e6,
                        Math.nextUp(d),
                        d + 0.01
                    };
                    replace(slot, f.numberNode(options[random.nextInt(options.length)]));
                } else if (v.isArray() && v.size() > 0) {
                    ((ArrayNode) v).remove(random.nextInt(v.size()));
                } else {
                    replace(slot, f.numberNode(random.nextInt(-2, 5)));
                }
            }
        }
    }

    private static void remove(Slot slot) {
        if (slot.parent() instanceof ObjectNode o) {
            o.remove(slot.key());
        } else {
            ((ArrayNode) slot.parent()).remove(slot.index());
        }
    }

    private static void replace(Slot slot, JsonNode value) {
        if (slot.parent() instanceof ObjectNode o) {
            o.set(slot.key(), value);
        } else {
            ((ArrayNode) slot.parent()).set(slot.index(), value);
        }
    }

    private static double randomNumber(SplittableRandom random) {
        return switch (random.nextInt(5)) {
            case 0 -> random.nextDouble(-10, 30);
            case 1 -> random.nextDouble(0, 1);
            case 2 -> Math.scalb(random.nextDouble(-1, 1), random.nextInt(-1070, 1024));
            case 3 -> random.nextInt(0, 5);
            default -> random.nextDouble(-1e6, 1e6);
        };
    }

    /**
     * A string value {@code RAW_MARK + i} in a written document is swapped for raw text that a JSON
     * tree cannot hold: bare non-finite numbers, numbers beyond double range, deep nesting.
     */
    private static final String RAW_MARK = "@raw@";

    private static final String[] RAW = {
        "NaN",
        "Infinity",
        "-Infinity",
        "1e400",
        "-1e400",
        "4.9e-325",
        "123456789012345678901234567890",
        "-0",
        "[".repeat(600) + "]".repeat(600),
        "{\"a\":".repeat(300) + "0" + "}".repeat(300),
        "\"" + "w".repeat(10_000) + "\"",
        "[1e308,1e308]"
    };

    private static String withRawValues(String json, SplittableRandom random) {
        if (!json.contains(RAW_MARK)) {
            return json;
        }
        String out = json;
        for (int i = RAW.length - 1; i >= 0; i--) {
            out = out.replace("\"" + RAW_MARK + i + "\"", RAW[i]);
        }
        return out;
    }

    // ---------------------------------------------------------------- helpers

    /** The outline with its second and third corners swapped: the edges cross (a bow tie). */
    private static String bowTie(String outlineJson) {
        ArrayNode outline = (ArrayNode) MAPPER.readTree(outlineJson);
        JsonNode second = outline.get(1);
        outline.set(1, outline.get(2));
        outline.set(2, second);
        return outline.toString();
    }

    /** The document with the value at a path replaced by raw text (which a JSON tree cannot hold). */
    private static String rawAt(String doc, String path, String raw) {
        return Docs.of(doc).set(path, "\"" + RAW_MARK + "\"").json().replace("\"" + RAW_MARK + "\"", raw);
    }

    private static String abbreviate(String doc) {
        if (doc == null) {
            return "null";
        }
        return doc.length() <= 2_000 ? doc : doc.substring(0, 2_000) + "... (" + doc.length() + " chars)";
    }

    private static List<String> loadSamples() {
        try (var files = Files.list(Path.of("sample-projects"))) {
            return files.filter(p -> p.toString().endsWith(".json"))
                    .sorted()
                    .map(p -> {
                        try {
                            return Files.readString(p);
                        } catch (IOException e) {
                            throw new UncheckedIOException(e);
                        }
                    })
                    .toList();
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }
}
