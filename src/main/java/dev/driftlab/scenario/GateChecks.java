package dev.driftlab.scenario;

import java.util.HashMap;
import java.util.List;
import java.util.Map;

/** The validator's checks of the gates: bounds in the metric's unit, shares, and gates no trial exercises. */
final class GateChecks {

    private GateChecks() {}

    static void check(Scenario s, List<Problem> problems) {
        List<Gate> gs = s.gates();
        if (gs.size() > Limits.MAX_GATES) {
            problems.add(Problem.error(
                    "gates", "has " + gs.size() + " gates; at most " + Limits.MAX_GATES + " are allowed"));
            return;
        }
        Findings out = new Findings(problems);
        Map<String, String> ids = new HashMap<>();
        boolean hasKidnap = s.faults().stream().anyMatch(f -> FaultKind.of(f) == FaultKind.KIDNAP);
        for (int i = 0; i < gs.size(); i++) {
            Gate g = gs.get(i);
            String p = "gates[" + i + "]";
            out.uniqueId(ids, g.id(), p);
            switch (g.metric().unit()) {
                case "s" -> out.positive(g.bound(), Limits.MAX_RUN_SECONDS, p + ".bound", "s");
                case "m" -> out.positive(g.bound(), Limits.MAX_SITE_EXTENT, p + ".bound", "m");
                case "contacts" -> {
                    if (!(g.bound() >= 0
                            && g.bound() <= Limits.MAX_GATE_CONTACTS
                            && g.bound() == Math.rint(g.bound()))) {
                        problems.add(Problem.error(
                                p + ".bound",
                                Findings.fmt(g.bound()) + " must be a whole number of contacts from 0 to "
                                        + Limits.MAX_GATE_CONTACTS + " (0: the robot touches nothing)"));
                    }
                }
                default -> {
                    if (g.bound() != 0) {
                        problems.add(Problem.error(
                                p + ".bound", g.metric().fileName() + " takes no bound; leave it out or write 0"));
                    }
                }
            }
            if (!(g.share() > 0 && g.share() <= 1)) {
                problems.add(Problem.error(
                        p + ".share",
                        Findings.fmt(g.share()) + " must be more than 0 and at most 1 (e.g. 0.9 for 90 % of trials)"));
            }
            if (g.metric() == GateMetric.RECOVERY_TIME && !hasKidnap) {
                problems.add(Problem.warning(
                        p + ".metric",
                        "recovery-time gate, but the scenario has no kidnap fault; no trial will exercise it, so it"
                                + " will fail"));
            }
            if ((g.metric() == GateMetric.ROUTE_COMPLETED || g.metric() == GateMetric.NO_CONTACT)
                    && s.route().contactAllowed()) {
                problems.add(Problem.warning(
                        p + ".metric",
                        g.metric().fileName() + " gate, but route.contactAllowed is true; the gate still judges"
                                + " every trial"));
            }
        }
    }
}
