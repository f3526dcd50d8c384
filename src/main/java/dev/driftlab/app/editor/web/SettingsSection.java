package dev.driftlab.app.editor.web;

import dev.driftlab.scenario.Limits;
import java.util.List;
import java.util.Optional;

/**
 * The server-rendered settings forms of the editor: robot, rangefinder, localizer settings. Each
 * field names its key in the file (relative to the section), our label, the textbook symbol shown
 * as help; unit and range come from the scenario's limits table, the one the validator reads.
 */
public enum SettingsSection {
    ROBOT(
            "robot",
            "Robot",
            List.of(
                    Field.number("robot.wheelbase", "Wheelbase", ""),
                    Field.number("robot.wheelRadius", "Wheel radius", ""),
                    Field.integer("robot.ticksPerTurn", "Encoder ticks per wheel turn", ""),
                    Field.number("robot.footprintRadius", "Footprint radius", ""),
                    Field.number("robot.leftWheelScale", "Left wheel size, actual / nominal", ""),
                    Field.number("robot.rightWheelScale", "Right wheel size, actual / nominal", ""),
                    Field.number("robot.wheelbaseScale", "Wheelbase, actual / nominal", ""),
                    Field.number("robot.wheelNoise", "Random wheel travel per metre", ""),
                    Field.number("robot.maxSpeed", "Top speed", ""),
                    Field.number("robot.maxTurnRate", "Top turn rate", ""),
                    Field.number("robot.maxAcceleration", "Acceleration limit", ""))),
    RANGEFINDER(
            "rangefinder",
            "Rangefinder",
            List.of(
                    Field.integer("rangefinder.beams", "Beams per scan", ""),
                    Field.number("rangefinder.fieldOfView", "Field of view", ""),
                    Field.number("rangefinder.maxRange", "Longest range", ""),
                    Field.number("rangefinder.rangeSigma", "Range noise", ""),
                    Field.number("rangefinder.rate", "Scans per second", ""),
                    Field.number("rangefinder.mount.forward", "Mounted ahead of the axle", ""),
                    Field.number("rangefinder.mount.left", "Mounted left of centre", ""),
                    Field.angle("mount.turn", "Mount turned by"),
                    Field.number("rangefinder.dropout", "Chance a beam returns nothing", ""))),
    LOCALIZER(
            "localizer",
            "Localizer settings",
            List.of(
                    Field.integer("localizer.particles.count", "Particles", "N"),
                    Field.flag("particles.adaptive", "Adapt the count to the spread", "KLD-sampling"),
                    Field.integer("localizer.particles.minCount", "Fewest particles", ""),
                    Field.integer("localizer.particles.maxCount", "Most particles", ""),
                    Field.number("localizer.particles.errorBound", "Error bound for the count", "epsilon"),
                    Field.number("localizer.particles.confidence", "Confidence for the count", "1 - delta"),
                    Field.choice("particles.start", "Particles start", "", List.of("around-start", "everywhere")),
                    Field.number("localizer.motionNoise.turnFromTurn", "Turn noise from turning", "alpha1"),
                    Field.number("localizer.motionNoise.turnFromDrive", "Turn noise from driving", "alpha2"),
                    Field.number("localizer.motionNoise.driveFromDrive", "Drive noise from driving", "alpha3"),
                    Field.number("localizer.motionNoise.driveFromTurn", "Drive noise from turning", "alpha4"),
                    Field.choice("rangeModel.kind", "Range model", "", List.of("likelihood-field", "beam")),
                    Field.integer("localizer.rangeModel.beamStep", "Use every k-th beam", ""),
                    Field.number("localizer.rangeModel.hitWeight", "Hit weight", "z_hit"),
                    Field.number("localizer.rangeModel.shortWeight", "Short weight", "z_short"),
                    Field.number("localizer.rangeModel.maxWeight", "Max-range weight", "z_max"),
                    Field.number("localizer.rangeModel.randomWeight", "Random weight", "z_rand"),
                    Field.number("localizer.rangeModel.hitSpread", "Hit spread", "sigma_hit"),
                    Field.number("localizer.rangeModel.shortDecay", "Short-return decay", "lambda_short"),
                    Field.choice(
                            "resampling.scheme",
                            "Resampling scheme",
                            "",
                            List.of("systematic", "stratified", "residual", "multinomial")),
                    Field.number(
                            "localizer.resampling.essFraction",
                            "Resample under this share of effective particles",
                            "N_eff / N"),
                    Field.flag("recovery.injection", "Inject random particles when lost", "augmented MCL"),
                    Field.number("localizer.recovery.slowRate", "Slow likelihood average rate", "alpha_slow"),
                    Field.number("localizer.recovery.fastRate", "Fast likelihood average rate", "alpha_fast")));

    /** The kinds of input a field takes. */
    public enum Kind {
        NUMBER,
        INTEGER,
        FLAG,
        CHOICE
    }

    /**
     * One input of a settings form.
     *
     * @param key key path inside the section, dot separated
     * @param label our label
     * @param symbol textbook symbol shown as help, empty when none
     * @param unit unit shown beside the input, empty when none
     * @param kind input kind
     * @param min smallest value of the input's range, from the scenario's limits table
     * @param max largest value of the input's range, from the same table
     * @param range the range as shown beside the input, saying whether an end is excluded
     * @param choices allowed words of a choice
     */
    public record Field(
            String key,
            String label,
            String symbol,
            String unit,
            Kind kind,
            String min,
            String max,
            String range,
            List<String> choices) {

        /**
         * A number input whose range, unit and whole-number flag come from {@link Limits}, so the
         * form offers what the validator accepts.
         */
        static Field number(String path, String label, String symbol) {
            Limits.Field limit = Limits.field(path);
            return new Field(
                    path.substring(path.indexOf('.') + 1),
                    label,
                    symbol,
                    limit.unit(),
                    limit.whole() ? Kind.INTEGER : Kind.NUMBER,
                    Limits.Field.num(limit.min()),
                    Limits.Field.num(limit.max()),
                    limit.rangeText(),
                    List.of());
        }

        static Field integer(String path, String label, String symbol) {
            return number(path, label, symbol);
        }

        /** An angle input without bounds: headings wrap to (-180, 180] degrees as they are read. */
        static Field angle(String key, String label) {
            return new Field(key, label, "", "deg", Kind.NUMBER, "", "", "any; read as -180 to 180", List.of());
        }

        static Field flag(String key, String label, String symbol) {
            return new Field(key, label, symbol, "", Kind.FLAG, "", "", "", List.of());
        }

        static Field choice(String key, String label, String symbol, List<String> choices) {
            return new Field(key, label, symbol, "", Kind.CHOICE, "", "", "", choices);
        }

        /** The HTML input name and id part: dots would need escaping in selectors. */
        public String inputName() {
            return key.replace('.', '_');
        }

        /** Step attribute of a number input. */
        public String step() {
            return kind == Kind.INTEGER ? "1" : "any";
        }
    }

    private final String key;
    private final String title;
    private final List<Field> fields;

    SettingsSection(String key, String title, List<Field> fields) {
        this.key = key;
        this.title = title;
        this.fields = fields;
    }

    /** The section's key in the file. */
    public String key() {
        return key;
    }

    /** The form's heading. */
    public String title() {
        return title;
    }

    /** The form's inputs in order. */
    public List<Field> fields() {
        return fields;
    }

    static Optional<SettingsSection> byKey(String key) {
        for (SettingsSection s : values()) {
            if (s.key.equals(key)) {
                return Optional.of(s);
            }
        }
        return Optional.empty();
    }
}
