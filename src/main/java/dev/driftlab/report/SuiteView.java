package dev.driftlab.report;

import dev.driftlab.evaluation.GateChange;
import dev.driftlab.evaluation.GateVerdict;
import dev.driftlab.evaluation.PairedComparison;
import dev.driftlab.evaluation.VariantSummary;
import dev.driftlab.evaluation.Verdict;
import dev.driftlab.scenario.Problem;
import dev.driftlab.scenario.Profile;
import dev.driftlab.trial.SuitePlan;
import dev.driftlab.trial.SuiteResult;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Optional;

/**
 * The view model of the suite report page ({@code report-templates/suite.html}): every figure
 * computed and every number formatted here, so the template only lays text out. Verdicts are
 * always a word with a symbol beside it, never a colour alone.
 */
public final class SuiteView {

    /** The verdict at the top: symbol (hidden from screen readers, the word says it), word, reason. */
    public record Badge(boolean pass, String symbol, String word, String text) {}

    /** One gate in a matrix cell: symbol, word, gate id and passing of exercised trials. */
    public record CellGate(boolean pass, String symbol, String word, String id, String counts) {}

    /**
     * One cell of the matrix.
     *
     * @param column its column
     * @param invalid whether the profile made the scenario invalid
     * @param gates the gates' verdicts, when it ran
     * @param problems the validator's errors, when invalid
     */
    public record Cell(String column, boolean invalid, List<CellGate> gates, List<String> problems) {}

    /** One scenario of the matrix. */
    public record Row(String name, String source, String seeds, List<Cell> cells) {}

    /** A gate whose verdict changed, formatted. */
    public record ChangeRow(
            String scenario,
            String column,
            String against,
            String gate,
            String before,
            String now,
            String difference,
            String pairs) {}

    /** A profile against the scenario as it is, on the same seeds. */
    public record PairRow(String scenario, String profile, int pairs, String rmse, String recovery) {}

    /** A gate's verdict with its reason, for the detail table. */
    public record ReasonRow(String scenario, String column, String id, String verdict, String reason) {}

    /** A term and its definition, or a fact and its value. */
    public record Entry(String name, String text) {}

    private final SuiteReport r;

    SuiteView(SuiteReport r) {
        this.r = r;
    }

    /** The view of a report, for pages that lay it out themselves (the web app's suite run page). */
    public static SuiteView of(SuiteReport r) {
        return new SuiteView(r);
    }

    public String title() {
        return "Suite report: " + r.name();
    }

    public String caution() {
        return Report.CAUTION;
    }

    public Badge badge() {
        Verdict v = r.verdict();
        SuiteResult res = r.result();
        String text = switch (v) {
            case PASS ->
                r.regressions().isEmpty()
                        ? "every gate of every scenario holds, as it is and under every profile"
                        : "gates regressed against the baseline";
            case FAIL -> "a gate fails on trials that exercised it";
            case ENDED_EARLY -> "trials ended before their route did";
            case NOT_EXERCISED ->
                res.invalidCells().isEmpty()
                        ? "a gate was exercised by no trial"
                        : "a profile made a scenario invalid, so its gates were not tested";
            case INCOMPLETE -> "not every trial ran (stopped early)";
        };
        int reg = r.regressions().size();
        if (reg > 0) {
            text += "; " + reg + (reg == 1 ? " gate regressed" : " gates regressed") + " against the baseline";
        }
        return new Badge(r.passed(), v.symbol(), v.word(), text);
    }

    public List<Entry> facts() {
        SuiteResult res = r.result();
        List<Entry> out = new ArrayList<>();
        out.add(new Entry("Suite source", r.source()));
        if (!r.description().isEmpty()) {
            out.add(new Entry("About", r.description()));
        }
        out.add(new Entry("Localizer", r.outsideLocalizer() ? "outside: " + r.localizer() : "built-in"));
        out.add(new Entry("Scenarios", Integer.toString(res.rows().size())));
        out.add(new Entry(
                "Profiles",
                res.plan().profiles().isEmpty()
                        ? "none (scenarios as they are only)"
                        : String.join(
                                ", ",
                                res.plan().profiles().stream()
                                        .map(Profile::name)
                                        .toList())));
        out.add(new Entry("Trials", res.finished() + " of " + res.planned() + (res.cancelled() ? " (cancelled)" : "")));
        out.add(new Entry("Gates holding", res.gatesPassing() + " of " + res.gatesPlanned()));
        out.add(new Entry(
                "Baseline",
                r.baseline().map(b -> "the run of " + b.generatedAt()).orElse("none given")));
        out.add(new Entry("Generated", r.generatedAt()));
        out.add(new Entry("Time taken", String.format(Locale.ROOT, "%.1f s", res.seconds())));
        out.add(new Entry(
                "Settings run", "each scenario's base settings; its settings variants are not run in a suite"));
        return out;
    }

    public List<String> findings() {
        List<String> out = new ArrayList<>();
        SuiteResult res = r.result();
        if (res.cancelled()) {
            out.add("The run stopped after " + res.finished() + " of " + res.planned() + " trials.");
        }
        for (SuiteResult.Row row : res.rows()) {
            for (SuitePlan.Cell c : row.plan().cells()) {
                if (c.invalid()) {
                    out.add("Profile \"" + c.name() + "\" makes \"" + row.name() + "\" invalid ("
                            + c.problems().get(0).path() + ": "
                            + c.problems().get(0).message()
                            + "); its gates were not tested under it.");
                }
            }
        }
        int reg = r.regressions().size();
        if (reg > 0) {
            out.add(reg + (reg == 1 ? " gate" : " gates") + " held in the baseline and fail now.");
        }
        r.baseline().ifPresent(b -> {
            if (!b.suite().equals(r.name())) {
                out.add("The baseline is a run of another suite (\"" + b.suite()
                        + "\"); only scenarios, columns and gates of the same names are compared.");
            }
        });
        return out;
    }

    public List<String> columns() {
        return r.result().plan().columns();
    }

    public List<Row> matrix() {
        List<Row> out = new ArrayList<>();
        for (SuiteResult.Row row : r.result().rows()) {
            List<Cell> cells = new ArrayList<>();
            for (SuitePlan.Cell c : row.plan().cells()) {
                if (c.invalid()) {
                    cells.add(new Cell(
                            c.name(),
                            true,
                            List.of(),
                            c.problems().stream()
                                    .map(p -> p.path() + ": " + p.message())
                                    .toList()));
                    continue;
                }
                List<CellGate> gates = new ArrayList<>();
                Optional<VariantSummary> v = row.column(c.name());
                v.ifPresent(s -> {
                    for (GateVerdict g : s.gates()) {
                        Verdict w = Verdict.of(List.of(g), true);
                        gates.add(new CellGate(
                                g.pass(),
                                w.symbol(),
                                w.word(),
                                g.gate().id(),
                                g.passed() + " of " + g.exercised() + " exercised (" + g.trials() + " trials)"));
                    }
                });
                cells.add(new Cell(c.name(), false, gates, List.of()));
            }
            long[] seeds = row.plan().entry().seeds();
            String seedText = seeds.length == 1
                    ? "seed " + seeds[0]
                    : "seeds " + seeds[0] + " to " + seeds[seeds.length - 1] + " (" + seeds.length + ")";
            out.add(new Row(row.name(), row.plan().entry().source(), seedText, cells));
        }
        return out;
    }

    public boolean hasBaseline() {
        return r.baseline().isPresent();
    }

    public List<ChangeRow> baselineRegressions() {
        return rows(r.baselineChanges(), true);
    }

    public List<ChangeRow> baselineImprovements() {
        return rows(r.baselineChanges(), false);
    }

    public List<ChangeRow> profileRegressions() {
        return rows(r.profileChanges(), true);
    }

    public List<ChangeRow> profileImprovements() {
        return rows(r.profileChanges(), false);
    }

    public boolean hasProfiles() {
        return !r.result().plan().profiles().isEmpty();
    }

    private static List<ChangeRow> rows(List<GateChange> changes, boolean regressions) {
        List<ChangeRow> out = new ArrayList<>();
        for (GateChange c : changes) {
            if (c.regression() != regressions) {
                continue;
            }
            out.add(new ChangeRow(
                    c.after().scenario(),
                    c.after().column(),
                    c.before().column(),
                    c.after().gate(),
                    word(c.before().pass()) + ", " + c.before().counts(),
                    word(c.after().pass()) + ", " + c.after().counts(),
                    difference(c),
                    Integer.toString(c.pairs())));
        }
        return out;
    }

    private static String word(boolean pass) {
        return pass ? "\u2713 pass" : "\u2717 fail";
    }

    private static String difference(GateChange c) {
        if (c.pairs() == 0) {
            return "no seed exercised the gate in both";
        }
        String d = String.format(Locale.ROOT, "%+.1f points", c.difference() * 100);
        if (Double.isNaN(c.low())) {
            return d + " (one pair: no interval)";
        }
        return d + String.format(Locale.ROOT, " (95 %% interval %+.1f to %+.1f)", c.low() * 100, c.high() * 100);
    }

    public List<PairRow> pairs() {
        List<PairRow> out = new ArrayList<>();
        for (SuiteResult.Row row : r.result().rows()) {
            for (PairedComparison p : row.summary().comparisons()) {
                out.add(new PairRow(
                        row.name(),
                        p.variant(),
                        p.pairs(),
                        signed(p.rmseDifference(), p.rmseLow(), p.rmseHigh(), " m", 1),
                        signed(
                                p.recoveryShareDifference(),
                                p.recoveryShareLow(),
                                p.recoveryShareHigh(),
                                " points",
                                100)));
            }
        }
        return out;
    }

    private static String signed(double v, double lo, double hi, String unit, double scale) {
        if (Double.isNaN(v)) {
            return "n/a";
        }
        String s = String.format(Locale.ROOT, "%+.3f%s", v * scale, unit);
        return Double.isNaN(lo) ? s : s + String.format(Locale.ROOT, " (%+.3f to %+.3f)", lo * scale, hi * scale);
    }

    /** Whether there is a trend to draw: the baseline chain plus this run. */
    public boolean hasTrend() {
        return !r.history().isEmpty();
    }

    /** The passing share over the last runs, oldest first, ending with this run. */
    public String trendChart() {
        List<SuiteReport.TrendPoint> points = new ArrayList<>(r.history());
        points.add(r.point());
        double[] x = new double[points.size()];
        double[] y = new double[points.size()];
        for (int i = 0; i < points.size(); i++) {
            x[i] = i + 1;
            y[i] = points.get(i).share() * 100;
        }
        return SvgChart.lines(
                "Share of passing gates, last " + points.size() + " runs (this run last)",
                "run (oldest first)",
                "passing gates (%)",
                x,
                List.of(new SvgChart.Series("passing gates", y)),
                new double[0],
                "");
    }

    /** The trend's figures in words, so the plot is never the only way to read them. */
    public List<Entry> trendPoints() {
        List<SuiteReport.TrendPoint> points = new ArrayList<>(r.history());
        points.add(r.point());
        List<Entry> out = new ArrayList<>();
        for (int i = 0; i < points.size(); i++) {
            SuiteReport.TrendPoint p = points.get(i);
            out.add(new Entry(
                    (i == points.size() - 1 ? "this run, " : "") + p.generatedAt(),
                    p.passing() + " of " + p.gates() + " gates ("
                            + (Double.isNaN(p.share()) ? "n/a" : String.format(Locale.ROOT, "%.1f %%", p.share() * 100))
                            + ")"));
        }
        return out;
    }

    public List<Entry> profiles() {
        List<Entry> out = new ArrayList<>();
        for (Profile p : r.result().plan().profiles()) {
            String about = p.description().isEmpty() ? "" : p.description() + " Changes: ";
            out.add(new Entry(p.name(), about + String.join("; ", p.changedFields())));
        }
        return out;
    }

    public List<ReasonRow> reasons() {
        List<ReasonRow> out = new ArrayList<>();
        for (SuiteResult.Row row : r.result().rows()) {
            for (VariantSummary v : row.summary().variants()) {
                for (GateVerdict g : v.gates()) {
                    Verdict w = Verdict.of(List.of(g), true);
                    out.add(new ReasonRow(
                            row.name(), v.variant(), g.gate().id(), w.symbol() + " " + w.word(), g.reason()));
                }
            }
            for (SuitePlan.Cell c : row.plan().cells()) {
                for (Problem p : c.invalid() ? c.problems() : List.<Problem>of()) {
                    out.add(new ReasonRow(row.name(), c.name(), p.path(), "invalid", p.message()));
                }
            }
        }
        return out;
    }

    public List<Entry> glossary() {
        return List.of(
                new Entry(
                        "Profile",
                        "a named set of changes to the robot, rangefinder and localizer settings, applied on top of"
                                + " every scenario of the suite; the scenario with the changes is validated like any"
                                + " other, and one the validator refuses is reported, not run."),
                new Entry(
                        "Exercised",
                        "a trial exercises a gate when the gate's event had its chance in it; shares count exercised"
                                + " trials only, and a gate no trial exercised fails."),
                new Entry(
                        "Regression",
                        "a gate that held before (in the baseline run, or with the scenario as it is) and fails now."),
                new Entry(
                        "Paired difference",
                        "on each seed that exercised the gate in both runs, 1 for passing and 0 for failing, now minus"
                                + " before; the mean over those seeds in percentage points, with the normal-approximation"
                                + " 95 % interval (mean plus or minus 1.96 standard errors). Every column of a scenario"
                                + " runs on the same seeds, so the pairs saw the same simulated world where the profile"
                                + " leaves it alone."));
    }
}
