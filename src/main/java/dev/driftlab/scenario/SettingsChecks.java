package dev.driftlab.scenario;

import dev.driftlab.geometry.Bounds;
import dev.driftlab.scenario.LocalizerSettings.MotionNoise;
import dev.driftlab.scenario.LocalizerSettings.Particles;
import dev.driftlab.scenario.LocalizerSettings.RangeModel;
import dev.driftlab.scenario.LocalizerSettings.Recovery;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;
import java.util.Set;

/**
 * The validator's checks of the robot, the rangefinder and the localizer settings: every numeric
 * field against its row of {@link Limits#FIELDS}, then the rules that tie fields together, the
 * likelihood grid's size over the site, and the settings variants.
 */
public final class SettingsChecks {

    private SettingsChecks() {}

    /**
     * The numeric fields of localizer settings in file units (degrees for angles), by their path
     * under {@code localizer.}, in the order of {@link Limits#FIELDS}.
     */
    public static Map<String, Double> values(LocalizerSettings ls) {
        Map<String, Double> v = new LinkedHashMap<>();
        Particles pa = ls.particles();
        String p = "localizer.particles.";
        v.put(p + "count", (double) pa.count());
        v.put(p + "minCount", (double) pa.minCount());
        v.put(p + "maxCount", (double) pa.maxCount());
        v.put(p + "errorBound", pa.errorBound());
        v.put(p + "confidence", pa.confidence());
        v.put(p + "binSize", pa.binSize());
        v.put(p + "binTurn", degrees(pa.binTurn()));
        v.put(p + "startSpread", pa.startSpread());
        v.put(p + "startTurnSpread", degrees(pa.startTurnSpread()));
        MotionNoise m = ls.motionNoise();
        p = "localizer.motionNoise.";
        v.put(p + "turnFromTurn", m.turnFromTurn());
        v.put(p + "turnFromDrive", m.turnFromDrive());
        v.put(p + "driveFromDrive", m.driveFromDrive());
        v.put(p + "driveFromTurn", m.driveFromTurn());
        v.put(p + "minTravel", m.minTravel());
        v.put(p + "minTurn", degrees(m.minTurn()));
        RangeModel r = ls.rangeModel();
        p = "localizer.rangeModel.";
        v.put(p + "beamStep", (double) r.beamStep());
        v.put(p + "hitWeight", r.hitWeight());
        v.put(p + "shortWeight", r.shortWeight());
        v.put(p + "maxWeight", r.maxWeight());
        v.put(p + "randomWeight", r.randomWeight());
        v.put(p + "hitSpread", r.hitSpread());
        v.put(p + "shortDecay", r.shortDecay());
        v.put(p + "cellSize", r.cellSize());
        v.put("localizer.resampling.essFraction", ls.resampling().essFraction());
        Recovery rc = ls.recovery();
        p = "localizer.recovery.";
        v.put(p + "slowRate", rc.slowRate());
        v.put(p + "fastRate", rc.fastRate());
        v.put(p + "resetShare", rc.resetShare());
        v.put(p + "resetBelow", rc.resetBelow());
        return v;
    }

    /**
     * An angle in degrees as the file holds it: rounded to 9 decimals like the writer, so 360
     * degrees read and converted back is 360 again and not a hair over the limit.
     */
    static double degrees(double radians) {
        return Math.round(Math.toDegrees(radians) * 1e9) / 1e9;
    }

    /**
     * Checks one value in file units against its limit, adding an error under {@code path}.
     *
     * @return whether the value is accepted
     */
    static boolean check(String limitPath, double value, String path, List<Problem> out) {
        var problem = Limits.field(limitPath).problem(value);
        problem.ifPresent(m -> out.add(Problem.error(path, m)));
        return problem.isEmpty();
    }

    static void robot(Robot r, List<Problem> out) {
        check("robot.wheelbase", r.wheelbase(), "robot.wheelbase", out);
        check("robot.wheelRadius", r.wheelRadius(), "robot.wheelRadius", out);
        check("robot.ticksPerTurn", r.ticksPerTurn(), "robot.ticksPerTurn", out);
        check("robot.footprintRadius", r.footprintRadius(), "robot.footprintRadius", out);
        check("robot.leftWheelScale", r.leftWheelScale(), "robot.leftWheelScale", out);
        check("robot.rightWheelScale", r.rightWheelScale(), "robot.rightWheelScale", out);
        check("robot.wheelbaseScale", r.wheelbaseScale(), "robot.wheelbaseScale", out);
        check("robot.wheelNoise", r.wheelNoise(), "robot.wheelNoise", out);
        check("robot.maxSpeed", r.maxSpeed(), "robot.maxSpeed", out);
        check("robot.maxTurnRate", degrees(r.maxTurnRate()), "robot.maxTurnRate", out);
        check("robot.maxAcceleration", r.maxAcceleration(), "robot.maxAcceleration", out);
        if (r.footprintRadius() > 0 && r.wheelbase() > 2 * r.footprintRadius()) {
            out.add(Problem.warning(
                    "robot.footprintRadius", "is smaller than half the wheelbase; the wheels stick out"));
        }
    }

    static void rangefinder(Rangefinder r, List<Problem> out) {
        check("rangefinder.beams", r.beams(), "rangefinder.beams", out);
        check("rangefinder.fieldOfView", degrees(r.fieldOfView()), "rangefinder.fieldOfView", out);
        check("rangefinder.maxRange", r.maxRange(), "rangefinder.maxRange", out);
        check("rangefinder.rangeSigma", r.rangeSigma(), "rangefinder.rangeSigma", out);
        check("rangefinder.rate", r.rate(), "rangefinder.rate", out);
        boolean mount = check("rangefinder.mount.forward", r.mount().x(), "rangefinder.mount.forward", out)
                & check("rangefinder.mount.left", r.mount().y(), "rangefinder.mount.left", out);
        check("rangefinder.dropout", r.dropout(), "rangefinder.dropout", out);
        if (mount && Math.hypot(r.mount().x(), r.mount().y()) > 2) {
            out.add(Problem.error("rangefinder.mount", "is more than 2 m from the robot centre"));
        }
    }

    /** Checks one set of localizer settings, with paths under {@code prefix}. */
    static void localizer(LocalizerSettings ls, int beams, String prefix, List<Problem> out) {
        Map<String, Boolean> ok = new LinkedHashMap<>();
        values(ls)
                .forEach((limitPath, value) -> ok.put(
                        limitPath, check(limitPath, value, prefix + limitPath.substring("localizer".length()), out)));
        Particles pa = ls.particles();
        String p = prefix + ".particles";
        if (ok.get("localizer.particles.minCount") && ok.get("localizer.particles.maxCount")) {
            if (pa.minCount() > pa.maxCount()) {
                out.add(Problem.error(
                        p + ".minCount", pa.minCount() + " is more than maxCount (" + pa.maxCount() + ")"));
            } else if (pa.adaptive() && (pa.count() < pa.minCount() || pa.count() > pa.maxCount())) {
                out.add(Problem.error(
                        p + ".count",
                        pa.count() + " lies outside minCount..maxCount (" + pa.minCount() + ".." + pa.maxCount()
                                + ")"));
            }
        }
        RangeModel r = ls.rangeModel();
        p = prefix + ".rangeModel";
        if (ok.get("localizer.rangeModel.beamStep") && r.beamStep() > Math.max(1, beams)) {
            out.add(Problem.error(
                    p + ".beamStep", r.beamStep() + " is more than the rangefinder's " + beams + " beams"));
        }
        boolean weightsOk = ok.get("localizer.rangeModel.hitWeight")
                && ok.get("localizer.rangeModel.shortWeight")
                && ok.get("localizer.rangeModel.maxWeight")
                && ok.get("localizer.rangeModel.randomWeight");
        if (weightsOk) {
            if (r.hitWeight() <= 0) {
                out.add(Problem.error(
                        p + ".hitWeight", "must be more than 0; without it the scan cannot match the map"));
            }
            double sum = r.weightSum();
            if (Math.abs(sum - 1) > Limits.WEIGHT_SUM_TOLERANCE) {
                out.add(Problem.error(
                        p,
                        "mixture weights add up to " + Limits.Field.num(sum) + "; they must add up to 1 within "
                                + Limits.Field.num(Limits.WEIGHT_SUM_TOLERANCE)
                                + (r.kind() == LocalizerSettings.RangeModelKind.LIKELIHOOD_FIELD
                                        ? " (hit + max-range + random for the likelihood field)"
                                        : " (hit + short + max-range + random)")));
            }
        }
        Recovery rc = ls.recovery();
        p = prefix + ".recovery";
        if (ok.get("localizer.recovery.slowRate")
                && ok.get("localizer.recovery.fastRate")
                && rc.injection()
                && rc.slowRate() >= rc.fastRate()) {
            out.add(Problem.error(
                    p + ".slowRate",
                    Limits.Field.num(rc.slowRate()) + " must be smaller than fastRate ("
                            + Limits.Field.num(rc.fastRate())
                            + "); the slow average must follow the likelihood more slowly"));
        }
    }

    /**
     * Checks the likelihood grid of {@code settings} over a site with these bounds stays within
     * {@link Limits#MAX_GRID_CELLS}.
     */
    static void gridSize(LocalizerSettings settings, Optional<Bounds> site, String prefix, List<Problem> out) {
        double cell = settings.rangeModel().cellSize();
        if (site.isEmpty() || !(cell > 0)) {
            return;
        }
        Bounds b = site.get();
        double cells = Math.ceil(b.width() / cell + 1) * Math.ceil(b.height() / cell + 1);
        if (cells > Limits.MAX_GRID_CELLS) {
            double needed = Math.sqrt(b.width() * b.height() / Limits.MAX_GRID_CELLS);
            out.add(Problem.error(
                    prefix + ".rangeModel.cellSize",
                    Findings.fmt(cell) + " m cells give " + String.format(Locale.ROOT, "%.0f", cells)
                            + " grid cells for this site; use at least "
                            + Findings.fmt(Math.ceil(needed * 100) / 100) + " m"));
        }
    }

    /**
     * Checks the scenario's settings variants: their number, their names, and their settings as
     * {@link #localizer} and {@link #gridSize} do. A variant reports only what it gets wrong itself:
     * a problem it inherits from the base settings (in {@code baseProblems}, with paths under
     * {@code localizer}) is reported on the base alone.
     */
    static void variants(Scenario s, Set<Problem> baseProblems, List<Problem> out) {
        List<SettingsVariant> vs = s.variants();
        if (vs.size() > Limits.MAX_VARIANTS) {
            out.add(Problem.error(
                    "variants", "has " + vs.size() + " variants; at most " + Limits.MAX_VARIANTS + " are allowed"));
            return;
        }
        Set<String> names = new HashSet<>();
        names.add("base");
        for (int i = 0; i < vs.size(); i++) {
            SettingsVariant v = vs.get(i);
            String p = "variants[" + i + "]";
            if (v.name().isBlank()) {
                out.add(Problem.error(p + ".name", "must not be empty"));
            } else if (!names.add(v.name())) {
                out.add(Problem.error(
                        p + ".name", "\"" + v.name() + "\" is used twice (\"base\" is the scenario's own settings)"));
            }
            String prefix = p + ".localizer";
            List<Problem> own = new ArrayList<>();
            localizer(v.settings(), s.rangefinder().beams(), prefix, own);
            gridSize(v.settings(), s.site().bounds(), prefix, own);
            for (Problem q : own) {
                Problem asBase =
                        new Problem(q.severity(), "localizer" + q.path().substring(prefix.length()), q.message());
                if (!baseProblems.contains(asBase)) {
                    out.add(q);
                }
            }
        }
    }
}
