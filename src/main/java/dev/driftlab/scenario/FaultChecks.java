package dev.driftlab.scenario;

import static dev.driftlab.scenario.Findings.fmt;

import java.util.HashMap;
import java.util.List;
import java.util.Map;

/**
 * The validator's checks of the faults: their number, unique ids, triggers that can fire, and the
 * fields of each kind. The kind's fields are checked in one place per {@link FaultKind}, chosen by a
 * switch over the list of kinds, so a kind added there does not compile until it has its check here.
 */
final class FaultChecks {

    private final Scenario s;
    private final SiteChecks site;
    private final Findings out;

    private FaultChecks(Scenario s, SiteChecks site, Findings out) {
        this.s = s;
        this.site = site;
        this.out = out;
    }

    /** Checks the faults of {@code s} against its site, whose checks have run. */
    static void check(Scenario s, SiteChecks site, Findings out) {
        new FaultChecks(s, site, out).faults();
    }

    private void faults() {
        List<Fault> faults = s.faults();
        if (faults.size() > Limits.MAX_FAULTS) {
            out.error("faults", "has " + faults.size() + " faults; at most " + Limits.MAX_FAULTS + " are allowed");
            return;
        }
        double end = RouteTiming.runSeconds(s.route(), s.robot());
        Map<String, String> ids = new HashMap<>();
        for (int i = 0; i < faults.size(); i++) {
            Fault f = faults.get(i);
            String p = "faults[" + i + "]";
            out.uniqueId(ids, f.id(), p);
            trigger(f.trigger(), p, end);
            fields(f, p);
        }
    }

    /** Checks the fields of a fault's kind: one case, and one method, per kind. */
    private void fields(Fault f, String p) {
        // a switch expression must cover every kind, so the compiler finds a kind without a check
        Runnable check = switch (FaultKind.of(f)) {
            case SLIP -> () -> slip((Fault.Slip) f, p);
            case STALL -> () -> stall((Fault.Stall) f, p);
            case KIDNAP -> () -> kidnap((Fault.Kidnap) f, p);
            case BUMP -> () -> bump((Fault.Bump) f, p);
            case DOOR_CHANGE -> () -> doorChange((Fault.DoorChange) f, p);
            case CLUTTER -> () -> clutter((Fault.ClutterChange) f, p);
            case BLACKOUT -> () -> blackout((Fault.Blackout) f, p);
            case NOISE_BURST -> () -> noiseBurst((Fault.NoiseBurst) f, p);
            case SPURIOUS_MAX_RANGE -> () -> spuriousMaxRange((Fault.SpuriousMaxRange) f, p);
        };
        check.run();
    }

    private void slip(Fault.Slip f, String p) {
        out.range(f.fraction(), 0, 1, p + ".fraction", "");
        duration(f.duration(), p);
    }

    private void stall(Fault.Stall f, String p) {
        duration(f.duration(), p);
    }

    private void kidnap(Fault.Kidnap f, String p) {
        site.place(f.to().position(), p + ".to", true);
    }

    private void bump(Fault.Bump f, String p) {
        out.range(f.forward(), -1, 1, p + ".forward", "m");
        out.range(f.left(), -1, 1, p + ".left", "m");
        out.range(f.turn(), -Math.PI / 2, Math.PI / 2, p + ".turn", "rad");
    }

    private void doorChange(Fault.DoorChange f, String p) {
        if (!site.hasDoor(f.door())) {
            out.error(p + ".door", "no door with id \"" + f.door() + "\"");
        }
    }

    private void clutter(Fault.ClutterChange f, String p) {
        if (!site.hasClutter(f.clutter())) {
            out.error(p + ".clutter", "no clutter with id \"" + f.clutter() + "\"");
        }
    }

    private void blackout(Fault.Blackout f, String p) {
        duration(f.duration(), p);
    }

    private void noiseBurst(Fault.NoiseBurst f, String p) {
        duration(f.duration(), p);
        out.range(f.factor(), 1, 100, p + ".factor", "");
    }

    private void spuriousMaxRange(Fault.SpuriousMaxRange f, String p) {
        duration(f.duration(), p);
        out.range(f.share(), 0, 1, p + ".share", "");
    }

    // ----- shared by the kinds

    private void trigger(Trigger t, String p, double end) {
        if (t instanceof Trigger.AtTime at) {
            if (at.time() < 0) {
                out.error(p + ".at", "must be 0 s or later");
            } else if (at.time() > end) {
                out.error(p + ".at", fmt(at.time()) + " s is after the route ends (about " + fmt(end) + " s)");
            }
        } else if (t instanceof Trigger.OnEntering on) {
            if (!site.hasPlace(on.place())) {
                out.error(p + ".enters", "no room or floor zone with id \"" + on.place() + "\"");
            }
        } else if (t instanceof Trigger.NearPoint near) {
            out.positive(near.radius(), 100, p + ".near.radius", "m");
            if (site.roomAt(near.point()).isEmpty()) {
                out.error(
                        p + ".near",
                        "(" + fmt(near.point().x()) + ", " + fmt(near.point().y()) + ") is outside every room");
            }
        }
    }

    private void duration(double d, String p) {
        if (d <= 0) {
            out.error(p + ".duration", "must be more than 0 s");
        } else if (d > Limits.MAX_RUN_SECONDS) {
            out.error(
                    p + ".duration",
                    fmt(d) + " s is longer than the longest run (" + fmt(Limits.MAX_RUN_SECONDS) + " s)");
        }
    }
}
