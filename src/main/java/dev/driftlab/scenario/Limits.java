package dev.driftlab.scenario;

/**
 * Upper bounds on scenario sizes. They keep one scenario within what a run on a small server can
 * hold, and catch typing slips such as a site in millimetres or a particle count with three extra
 * zeros.
 */
public final class Limits {
    /** Largest site extent along either axis, metres. */
    public static final double MAX_SITE_EXTENT = 1000.0;
    /** Most beams per scan. */
    public static final int MAX_BEAMS = 4096;
    /** Most particles, for the fixed count and the adaptive maximum. */
    public static final int MAX_PARTICLES = 1_000_000;
    /** Most waypoints on a route. */
    public static final int MAX_WAYPOINTS = 2000;
    /** Most corners in one outline. */
    public static final int MAX_CORNERS = 1000;
    /** Most faults in one scenario. */
    public static final int MAX_FAULTS = 500;
    /** Most settings variants. */
    public static final int MAX_VARIANTS = 20;
    /** Most gates. */
    public static final int MAX_GATES = 50;
    /** Most contacts a no-contact gate may allow in one trial. */
    public static final int MAX_GATE_CONTACTS = 1000;
    /** Longest run, seconds of robot time (2 hours). */
    public static final double MAX_RUN_SECONDS = 7200.0;
    /** Most cells in the believed map's occupancy grid. */
    public static final long MAX_GRID_CELLS = 64_000_000L;

    /**
     * Least KLD-sampling confidence (1 - delta). Below one half the normal quantile in the
     * Wilson-Hilferty form of the bound ({@code KldSampling.bound}) turns negative, so the count
     * falls under the chi-square mean: a "confidence" worse than a coin toss. Lower still the bound
     * reaches zero or below (for two bins, below about 0.05) and the filter would run on its
     * minimum count whatever the spread. Fox ("Adapting the sample size in particle filters
     * through KLD-sampling", IJRR 22(12), 2003) works with 0.99 (from memory).
     */
    public static final double MIN_CONFIDENCE = 0.5;

    /**
     * Most KLD-sampling confidence, 1 - 10^-4. Towards 1 the normal quantile grows without limit
     * (at 1 it is infinite and the bound overflows), so the count only runs to the maximum, which a
     * fixed count says more plainly. The editor's form offers the same range.
     */
    public static final double MAX_CONFIDENCE = 0.9999;

    /**
     * Largest distance between a range-model weight sum and 1. The filter rescales the weights to
     * sum to exactly 1; a sum further off is taken as a typing slip (0.6 for 0.9) rather than
     * silently rescaled. The validator and the localizer's own check both read this.
     */
    public static final double WEIGHT_SUM_TOLERANCE = 0.01;

    /**
     * One numeric field of the scenario file with the range it accepts, in file units (metres,
     * seconds, degrees). The validator, the localizer's settings check, the editor's settings forms
     * and the JSON Schema all take their bounds and messages from here.
     *
     * @param path the field's path in the file; localizer paths start with {@code localizer.} and
     *     stand for variants' settings too
     * @param min lower bound
     * @param minOpen whether the lower bound itself is refused
     * @param max upper bound
     * @param maxOpen whether the upper bound itself is refused
     * @param unit unit shown in messages and forms, empty for a plain number
     * @param whole whether only whole numbers are allowed
     * @param belowNote added to the message of a value under the lower bound, saying why the bound
     *     is there; empty when the bound needs no reason
     */
    public record Field(
            String path,
            double min,
            boolean minOpen,
            double max,
            boolean maxOpen,
            String unit,
            boolean whole,
            String belowNote) {

        /** Whether the field holds an angle, kept in radians inside and degrees in the file. */
        public boolean degrees() {
            return unit.startsWith("deg");
        }

        /** Whether a value in file units lies in the range. */
        public boolean accepts(double v) {
            boolean low = minOpen ? v > min : v >= min;
            boolean high = maxOpen ? v < max : v <= max;
            return low && high && (!whole || v == Math.rint(v));
        }

        /**
         * What is wrong with a value in file units, without the path; empty when it is accepted.
         * The wording follows the shape of the range, so a message reads naturally for a count
         * ("must be at least 1"), a positive size ("must be more than 0 m") or a share.
         */
        public java.util.Optional<String> problem(double v) {
            if (accepts(v)) {
                return java.util.Optional.empty();
            }
            String u = unit.isEmpty() ? "" : " " + unit;
            String note = !(minOpen ? v > min : v >= min) && !belowNote.isEmpty() ? " (" + belowNote + ")" : "";
            String text;
            if (whole) {
                if (v != Math.rint(v)) {
                    text = num(v) + " is not a whole number";
                } else if (v < min) {
                    text = "must be at least " + num(min) + ", got " + num(v);
                } else {
                    text = String.format(java.util.Locale.ROOT, "%,.0f is over the maximum of %,.0f", v, max);
                }
            } else if (minOpen && maxOpen) {
                text = num(v) + " must lie strictly between " + num(min) + " and " + num(max);
            } else if (minOpen) {
                text = !(v > min)
                        ? "must be more than " + num(min) + u + ", got " + num(v)
                        : num(v) + u + " is more than the maximum of " + num(max) + u;
            } else {
                text = num(v) + u + " is out of range; allowed " + num(min) + " to " + num(max) + u;
            }
            return java.util.Optional.of(text + note);
        }

        /** The range as a short text for a form, e.g. "more than 0 to 5". */
        public String rangeText() {
            return (minOpen ? "more than " : "") + num(min) + " to " + num(max) + (maxOpen ? " (not included)" : "");
        }

        /**
         * A number as short as it can be written without changing it: three decimals where they
         * are exact, every digit otherwise (0.9999 must not show as 1).
         */
        public static String num(double v) {
            if (v == Math.rint(v) && Math.abs(v) < 1e15) {
                return String.format(java.util.Locale.ROOT, "%.0f", v);
            }
            String t = String.format(java.util.Locale.ROOT, "%.3f", v);
            t = t.replaceAll("0+$", "");
            t = t.endsWith(".") ? t.substring(0, t.length() - 1) : t;
            if (Double.parseDouble(t) == v || !Double.isFinite(v)) {
                return t;
            }
            return java.math.BigDecimal.valueOf(v).stripTrailingZeros().toPlainString();
        }
    }

    private static Field closed(String path, double min, double max, String unit) {
        return new Field(path, min, false, max, false, unit, false, "");
    }

    private static Field positive(String path, double max, String unit) {
        return new Field(path, 0, true, max, false, unit, false, "");
    }

    private static Field open(String path, double min, double max) {
        return new Field(path, min, true, max, true, "", false, "");
    }

    private static Field count(String path, double min, double max) {
        return new Field(path, min, false, max, false, "", true, "");
    }

    /**
     * Every numeric setting of the robot, the rangefinder and the localizer, in file order. Where
     * the validator, the localizer's check and the editor's forms once disagreed, the validator's
     * bound was kept (see DEVELOPERS.md, Limits). The mount's turn has no row: a heading wraps to
     * (-180, 180] degrees as it is read, so every finite value means something.
     */
    public static final java.util.List<Field> FIELDS = java.util.List.of(
            positive("robot.wheelbase", 5, "m"),
            positive("robot.wheelRadius", 1, "m"),
            count("robot.ticksPerTurn", 1, 10_000_000),
            positive("robot.footprintRadius", 5, "m"),
            closed("robot.leftWheelScale", 0.5, 1.5, ""),
            closed("robot.rightWheelScale", 0.5, 1.5, ""),
            closed("robot.wheelbaseScale", 0.5, 1.5, ""),
            closed("robot.wheelNoise", 0, 1, ""),
            positive("robot.maxSpeed", 5, "m/s"),
            positive("robot.maxTurnRate", 720, "deg/s"),
            positive("robot.maxAcceleration", 20, "m/s²"),
            count("rangefinder.beams", 1, MAX_BEAMS),
            positive("rangefinder.fieldOfView", 360, "deg"),
            positive("rangefinder.maxRange", 100, "m"),
            closed("rangefinder.rangeSigma", 0, 5, "m"),
            positive("rangefinder.rate", 100, "Hz"),
            closed("rangefinder.mount.forward", -2, 2, "m"),
            closed("rangefinder.mount.left", -2, 2, "m"),
            closed("rangefinder.dropout", 0, 1, ""),
            count("localizer.particles.count", 1, MAX_PARTICLES),
            count("localizer.particles.minCount", 1, MAX_PARTICLES),
            count("localizer.particles.maxCount", 1, MAX_PARTICLES),
            open("localizer.particles.errorBound", 0, 1),
            new Field(
                    "localizer.particles.confidence",
                    MIN_CONFIDENCE,
                    false,
                    MAX_CONFIDENCE,
                    false,
                    "",
                    false,
                    "below 0.5 the particle count bound is meaningless"),
            positive("localizer.particles.binSize", 10, "m"),
            positive("localizer.particles.binTurn", 180, "deg"),
            closed("localizer.particles.startSpread", 0, 100, "m"),
            closed("localizer.particles.startTurnSpread", 0, 180, "deg"),
            closed("localizer.motionNoise.turnFromTurn", 0, 10, ""),
            closed("localizer.motionNoise.turnFromDrive", 0, 10, ""),
            closed("localizer.motionNoise.driveFromDrive", 0, 10, ""),
            closed("localizer.motionNoise.driveFromTurn", 0, 10, ""),
            closed("localizer.motionNoise.minTravel", 0, 10, "m"),
            closed("localizer.motionNoise.minTurn", 0, 180, "deg"),
            count("localizer.rangeModel.beamStep", 1, MAX_BEAMS),
            closed("localizer.rangeModel.hitWeight", 0, 1, ""),
            closed("localizer.rangeModel.shortWeight", 0, 1, ""),
            closed("localizer.rangeModel.maxWeight", 0, 1, ""),
            closed("localizer.rangeModel.randomWeight", 0, 1, ""),
            positive("localizer.rangeModel.hitSpread", 5, "m"),
            positive("localizer.rangeModel.shortDecay", 100, "1/m"),
            closed("localizer.rangeModel.cellSize", 0.01, 1, "m"),
            closed("localizer.resampling.essFraction", 0, 1, ""),
            open("localizer.recovery.slowRate", 0, 1),
            open("localizer.recovery.fastRate", 0, 1),
            closed("localizer.recovery.resetShare", 0, 1, ""),
            closed("localizer.recovery.resetBelow", 0, 1, ""));

    private static final java.util.Map<String, Field> BY_PATH =
            FIELDS.stream().collect(java.util.stream.Collectors.toUnmodifiableMap(Field::path, f -> f));

    /**
     * The limit of a field.
     *
     * @param path the field's path in the file, e.g. {@code robot.wheelbase}
     * @throws IllegalArgumentException when no limit has that path
     */
    public static Field field(String path) {
        Field f = BY_PATH.get(path);
        if (f == null) {
            throw new IllegalArgumentException("no limit for field " + path);
        }
        return f;
    }

    private Limits() {}
}
