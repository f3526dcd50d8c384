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
