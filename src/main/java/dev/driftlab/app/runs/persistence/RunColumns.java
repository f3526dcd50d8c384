package dev.driftlab.app.runs.persistence;

import com.fasterxml.jackson.annotation.JsonInclude;
import java.util.Arrays;
import java.util.List;
import tools.jackson.core.JacksonException;
import tools.jackson.databind.DeserializationFeature;
import tools.jackson.databind.json.JsonMapper;

/**
 * The two JSON columns of a run, its options and its seeds, written and read by data binding so
 * the format lives in two records instead of in string concatenation and a regular expression.
 */
public final class RunColumns {

    /**
     * A run's options as stored.
     *
     * @param recordFrames whether the run keeps frames for the player
     * @param particles fixed particle count of a sweep run, 0 (not written) for the variant's own
     * @param localizer name of the outside localizer the run judges (one of the administrator's
     *     allow-list), null (not written) for the built-in one
     */
    public record Options(
            boolean recordFrames,
            @JsonInclude(JsonInclude.Include.NON_DEFAULT) int particles,
            @JsonInclude(JsonInclude.Include.NON_NULL) String localizer) {

        /** Options of a run of the built-in localizer. */
        public Options(boolean recordFrames, int particles) {
            this(recordFrames, particles, null);
        }
    }

    // unknown keys are skipped so that a row written by a later version still reads; a missing
    // particle count is the variant's own (0), which Jackson 3 would otherwise refuse for an int
    private static final JsonMapper MAPPER = JsonMapper.builder()
            .disable(DeserializationFeature.FAIL_ON_UNKNOWN_PROPERTIES)
            .disable(DeserializationFeature.FAIL_ON_NULL_FOR_PRIMITIVES)
            .build();

    private RunColumns() {}

    public static String optionsJson(Options options) {
        return MAPPER.writeValueAsString(options);
    }

    /**
     * The options of a stored run; an empty column is no frames and the variant's own particles.
     *
     * @throws IllegalArgumentException when the column does not read (this code never wrote it)
     */
    public static Options options(String json) {
        if (json == null || json.isBlank()) {
            return new Options(false, 0);
        }
        try {
            Options o = MAPPER.readValue(json, Options.class);
            if (o == null) {
                throw new IllegalArgumentException("stored options are null");
            }
            return o;
        } catch (JacksonException e) {
            throw new IllegalArgumentException("stored options do not read: " + clip(json), e);
        }
    }

    public static String seedsJson(List<Long> seeds) {
        return MAPPER.writeValueAsString(seeds);
    }

    /**
     * The seeds of a stored run: a JSON array, or for runs stored before seeds were JSON, the
     * comma-separated text they were then.
     *
     * @throws IllegalArgumentException when the column is neither
     */
    public static List<Long> seeds(String text) {
        String t = text == null ? "" : text.strip();
        if (t.isEmpty()) {
            return List.of();
        }
        try {
            if (t.startsWith("[")) {
                return List.of(MAPPER.readValue(t, Long[].class));
            }
            return Arrays.stream(t.split(","))
                    .map(String::strip)
                    .map(Long::valueOf)
                    .toList();
        } catch (JacksonException | NumberFormatException | NullPointerException e) {
            throw new IllegalArgumentException("stored seeds do not read: " + clip(t), e);
        }
    }

    private static String clip(String s) {
        return s.length() <= 80 ? s : s.substring(0, 80) + "...";
    }
}
