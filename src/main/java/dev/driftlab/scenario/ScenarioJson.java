package dev.driftlab.scenario;

import java.math.BigDecimal;
import java.math.RoundingMode;
import java.util.ArrayList;
import java.util.List;
import tools.jackson.core.JacksonException;
import tools.jackson.core.StreamReadFeature;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.SerializationFeature;
import tools.jackson.databind.json.JsonMapper;

/**
 * The scenario file format: JSON with metres, seconds and degrees, read into records in SI units
 * and radians. Reading reports every format problem at once (wrong types, missing or unknown keys,
 * numbers that are not finite, a newer format version) as a {@link ScenarioException}; semantic
 * checks are the {@link ScenarioValidator}'s job.
 */
public final class ScenarioJson {

    /** Name part of the {@code format} key. */
    public static final String FORMAT_NAME = "driftlab-scenario";
    /** Version this build reads and writes. */
    public static final int FORMAT_VERSION = 1;
    /** The full {@code format} value this build writes. */
    public static final String FORMAT = FORMAT_NAME + "/" + FORMAT_VERSION;

    static final JsonMapper MAPPER = JsonMapper.builder()
            .enable(SerializationFeature.INDENT_OUTPUT)
            .enable(StreamReadFeature.STRICT_DUPLICATE_DETECTION)
            .build();

    private ScenarioJson() {}

    /**
     * Reads a scenario document.
     *
     * @throws ScenarioException with every problem found when the document cannot be read
     */
    public static Scenario read(String json) {
        if (json == null) {
            throw new ScenarioException(List.of(Problem.error("(document)", "is empty")));
        }
        JsonNode root;
        try {
            root = MAPPER.readTree(json);
        } catch (JacksonException e) {
            throw new ScenarioException(List.of(Problem.error("(document)", JsonTrouble.describe(e))));
        }
        if (root == null || root.isMissingNode()) {
            throw new ScenarioException(List.of(Problem.error("(document)", "is empty")));
        }
        List<Problem> problems = new ArrayList<>();
        Scenario scenario;
        try {
            scenario = new ScenarioReader(problems).scenario(root);
        } catch (JacksonException e) {
            String path = JsonTrouble.path(e);
            problems.add(Problem.error(path.isEmpty() ? "(document)" : path, JsonTrouble.describe(e)));
            scenario = null;
        }
        if (problems.stream().anyMatch(Problem::isError) || scenario == null) {
            throw new ScenarioException(problems);
        }
        return scenario;
    }

    /** Name and version of a settings-variants document. */
    public static final String VARIANTS_FORMAT = "driftlab-variants/1";

    /**
     * Reads a settings-variants document, {@code {"format": "driftlab-variants/1", "variants": [...]}},
     * whose variants have the same shape as a scenario's {@code variants}: a name and the settings that
     * differ from the scenario's own.
     *
     * @param json the document
     * @param base the scenario the variants change
     * @throws ScenarioException with every problem found
     */
    public static List<SettingsVariant> readVariants(String json, Scenario base) {
        JsonNode root;
        try {
            root = MAPPER.readTree(json == null ? "" : json);
        } catch (JacksonException e) {
            throw new ScenarioException(List.of(Problem.error("(document)", JsonTrouble.describe(e))));
        }
        List<Problem> problems = new ArrayList<>();
        JsonFields f = JsonFields.of(root, "", problems);
        String format = f.requiredText("format", JsonFields.MAX_NAME);
        if (f.has("format") && !format.equals(VARIANTS_FORMAT)) {
            problems.add(Problem.error("format", "must be \"" + VARIANTS_FORMAT + "\", got \"" + format + "\""));
        }
        JsonNode baseNode = ScenarioWriter.localizer(base.localizer());
        ScenarioReader reader = new ScenarioReader(problems);
        List<SettingsVariant> variants;
        try {
            variants = f.list("variants", (n, p) -> reader.variant(n, p, baseNode));
        } catch (JacksonException e) {
            problems.add(Problem.error("(document)", JsonTrouble.describe(e)));
            variants = List.of();
        }
        f.finish();
        if (!f.has("variants")) {
            f.missing("variants");
        }
        for (int i = 0; i < variants.size(); i++) {
            problems.addAll(ScenarioValidator.validateSettings(
                    variants.get(i).settings(), base.rangefinder().beams(), "variants[" + i + "].localizer"));
        }
        if (problems.stream().anyMatch(Problem::isError)) {
            throw new ScenarioException(problems);
        }
        return variants;
    }

    /** Writes a scenario as an indented JSON document that {@link #read} reads back equal. */
    public static String write(Scenario s) {
        return MAPPER.writeValueAsString(ScenarioWriter.scenario(s));
    }

    /**
     * Localizer settings as the {@code localizer} section of a scenario file (degrees, file keys),
     * for passing settings to a localizer in another process.
     */
    public static JsonNode writeLocalizer(LocalizerSettings s) {
        return ScenarioWriter.localizer(s);
    }

    /**
     * Reads a {@code localizer} section written by {@link #writeLocalizer} and checks it as the
     * validator does.
     *
     * @param node the section
     * @param path where the section sits, for messages ("greeting.settings.localizer")
     * @param beams beams per scan of the rangefinder the settings are for
     * @throws ScenarioException with every problem found
     */
    public static LocalizerSettings readLocalizer(JsonNode node, String path, int beams) {
        List<Problem> problems = new ArrayList<>();
        LocalizerSettings s = new ScenarioReader(problems).localizer(JsonFields.of(node, path, problems));
        if (problems.stream().noneMatch(Problem::isError)) {
            problems.addAll(ScenarioValidator.validateSettings(s, beams, path));
        }
        if (problems.stream().anyMatch(Problem::isError)) {
            throw new ScenarioException(problems);
        }
        return s;
    }

    static double deg(double degrees) {
        return Math.toRadians(degrees);
    }

    /** Degrees rounded to 9 decimals so that file -> radians -> file gives the same text. */
    static double toDeg(double radians) {
        return BigDecimal.valueOf(Math.toDegrees(radians))
                .setScale(9, RoundingMode.HALF_EVEN)
                .doubleValue();
    }
}
