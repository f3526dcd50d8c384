package dev.driftlab.report;

import java.util.List;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.node.ObjectNode;

/**
 * Result documents without what depends on when and how fast they were made: the time made, the
 * seconds taken and the localizer's answer times (measurements of the machine, not of the trials).
 * Everything else of two makings of the same trials must be equal.
 */
public final class ResultDocs {

    private ResultDocs() {}

    /** A copy of a result document without its timings. */
    public static JsonNode withoutTimings(JsonNode result) {
        ObjectNode n = (ObjectNode) result.deepCopy();
        n.remove(List.of("generatedAt", "seconds"));
        if (n.get("localizer") instanceof ObjectNode l) {
            l.remove(List.of("answerTimeP50", "answerTimeWorstP99", "trialsOverScanPeriod"));
        }
        for (JsonNode t : n.path("trials")) {
            ((ObjectNode) t).remove(List.of("answerTimeP50", "answerTimeP99"));
        }
        return n;
    }

    /** A copy of one trial of a result document without its answer times. */
    public static JsonNode untimedTrial(JsonNode trial) {
        ObjectNode t = (ObjectNode) trial.deepCopy();
        t.remove(List.of("answerTimeP50", "answerTimeP99"));
        return t;
    }
}
