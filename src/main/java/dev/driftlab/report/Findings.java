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

    /**
     * What went wrong with an outside localizer, one sentence per kind of trouble ("crash"), with
     * how many trials and the first such trial's message (its first line; the trial rows and the
     * result document have the error output too).
     */
    static List<String> localizerTrouble(Report r) {
        java.util.Map<String, List<dev.driftlab.evaluation.TrialOutcome>> byKind = new java.util.TreeMap<>();
        for (dev.driftlab.evaluation.TrialOutcome t : r.trials()) {
            if (!t.localizerTrouble().isEmpty()) {
                String kind = t.localizerTrouble()
                        .substring(0, Math.max(0, t.localizerTrouble().indexOf(':')));
                byKind.computeIfAbsent(kind, k -> new ArrayList<>()).add(t);
            }
        }
        List<String> out = new ArrayList<>();
        byKind.forEach((kind, ts) -> {
            dev.driftlab.evaluation.TrialOutcome first = ts.get(0);
            String line = first.localizerTrouble().lines().findFirst().orElse("");
            out.add(String.format(
                    java.util.Locale.ROOT,
                    "The localizer failed (%s) in %d of %d trials; seed %d: %s.",
                    kind,
                    ts.size(),
                    r.trials().size(),
                    first.seed(),
                    line));
        });
        return out;
    }

    /** The headline findings as sentences; empty when every trial drove its route, every fault fired and every gate was exercised. */
    public static List<String> headline(Report r) {
        List<String> out = new ArrayList<>();
        for (EarlyEnds e : earlyEnds(r)) {
            out.add(e.sentence() + ".");
        }
        out.addAll(localizerTrouble(r));
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
