package dev.driftlab.evaluation;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

/**
 * Picks the frames worth a picture in a report: for the first kidnap the last frame before it, the
 * first after it and the frame where the filter was right again; without a kidnap the start, the
 * middle and the end.
 */
public final class KeyFrames {

    private KeyFrames() {}

    /**
     * A frame to show.
     *
     * @param caption what the picture shows
     * @param index frame index (equals the trace index: one frame per scan)
     */
    public record Pick(String caption, int index) {}

    /** The frames to show for one run. */
    public static List<Pick> pick(RunTrace trace, TrialOutcome outcome) {
        List<Pick> out = new ArrayList<>();
        int n = trace.size();
        if (n == 0) {
            return out;
        }
        if (!outcome.kidnaps().isEmpty()) {
            KidnapOutcome k = outcome.kidnaps().get(0);
            int after = firstAtOrAfter(trace, k.at());
            out.add(new Pick(
                    String.format(Locale.ROOT, "Before the kidnap (%.1f s)", trace.time(Math.max(0, after - 1))),
                    Math.max(0, after - 1)));
            if (after < n) {
                out.add(new Pick(
                        String.format(Locale.ROOT, "Just after the kidnap (%.1f s)", trace.time(after)), after));
            }
            if (k.recovered()) {
                int rec = Math.min(n - 1, firstAtOrAfter(trace, k.at() + k.recoveredAfter()));
                out.add(new Pick(
                        String.format(
                                Locale.ROOT,
                                "Recovered (%.1f s, %.1f s after the kidnap)",
                                trace.time(rec),
                                k.recoveredAfter()),
                        rec));
            } else {
                out.add(new Pick(
                        String.format(Locale.ROOT, "End of run, not recovered (%.1f s)", trace.time(n - 1)), n - 1));
            }
            return out;
        }
        out.add(new Pick(String.format(Locale.ROOT, "Start (%.1f s)", trace.time(0)), 0));
        out.add(new Pick(String.format(Locale.ROOT, "Middle (%.1f s)", trace.time(n / 2)), n / 2));
        out.add(new Pick(String.format(Locale.ROOT, "End (%.1f s)", trace.time(n - 1)), n - 1));
        return out;
    }

    private static int firstAtOrAfter(RunTrace trace, double t) {
        for (int i = 0; i < trace.size(); i++) {
            if (trace.time(i) >= t - 1e-9) {
                return i;
            }
        }
        return trace.size();
    }
}
