package dev.driftlab.report;

import dev.driftlab.evaluation.GateVerdict;
import java.util.List;
import java.util.Locale;

/**
 * Writes gate verdicts as a JUnit-style XML report so CI servers list each gate of each variant as
 * a test case: a failed gate is a failure with its reason, a cancelled batch an error.
 */
public final class JunitXml {

    private JunitXml() {}

    /** The XML document for a report. */
    public static String render(Report r) {
        List<GateVerdict> verdicts = r.verdicts();
        int failures = (int) verdicts.stream().filter(v -> !v.pass()).count();
        int errors = r.cancelled() ? 1 : 0;
        StringBuilder sb = new StringBuilder(1024);
        sb.append("<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n");
        String suite = "driftlab." + r.kind().name().toLowerCase(Locale.ROOT) + "."
                + slug(r.scenario().name());
        sb.append(String.format(
                Locale.ROOT,
                "<testsuite name=\"%s\" tests=\"%d\" failures=\"%d\" errors=\"%d\" skipped=\"0\" time=\"%.3f\" "
                        + "timestamp=\"%s\">%n",
                esc(suite),
                verdicts.size() + errors,
                failures,
                errors,
                r.seconds(),
                esc(r.generatedAt())));
        sb.append("  <properties>\n");
        property(sb, "scenario", r.scenario().name());
        property(sb, "source", r.source());
        property(sb, "trials", r.trials().size() + " of " + r.planned());
        property(sb, "verdict", r.verdict().word());
        for (String line : Findings.headline(r)) {
            property(sb, "finding", line);
        }
        property(sb, "caution", Report.CAUTION);
        sb.append("  </properties>\n");
        for (GateVerdict v : verdicts) {
            sb.append(String.format(
                    Locale.ROOT,
                    "  <testcase classname=\"%s.%s\" name=\"%s\" time=\"0\">",
                    esc(suite),
                    esc(slug(v.variant())),
                    esc(v.gate().id())));
            if (!v.pass()) {
                sb.append("\n    <failure message=\"")
                        .append(esc(v.reason()))
                        .append("\" type=\"")
                        .append(v.notExercised() ? "not-exercised" : "gate")
                        .append("\">")
                        .append(esc(v.reason()))
                        .append("</failure>\n  ");
            }
            sb.append("</testcase>\n");
        }
        if (r.cancelled()) {
            sb.append(String.format(
                    Locale.ROOT,
                    "  <testcase classname=\"%s\" name=\"complete\" time=\"0\">\n    <error message=\"cancelled after "
                            + "%d of %d trials\" type=\"cancelled\"/>\n  </testcase>\n",
                    esc(suite),
                    r.trials().size(),
                    r.planned()));
        }
        sb.append("</testsuite>\n");
        return sb.toString();
    }

    /**
     * The XML document for a suite: one test suite per scenario, one test case per gate and column
     * (the scenario as it is, then each profile). A failing gate is a failure with its reason (and,
     * for a regression, what it was in the baseline); under a profile that makes the scenario
     * invalid every gate is a failure naming the validator's first problem; a cancelled run adds an
     * error.
     */
    public static String render(SuiteReport r) {
        dev.driftlab.trial.SuiteResult res = r.result();
        java.util.Map<String, dev.driftlab.evaluation.GateChange> regressions = new java.util.HashMap<>();
        for (dev.driftlab.evaluation.GateChange c : r.regressions()) {
            regressions.put(
                    c.after().scenario()
                            + '\u0000'
                            + c.after().column()
                            + '\u0000'
                            + c.after().gate(),
                    c);
        }
        StringBuilder sb = new StringBuilder(4096);
        sb.append("<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n");
        sb.append(String.format(
                Locale.ROOT,
                "<testsuites name=\"%s\" time=\"%.3f\">%n",
                esc("driftlab.suite." + slug(r.name())),
                res.seconds()));
        for (dev.driftlab.trial.SuiteResult.Row row : res.rows()) {
            String suite = "driftlab.suite." + slug(r.name()) + "." + slug(row.name());
            StringBuilder cases = new StringBuilder();
            int tests = 0;
            int failures = 0;
            for (dev.driftlab.trial.SuitePlan.Cell c : row.plan().cells()) {
                if (c.invalid()) {
                    String why = "the profile makes the scenario invalid: "
                            + c.problems().get(0).path() + ": "
                            + c.problems().get(0).message();
                    for (dev.driftlab.scenario.Gate g : row.gates()) {
                        tests++;
                        failures++;
                        testcase(cases, suite, g.id() + " [" + c.name() + "]", "invalid", why);
                    }
                    continue;
                }
                for (GateVerdict v : row.column(c.name())
                        .map(dev.driftlab.evaluation.VariantSummary::gates)
                        .orElse(List.of())) {
                    tests++;
                    String message = null;
                    String type = null;
                    if (!v.pass()) {
                        failures++;
                        var reg = regressions.get(row.name()
                                + '\u0000'
                                + c.name()
                                + '\u0000'
                                + v.gate().id());
                        type = reg != null ? "regression" : v.notExercised() ? "not-exercised" : "gate";
                        message = (reg != null
                                        ? "regression: held in the baseline ("
                                                + reg.before().counts() + "), fails now; "
                                        : "")
                                + v.reason();
                    }
                    testcase(cases, suite, v.gate().id() + " [" + c.name() + "]", type, message);
                }
            }
            int errors = res.cancelled() ? 1 : 0;
            sb.append(String.format(
                    Locale.ROOT,
                    "  <testsuite name=\"%s\" tests=\"%d\" failures=\"%d\" errors=\"%d\" skipped=\"0\" time=\"0\" "
                            + "timestamp=\"%s\">%n",
                    esc(suite),
                    tests + errors,
                    failures,
                    errors,
                    esc(r.generatedAt())));
            sb.append("    <properties>\n");
            sb.append("  ");
            property(sb, "scenario", row.name());
            sb.append("  ");
            property(sb, "source", row.plan().entry().source());
            sb.append("  ");
            property(sb, "suite verdict", r.verdict().word());
            sb.append("  ");
            property(sb, "caution", Report.CAUTION);
            sb.append("    </properties>\n");
            sb.append(cases);
            if (errors > 0) {
                sb.append(String.format(
                        Locale.ROOT,
                        "    <testcase classname=\"%s\" name=\"complete\" time=\"0\">\n      <error message=\"cancelled "
                                + "after %d of %d trials\" type=\"cancelled\"/>\n    </testcase>\n",
                        esc(suite),
                        res.finished(),
                        res.planned()));
            }
            sb.append("  </testsuite>\n");
        }
        sb.append("</testsuites>\n");
        return sb.toString();
    }

    private static void testcase(StringBuilder sb, String suite, String name, String type, String message) {
        sb.append(String.format(
                Locale.ROOT, "    <testcase classname=\"%s\" name=\"%s\" time=\"0\">", esc(suite), esc(name)));
        if (message != null) {
            sb.append("\n      <failure message=\"")
                    .append(esc(message))
                    .append("\" type=\"")
                    .append(type)
                    .append("\">")
                    .append(esc(message))
                    .append("</failure>\n    ");
        }
        sb.append("</testcase>\n");
    }

    private static void property(StringBuilder sb, String name, String value) {
        sb.append("    <property name=\"")
                .append(esc(name))
                .append("\" value=\"")
                .append(esc(value))
                .append("\"/>\n");
    }

    static String slug(String s) {
        String t = s.toLowerCase(Locale.ROOT).replaceAll("[^a-z0-9]+", "-").replaceAll("(^-|-$)", "");
        return t.isEmpty() ? "unnamed" : t;
    }

    static String esc(String s) {
        return SitePlanSvg.esc(s);
    }
}
