package dev.driftlab.evaluation;

import java.util.ArrayList;
import java.util.EnumMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;

/**
 * Trials of one variant that ended before their route did, grouped by why, with when and where.
 *
 * @param kind why they ended
 * @param count how many trials ended this way
 * @param trials all trials of the variant
 * @param time spread of the times they stopped, seconds
 * @param x median robot x where they stopped, metres
 * @param y median robot y where they stopped, metres
 */
public record EarlyEnds(TrialEnd.Kind kind, int count, int trials, Spread time, double x, double y) {

    /** The groups of early ends among trials, most frequent first; empty when all completed. */
    public static List<EarlyEnds> of(List<TrialOutcome> trials) {
        Map<TrialEnd.Kind, List<TrialEnd>> by = new EnumMap<>(TrialEnd.Kind.class);
        for (TrialOutcome t : trials) {
            if (t.end().early()) {
                by.computeIfAbsent(t.end().kind(), k -> new ArrayList<>()).add(t.end());
            }
        }
        List<EarlyEnds> out = new ArrayList<>();
        for (var e : by.entrySet()) {
            List<TrialEnd> ends = e.getValue();
            double[] ts = ends.stream().mapToDouble(TrialEnd::time).toArray();
            double[] xs = ends.stream().mapToDouble(TrialEnd::x).toArray();
            double[] ys = ends.stream().mapToDouble(TrialEnd::y).toArray();
            out.add(new EarlyEnds(
                    e.getKey(),
                    ends.size(),
                    trials.size(),
                    Spread.of(ts),
                    Stats.percentile(xs, 50),
                    Stats.percentile(ys, 50)));
        }
        out.sort((a, b) -> Integer.compare(b.count, a.count));
        return out;
    }

    /** One sentence: "17 of 20 trials stopped at a contact near (5.2, 5.9) at about 37 s". */
    public String sentence() {
        String what = switch (kind) {
            case CONTACT -> "stopped at a contact";
            case TIME_LIMIT -> "ran out of time before the route was done";
            case CANCELLED -> "were cancelled";
            case LOCALIZER_FAILED -> "stopped because the localizer failed";
            case COMPLETED -> "drove the whole route";
        };
        String when = time.count() > 1 && time.max() - time.p50() > 1
                ? String.format(Locale.ROOT, " at about %.0f s (the latest at %.0f s)", time.p50(), time.max())
                : String.format(Locale.ROOT, " at about %.0f s", time.p50());
        return String.format(Locale.ROOT, "%d of %d trials %s near (%.1f, %.1f)", count, trials, what, x, y) + when;
    }
}
