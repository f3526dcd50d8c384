package dev.driftlab.scenario;

import dev.driftlab.geometry.Pose;

/**
 * Injected trouble on the run's timeline. Every fault has an id unique among the scenario's faults
 * and a trigger. Durations are seconds; a duration of 0 means the fault acts once.
 */
public sealed interface Fault {

    /** Unique id among the scenario's faults. */
    String id();

    /** When the fault fires. */
    Trigger trigger();

    /**
     * A wheel keeps turning but the robot does not follow: a fraction of that wheel's motion is lost.
     * The encoder counts the full turn.
     */
    record Slip(String id, Trigger trigger, Wheel wheel, double fraction, double duration) implements Fault {
        /** Checks presence and finiteness. */
        public Slip {
            common(id, trigger);
            Checks.present(wheel, "wheel");
            Checks.finite(fraction, "fraction");
            Checks.finite(duration, "duration");
        }
    }

    /**
     * A wheel is blocked. When {@code encoderSeesIt} the encoder reports the stop; otherwise it keeps
     * reporting the commanded motion (a wheel spinning in place, or a slipping drive belt).
     */
    record Stall(String id, Trigger trigger, Wheel wheel, double duration, boolean encoderSeesIt) implements Fault {
        /** Checks presence and finiteness. */
        public Stall {
            common(id, trigger);
            Checks.present(wheel, "wheel");
            Checks.finite(duration, "duration");
        }
    }

    /** The robot is carried to another pose; odometry reports nothing. */
    record Kidnap(String id, Trigger trigger, Pose to) implements Fault {
        /** Checks presence. */
        public Kidnap {
            common(id, trigger);
            Checks.present(to, "to");
        }
    }

    /**
     * A small unseen shove in the robot frame.
     *
     * @param forward metres along the heading
     * @param left metres to the left
     * @param turn radians, counter-clockwise
     */
    record Bump(String id, Trigger trigger, double forward, double left, double turn) implements Fault {
        /** Checks presence and finiteness. */
        public Bump {
            common(id, trigger);
            Checks.finite(forward, "forward");
            Checks.finite(left, "left");
            Checks.finite(turn, "turn");
        }
    }

    /** A door changes its actual state. */
    record DoorChange(String id, Trigger trigger, String door, DoorState state) implements Fault {
        /** Checks presence. */
        public DoorChange {
            common(id, trigger);
            Checks.present(door, "door");
            Checks.present(state, "state");
        }
    }

    /** A clutter item appears or vanishes. */
    record ClutterChange(String id, Trigger trigger, String clutter, boolean present) implements Fault {
        /** Checks presence. */
        public ClutterChange {
            common(id, trigger);
            Checks.present(clutter, "clutter");
        }
    }

    /** The rangefinder returns nothing (every beam at max range) for a while. */
    record Blackout(String id, Trigger trigger, double duration) implements Fault {
        /** Checks presence and finiteness. */
        public Blackout {
            common(id, trigger);
            Checks.finite(duration, "duration");
        }
    }

    /** Range noise is multiplied by a factor for a while. */
    record NoiseBurst(String id, Trigger trigger, double duration, double factor) implements Fault {
        /** Checks presence and finiteness. */
        public NoiseBurst {
            common(id, trigger);
            Checks.finite(duration, "duration");
            Checks.finite(factor, "factor");
        }
    }

    /** A share of beams report max range although something is there (glass, black surfaces). */
    record SpuriousMaxRange(String id, Trigger trigger, double duration, double share) implements Fault {
        /** Checks presence and finiteness. */
        public SpuriousMaxRange {
            common(id, trigger);
            Checks.finite(duration, "duration");
            Checks.finite(share, "share");
        }
    }

    private static void common(String id, Trigger trigger) {
        Checks.present(id, "id");
        Checks.present(trigger, "trigger");
    }
}
