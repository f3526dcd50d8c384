package dev.driftlab.app.runs.web;

import java.util.ArrayList;
import java.util.List;

/**
 * The run form: which variants, which seeds.
 *
 * @param variants settings variant names
 * @param firstSeed first seed
 * @param seedCount how many consecutive seeds
 * @param recordFrames whether to record frames for the player
 * @param particleCounts particle counts of a sweep, separated by commas or spaces; blank for none
 * @param localizer an outside localizer's name from the server's list; blank for the built-in one
 */
record RunForm(
        List<String> variants,
        Long firstSeed,
        Integer seedCount,
        Boolean recordFrames,
        String particleCounts,
        String localizer) {

    /** The chosen outside localizer, or null for the built-in one; refused when it cannot be a name. */
    String localizerName() {
        return dev.driftlab.app.runs.LocalizerAllowList.requestedName(localizer);
    }

    List<String> variantsOrBase() {
        return variants == null || variants.isEmpty() ? List.of("base") : variants;
    }

    /** Consecutive seeds, refused with a message naming the field for a bad count or first seed. */
    List<Long> seeds() {
        return dev.driftlab.app.runs.RunQueue.consecutiveSeeds(
                firstSeed == null ? 1 : firstSeed, seedCount == null ? 1 : seedCount);
    }

    /** Whether the form asks for a particle-count sweep. */
    boolean sweep() {
        return particleCounts != null && !particleCounts.isBlank();
    }

    /** The sweep's particle counts, refused with a message naming the field when one is not a count. */
    List<Integer> counts() {
        return countsOf(particleCounts);
    }

    /** Particle counts typed as {@code 300, 1000 3000}. */
    static List<Integer> countsOf(String text) {
        List<Integer> out = new ArrayList<>();
        for (String part : text.trim().split("[,\\s]+")) {
            if (part.isEmpty()) {
                continue;
            }
            try {
                out.add(Integer.parseInt(part.replace("_", "")));
            } catch (NumberFormatException e) {
                throw new dev.driftlab.app.runs.RunRefused(
                        "particleCounts", "'" + shorten(part) + "' is not a whole number");
            }
        }
        return out;
    }

    /** The seed of a replay request, refused with a message naming the field when not a whole number. */
    static long seedOf(String text) {
        if (text == null || text.isBlank()) {
            throw new dev.driftlab.app.runs.RunRefused("seed", "name the seed to replay, one of the run's seeds");
        }
        try {
            return Long.parseLong(text.strip());
        } catch (NumberFormatException e) {
            throw new dev.driftlab.app.runs.RunRefused("seed", "'" + shorten(text) + "' is not a whole number");
        }
    }

    private static String shorten(String text) {
        return text.length() > 40 ? text.substring(0, 40) + "..." : text;
    }

    boolean frames() {
        return Boolean.TRUE.equals(recordFrames);
    }
}
