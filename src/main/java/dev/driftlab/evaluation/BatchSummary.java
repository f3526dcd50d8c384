package dev.driftlab.evaluation;

import dev.driftlab.geometry.NormalMath;
import dev.driftlab.scenario.Gate;
import dev.driftlab.scenario.GateMetric;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * Summary of a batch: one {@link VariantSummary} per settings variant and a paired comparison of
 * each variant with the first (the base).
 *
 * @param variants per-variant figures, base first
 * @param comparisons each later variant against the base
 */
public record BatchSummary(List<VariantSummary> variants, List<PairedComparison> comparisons) {

    /** Recovery deadline used when no recovery-time gate sets one, seconds. */
    public static final double DEFAULT_RECOVERY_DEADLINE = 30.0;

    /** Copies the lists. */
    public BatchSummary {
        variants = List.copyOf(variants);
        comparisons = List.copyOf(comparisons);
    }

    /** Whether every gate of every variant passes. */
    public boolean allGatesPass() {
        return variants.stream().allMatch(VariantSummary::allGatesPass);
    }

    /** Every gate verdict of every variant, base first. */
    public List<GateVerdict> verdicts() {
        return variants.stream().flatMap(v -> v.gates().stream()).toList();
    }

    /**
     * Summarises trials grouped by variant, judged by the scenario's effective gates (its own plus
     * the default route rule, see {@link Gates#effective}).
     */
    public static BatchSummary of(List<TrialOutcome> trials, dev.driftlab.scenario.Scenario scenario) {
        return of(trials, Gates.effective(scenario));
    }

    /**
     * Summarises trials grouped by variant, in the order variants first appear.
     *
     * @param trials all trials of the batch
     * @param gates the scenario's gates
     */
    public static BatchSummary of(List<TrialOutcome> trials, List<Gate> gates) {
        Map<String, List<TrialOutcome>> byVariant = new LinkedHashMap<>();
        for (TrialOutcome t : trials) {
            byVariant.computeIfAbsent(t.variant(), k -> new ArrayList<>()).add(t);
        }
        double deadline = gates.stream()
                .filter(g -> g.metric() == GateMetric.RECOVERY_TIME)
                .mapToDouble(Gate::bound)
                .min()
                .orElse(DEFAULT_RECOVERY_DEADLINE);
        List<VariantSummary> summaries = new ArrayList<>();
        for (var e : byVariant.entrySet()) {
            summaries.add(variant(e.getKey(), e.getValue(), gates, deadline));
        }
        List<PairedComparison> comparisons = new ArrayList<>();
        List<String> names = new ArrayList<>(byVariant.keySet());
        for (int i = 1; i < names.size(); i++) {
            comparisons.add(paired(
                    names.get(0), byVariant.get(names.get(0)), names.get(i), byVariant.get(names.get(i)), deadline));
        }
        return new BatchSummary(summaries, comparisons);
    }

    private static VariantSummary variant(String name, List<TrialOutcome> ts, List<Gate> gates, double deadline) {
        int kidnapTrials = 0;
        int recovered = 0;
        List<Double> times = new ArrayList<>();
        int converged = 0;
        double[] conv = new double[ts.size()];
        int nc = 0;
        double[] rmse = new double[ts.size()];
        double[] fin = new double[ts.size()];
        double[] lost = new double[ts.size()];
        for (int i = 0; i < ts.size(); i++) {
            TrialOutcome t = ts.get(i);
            if (!t.kidnaps().isEmpty()) {
                kidnapTrials++;
                if (t.allRecoveredWithin(deadline)) {
                    recovered++;
                }
                for (KidnapOutcome k : t.kidnaps()) {
                    if (k.recovered()) {
                        times.add(k.recoveredAfter());
                    }
                }
            }
            if (t.converged()) {
                converged++;
                conv[nc++] = t.convergenceTime();
            }
            rmse[i] = t.rmse();
            fin[i] = t.finalPositionError();
            lost[i] = t.longestLost();
        }
        List<GateVerdict> verdicts = new ArrayList<>();
        for (Gate g : gates) {
            verdicts.add(Gates.evaluate(g, name, ts));
        }
        Interval recoveryRate = kidnapTrials == 0
                ? new Interval(0, 1, Gates.CONFIDENCE)
                : Stats.wilson(recovered, kidnapTrials, Gates.CONFIDENCE);
        return new VariantSummary(
                name,
                ts.size(),
                deadline,
                kidnapTrials,
                recovered,
                recoveryRate,
                Spread.of(times.stream().mapToDouble(Double::doubleValue).toArray()),
                converged,
                Stats.wilson(converged, ts.size(), Gates.CONFIDENCE),
                Spread.of(java.util.Arrays.copyOf(conv, nc)),
                Spread.of(rmse),
                Spread.of(fin),
                Spread.of(lost),
                verdicts,
                EarlyEnds.of(ts),
                FaultTally.of(ts));
    }

    private static PairedComparison paired(
            String baseName, List<TrialOutcome> base, String name, List<TrialOutcome> other, double deadline) {
        Map<Long, TrialOutcome> bySeed = new HashMap<>();
        for (TrialOutcome t : base) {
            bySeed.put(t.seed(), t);
        }
        int both = 0;
        int onlyBase = 0;
        int onlyOther = 0;
        int neither = 0;
        List<Double> shareDiffs = new ArrayList<>();
        List<Double> rmseDiffs = new ArrayList<>();
        List<Double> timeDiffs = new ArrayList<>();
        for (TrialOutcome o : other) {
            TrialOutcome b = bySeed.get(o.seed());
            if (b == null) {
                continue;
            }
            boolean rb = !b.kidnaps().isEmpty() && b.allRecoveredWithin(deadline);
            boolean ro = !o.kidnaps().isEmpty() && o.allRecoveredWithin(deadline);
            if (rb && ro) {
                both++;
            } else if (rb) {
                onlyBase++;
            } else if (ro) {
                onlyOther++;
            } else {
                neither++;
            }
            shareDiffs.add((ro ? 1.0 : 0.0) - (rb ? 1.0 : 0.0));
            rmseDiffs.add(o.rmse() - b.rmse());
            if (rb && ro) {
                double tb = b.kidnaps().stream()
                        .mapToDouble(KidnapOutcome::recoveredAfter)
                        .max()
                        .orElse(0);
                double to = o.kidnaps().stream()
                        .mapToDouble(KidnapOutcome::recoveredAfter)
                        .max()
                        .orElse(0);
                timeDiffs.add(to - tb);
            }
        }
        double[] sd = shareDiffs.stream().mapToDouble(Double::doubleValue).toArray();
        double[] rd = rmseDiffs.stream().mapToDouble(Double::doubleValue).toArray();
        double[] sci = meanInterval(sd);
        double[] rci = meanInterval(rd);
        return new PairedComparison(
                baseName,
                name,
                sd.length,
                both,
                onlyBase,
                onlyOther,
                neither,
                sci[0],
                sci[1],
                sci[2],
                rci[0],
                rci[1],
                rci[2],
                Stats.percentile(
                        timeDiffs.stream().mapToDouble(Double::doubleValue).toArray(), 50));
    }

    /** Mean and its normal-approximation 95 % interval; NaN bounds below two values. */
    static double[] meanInterval(double[] v) {
        double m = Stats.mean(v);
        double s = Stats.stdDev(v);
        if (Double.isNaN(s)) {
            return new double[] {m, Double.NaN, Double.NaN};
        }
        double half = NormalMath.quantile(0.975) * s / Math.sqrt(v.length);
        return new double[] {m, m - half, m + half};
    }
}
