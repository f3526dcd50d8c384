package dev.driftlab.sim;

import dev.driftlab.geometry.Polygon;
import dev.driftlab.scenario.Fault;
import dev.driftlab.scenario.Trigger;
import dev.driftlab.scenario.Wheel;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;

/**
 * Fires each fault once when its trigger is met and keeps faults with a duration in force for
 * that long (a duration of 0 acts for one step). An {@code OnEntering} trigger fires when the
 * robot's true centre goes from outside the place to inside it; a robot that starts inside must
 * leave and come back.
 */
final class FaultTimeline {

    private final List<Fault> faults;
    private final Polygon[] places;
    private final boolean[] inside;
    private final boolean[] fired;
    private final double[] firedAt;
    private final boolean[] active;
    private final double[] until;

    private double leftSlip;
    private double rightSlip;
    private boolean leftStalled;
    private boolean rightStalled;
    private boolean leftEncoderSees;
    private boolean rightEncoderSees;
    private boolean blackout;
    private double noiseFactor = 1;
    private double spuriousShare;

    /**
     * @param places rooms and floor zones by id, for {@code OnEntering}
     * @throws IllegalArgumentException naming the field when a trigger names a missing place
     */
    FaultTimeline(List<Fault> faults, Map<String, Polygon> places, double startX, double startY) {
        this.faults = List.copyOf(faults);
        int n = faults.size();
        this.places = new Polygon[n];
        this.inside = new boolean[n];
        this.fired = new boolean[n];
        this.firedAt = new double[n];
        java.util.Arrays.fill(firedAt, Double.NaN);
        this.active = new boolean[n];
        this.until = new double[n];
        for (int k = 0; k < n; k++) {
            if (faults.get(k).trigger() instanceof Trigger.OnEntering on) {
                Polygon p = places.get(on.place());
                if (p == null) {
                    throw new IllegalArgumentException(
                            "faults[" + k + "].trigger.place: no room or floor zone \"" + on.place() + "\"");
                }
                this.places[k] = p;
                this.inside[k] = p.contains(startX, startY);
            }
        }
    }

    /**
     * Advances to time t with the robot's true centre at (x, y): collects faults that fire now and
     * faults whose duration ended, then recomputes the combined effects.
     *
     * @param mayFire false once the trial is ending (the route was abandoned): no new fault fires
     */
    void update(double t, double x, double y, double dt, List<Fault> firedNow, List<Fault> endedNow, boolean mayFire) {
        for (int k = 0; k < faults.size(); k++) {
            Fault f = faults.get(k);
            if (active[k] && t >= until[k] - 1e-9) {
                active[k] = false;
                endedNow.add(f);
            }
            if (mayFire && !fired[k] && triggered(k, f.trigger(), t, x, y)) {
                fired[k] = true;
                firedAt[k] = t;
                firedNow.add(f);
                double duration = duration(f);
                if (duration >= 0) {
                    active[k] = true;
                    until[k] = t + Math.max(duration, dt);
                }
            }
        }
        recomputeEffects();
    }

    private boolean triggered(int k, Trigger trigger, double t, double x, double y) {
        if (trigger instanceof Trigger.AtTime at) {
            return t >= at.time() - 1e-9;
        }
        if (trigger instanceof Trigger.OnEntering) {
            boolean now = places[k].contains(x, y);
            boolean entered = now && !inside[k];
            inside[k] = now;
            return entered;
        }
        Trigger.NearPoint near = (Trigger.NearPoint) trigger;
        return Math.hypot(x - near.point().x(), y - near.point().y()) <= near.radius();
    }

    /** Duration of a fault that stays in force, or -1 for one that acts once. */
    private static double duration(Fault f) {
        if (f instanceof Fault.Slip s) {
            return s.duration();
        } else if (f instanceof Fault.Stall s) {
            return s.duration();
        } else if (f instanceof Fault.Blackout b) {
            return b.duration();
        } else if (f instanceof Fault.NoiseBurst b) {
            return b.duration();
        } else if (f instanceof Fault.SpuriousMaxRange s) {
            return s.duration();
        }
        return -1;
    }

    private void recomputeEffects() {
        leftSlip = 0;
        rightSlip = 0;
        leftStalled = false;
        rightStalled = false;
        leftEncoderSees = false;
        rightEncoderSees = false;
        blackout = false;
        noiseFactor = 1;
        spuriousShare = 0;
        for (int k = 0; k < faults.size(); k++) {
            if (!active[k]) {
                continue;
            }
            Fault f = faults.get(k);
            if (f instanceof Fault.Slip s) {
                if (s.wheel() != Wheel.RIGHT) {
                    leftSlip = Math.max(leftSlip, s.fraction());
                }
                if (s.wheel() != Wheel.LEFT) {
                    rightSlip = Math.max(rightSlip, s.fraction());
                }
            } else if (f instanceof Fault.Stall s) {
                if (s.wheel() != Wheel.RIGHT) {
                    leftStalled = true;
                    leftEncoderSees |= s.encoderSeesIt();
                }
                if (s.wheel() != Wheel.LEFT) {
                    rightStalled = true;
                    rightEncoderSees |= s.encoderSeesIt();
                }
            } else if (f instanceof Fault.Blackout) {
                blackout = true;
            } else if (f instanceof Fault.NoiseBurst b) {
                noiseFactor *= b.factor();
            } else if (f instanceof Fault.SpuriousMaxRange s) {
                spuriousShare = Math.max(spuriousShare, s.share());
            }
        }
    }

    /** When fault k (in scenario order) fired, seconds; NaN while it has not. */
    double firedAt(int k) {
        return firedAt[k];
    }

    /** Ids of faults in force now, in scenario order. */
    List<String> activeIds() {
        List<String> ids = null;
        for (int k = 0; k < faults.size(); k++) {
            if (active[k]) {
                if (ids == null) {
                    ids = new ArrayList<>();
                }
                ids.add(faults.get(k).id());
            }
        }
        return ids == null ? List.of() : ids;
    }

    double leftSlip() {
        return leftSlip;
    }

    double rightSlip() {
        return rightSlip;
    }

    boolean leftStalled() {
        return leftStalled;
    }

    boolean rightStalled() {
        return rightStalled;
    }

    boolean leftEncoderSees() {
        return leftEncoderSees;
    }

    boolean rightEncoderSees() {
        return rightEncoderSees;
    }

    boolean blackout() {
        return blackout;
    }

    double noiseFactor() {
        return noiseFactor;
    }

    double spuriousShare() {
        return spuriousShare;
    }
}
