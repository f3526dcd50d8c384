package dev.driftlab.evaluation;

import dev.driftlab.scenario.GateMetric;
import java.util.List;
import java.util.Locale;

/**
 * The verdict of a run, batch or sweep at a glance, as a word and a symbol so it never depends on
 * colour. Every verdict but {@link #PASS} fails a CI job.
 */
public enum Verdict {
    /** Every gate held on trials that exercised it. */
    PASS("pass", "\u2713"),
    /** A gate failed on trials that exercised it. */
    FAIL("fail", "\u2717"),
    /** No gate failed on its merits, but trials ended before their route did. */
    ENDED_EARLY("ended early", "\u25D1"),
    /** No gate failed on its merits, but a gate was exercised by no trial: nothing was tested. */
    NOT_EXERCISED("not exercised", "\u2205"),
    /** The work was cancelled or interrupted before every trial ran. */
    INCOMPLETE("incomplete", "\u2026");

    private final String word;
    private final String symbol;

    Verdict(String word, String symbol) {
        this.word = word;
        this.symbol = symbol;
    }

    /** The verdict in words: "not exercised". */
    public String word() {
        return word;
    }

    /** A symbol that goes beside the word (never alone): a tick, a cross, an empty set. */
    public String symbol() {
        return symbol;
    }

    /** The name in result files: "not-exercised". */
    public String fileName() {
        return name().toLowerCase(Locale.ROOT).replace('_', '-');
    }

    /** The verdict named as in result files, if any. */
    public static java.util.Optional<Verdict> byFileName(String name) {
        for (Verdict v : values()) {
            if (v.fileName().equals(name)) {
                return java.util.Optional.of(v);
            }
        }
        return java.util.Optional.empty();
    }

    /**
     * The verdict of gate results: a gate that failed on trials that exercised it makes it {@link
     * #FAIL}; otherwise a failing route or contact gate makes it {@link #ENDED_EARLY}, and a gate
     * no trial exercised {@link #NOT_EXERCISED}.
     *
     * @param verdicts every gate of every variant
     * @param complete whether every planned trial ran
     */
    public static Verdict of(List<GateVerdict> verdicts, boolean complete) {
        if (!complete) {
            return INCOMPLETE;
        }
        boolean early = false;
        boolean unexercised = false;
        for (GateVerdict v : verdicts) {
            if (v.pass()) {
                continue;
            }
            GateMetric m = v.gate().metric();
            if (v.notExercised()) {
                unexercised = true;
            } else if (m == GateMetric.ROUTE_COMPLETED || m == GateMetric.NO_CONTACT) {
                early = true;
            } else {
                return FAIL;
            }
        }
        return early ? ENDED_EARLY : unexercised ? NOT_EXERCISED : PASS;
    }
}
