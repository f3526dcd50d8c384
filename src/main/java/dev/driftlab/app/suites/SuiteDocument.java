package dev.driftlab.app.suites;

import java.util.List;
import tools.jackson.core.JacksonException;
import tools.jackson.databind.DeserializationFeature;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;

/**
 * A suite as stored in a revision and sent to the API: its name, default seed count and first
 * seed, the scenarios (each by its link, at its latest revision or pinned to one, with its own seed
 * count if given) and the profiles (each a {@code driftlab-profile/1} document, as in a profile
 * file). Stored documents name each scenario by its view token, never an edit token.
 *
 * @param name the suite's name
 * @param description what it is for; may be null
 * @param seeds seeds per scenario unless the entry says otherwise; null for {@link #DEFAULT_SEEDS}
 * @param firstSeed the first seed; null for 1
 * @param scenarios the entries
 * @param profiles the profiles, in column order; null for none
 */
public record SuiteDocument(
        String name,
        String description,
        Integer seeds,
        Long firstSeed,
        List<Entry> scenarios,
        List<JsonNode> profiles) {

    /** Seeds per scenario when the suite names none. */
    public static final int DEFAULT_SEEDS = 10;

    /**
     * One scenario of the suite.
     *
     * @param link the scenario's link (a view or edit token, or a URL ending in one); stored as the
     *     view token
     * @param revision the pinned revision, null for the latest at each run
     * @param seeds this scenario's seed count, null for the suite's
     */
    public record Entry(String link, Integer revision, Integer seeds) {}

    private static final JsonMapper MAPPER = JsonMapper.builder()
            .enable(DeserializationFeature.FAIL_ON_UNKNOWN_PROPERTIES)
            .build();

    /** Lists never null. */
    public SuiteDocument {
        scenarios = scenarios == null ? List.of() : List.copyOf(scenarios);
        profiles = profiles == null ? List.of() : List.copyOf(profiles);
    }

    /** The seed count of an entry. */
    public int seedsOf(Entry e) {
        return e.seeds() != null ? e.seeds() : seeds != null ? seeds : DEFAULT_SEEDS;
    }

    /** The first seed. */
    public long first() {
        return firstSeed == null ? 1 : firstSeed;
    }

    /** The document as stored. */
    public String toJson() {
        return MAPPER.writeValueAsString(this);
    }

    /**
     * Reads a document.
     *
     * @throws SuiteRefused naming what could not be read
     */
    public static SuiteDocument read(String json) {
        try {
            SuiteDocument d = MAPPER.readValue(json, SuiteDocument.class);
            if (d == null) {
                throw SuiteRefused.of("(document)", "is empty");
            }
            return d;
        } catch (JacksonException e) {
            throw SuiteRefused.of("(document)", dev.driftlab.scenario.JsonTrouble.describe(e));
        }
    }
}
