package dev.driftlab.evaluation;

import java.util.Locale;

/**
 * How a trial ended: the route driven to its end, or early, with why, when and where.
 *
 * @param kind why it ended
 * @param time seconds from the start: when the footprint touched for a contact, otherwise the
 *     trial's last moment
 * @param x robot centre at that moment, metres
 * @param y robot centre at that moment, metres
 */
public record TrialEnd(Kind kind, double time, double x, double y) {

    /** Why a trial ended. */
    public enum Kind {
        /** The route was driven to its end and the settle time passed. */
        COMPLETED,
        /** The footprint touched an obstacle of the actual world; the robot stopped there. */
        CONTACT,
        /** The route was not done within the run's time bound (say, a wheel stalled for good). */
        TIME_LIMIT,
        /** Stopped from outside (cancelled) before the route ended. */
        CANCELLED,
        /**
         * An outside localizer failed (crashed, hung, answered nonsense or another protocol
         * version); what happened is in {@link TrialOutcome#localizerTrouble()}.
         */
        LOCALIZER_FAILED;

        /** The kind's name in result files: "contact", "time-limit". */
        public String fileName() {
            return name().toLowerCase(Locale.ROOT).replace('_', '-');
        }

        /** The kind named as in result files. */
        public static Kind byFileName(String name) {
            for (Kind k : values()) {
                if (k.fileName().equals(name)) {
                    return k;
                }
            }
            throw new IllegalArgumentException("unknown trial end \"" + name + "\"");
        }
    }

    /** Checks presence. */
    public TrialEnd {
        if (kind == null) {
            throw new IllegalArgumentException("kind must be given");
        }
    }

    /** A route driven to its end at the given time and place. */
    public static TrialEnd completed(double time, double x, double y) {
        return new TrialEnd(Kind.COMPLETED, time, x, y);
    }

    /** Whether the trial ended before its route did. */
    public boolean early() {
        return kind != Kind.COMPLETED;
    }

    /** Plain words: "stopped at a contact at (5.20, 5.90) at 37.1 s". */
    public String describe() {
        return switch (kind) {
            case COMPLETED -> String.format(Locale.ROOT, "drove the whole route (ended at %.1f s)", time);
            case CONTACT -> String.format(Locale.ROOT, "stopped at a contact at (%.2f, %.2f) at %.1f s", x, y, time);
            case TIME_LIMIT ->
                String.format(
                        Locale.ROOT, "ran out of time at (%.2f, %.2f) at %.1f s before the route was done", x, y, time);
            case CANCELLED -> String.format(Locale.ROOT, "was cancelled at %.1f s", time);
            case LOCALIZER_FAILED ->
                String.format(
                        Locale.ROOT, "stopped because the localizer failed at (%.2f, %.2f) at %.1f s", x, y, time);
        };
    }
}
