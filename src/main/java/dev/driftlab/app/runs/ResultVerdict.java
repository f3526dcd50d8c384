package dev.driftlab.app.runs;

import dev.driftlab.evaluation.Verdict;
import java.util.Optional;
import tools.jackson.core.JacksonException;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;

/**
 * The verdict written in a stored result document, for runs stored before the verdict had a column
 * of its own: format 2 names it ({@code "verdict": "ended-early"}); format 1 only said whether every
 * gate passed ({@code "passed"}), which for a run that finished is pass or fail.
 */
public final class ResultVerdict {

    private static final JsonMapper MAPPER = JsonMapper.builder().build();

    private ResultVerdict() {}

    /** The verdict of the document, or empty when it names none or does not read. */
    public static Optional<Verdict> of(String resultJson) {
        JsonNode doc;
        try {
            doc = MAPPER.readTree(resultJson);
        } catch (JacksonException e) {
            return Optional.empty();
        }
        if (doc == null || !doc.isObject()) {
            return Optional.empty();
        }
        JsonNode named = doc.path("verdict");
        if (named.isString()) {
            return Verdict.byFileName(named.asString());
        }
        JsonNode passed = doc.path("passed");
        if (passed.isBoolean()) {
            return Optional.of(passed.asBoolean() ? Verdict.PASS : Verdict.FAIL);
        }
        return Optional.empty();
    }
}
