package dev.driftlab.report;

import dev.driftlab.evaluation.EarlyEnds;
import dev.driftlab.evaluation.FaultTally;
import dev.driftlab.evaluation.GateVerdict;
import java.util.ArrayList;
import java.util.List;

/**
 * What a reader must know before trusting a report's verdict: trials that ended before their
 * route did, scheduled faults that did not fire in every trial, and gates no trial exercised. Every
 * renderer (HTML, PDF, JUnit XML, the web pages) opens with these lines.
 */
public final class Findings {

    private Findings() {}

    /** Early ends over every trial of the report, most frequent first. */
    public static List<EarlyEnds> earlyEnds(Report r) {
        return EarlyEnds.of(r.trials());
    }

    /** How often each scheduled fault fired over every trial of the report. */
    public static List<FaultTally> faults(Report r) {
        return FaultTally.of(r.trials());
    }

    /** The headline findings as sentences; empty when every trial drove its route, every fault fired and every gate was exercised. */
    public static List<String> headline(Report r) {
        List<String> out = new ArrayList<>();
        for (EarlyEnds e : earlyEnds(r)) {
            out.add(e.sentence() + ".");
        }
        for (FaultTally f : faults(r)) {
            if (f.missed()) {
                out.add("Fault \"" + f.id() + "\" " + f.sentence()
                        + (f.reasons().isEmpty() ? "" : " (" + String.join("; ", f.reasons()) + ")") + ".");
            }
        }
        for (GateVerdict v : r.verdicts()) {
            if (v.notExercised()) {
                out.add("Gate \"" + v.gate().id() + "\" (" + v.variant() + ") was " + v.reason() + ".");
            }
        }
        return out;
    }
}
