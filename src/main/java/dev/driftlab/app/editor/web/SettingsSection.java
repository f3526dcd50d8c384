package dev.driftlab.app.editor.web;

import java.util.List;
import java.util.Optional;

/**
 * The server-rendered settings forms of the editor: robot, rangefinder, localizer settings. Each
 * field names its key in the file (relative to the section), our label, the textbook symbol shown
 * as help, its unit and the range the validator accepts.
 */
public enum SettingsSection {
    ROBOT(
            "robot",
            "Robot",
            List.of(
                    Field.number("wheelbase", "Wheelbase", "", "m", "0.05", "2"),
                    Field.number("wheelRadius", "Wheel radius", "", "m", "0.01", "0.5"),
                    Field.integer("ticksPerTurn", "Encoder ticks per wheel turn", "", "", "1", "1000000"),
                    Field.number("footprintRadius", "Footprint radius", "", "m", "0.05", "2"),
                    Field.number("leftWheelScale", "Left wheel size, actual / nominal", "", "", "0.5", "1.5"),
                    Field.number("rightWheelScale", "Right wheel size, actual / nominal", "", "", "0.5", "1.5"),
                    Field.number("wheelbaseScale", "Wheelbase, actual / nominal", "", "", "0.5", "1.5"),
                    Field.number("wheelNoise", "Random wheel travel per metre", "", "fraction", "0", "1"),
                    Field.number("maxSpeed", "Top speed", "", "m/s", "0.01", "5"),
                    Field.number("maxTurnRate", "Top turn rate", "", "deg/s", "1", "720"),
                    Field.number("maxAcceleration", "Acceleration limit", "", "m/s²", "0.01", "10"))),
    RANGEFINDER(
            "rangefinder",
            "Rangefinder",
            List.of(
                    Field.integer("beams", "Beams per scan", "", "", "1", "4096"),
                    Field.number("fieldOfView", "Field of view", "", "deg", "1", "360"),
                    Field.number("maxRange", "Longest range", "", "m", "0.1", "200"),
                    Field.number("rangeSigma", "Range noise", "", "m", "0", "1"),
                    Field.number("rate", "Scans per second", "", "Hz", "0.1", "100"),
                    Field.number("mount.forward", "Mounted ahead of the axle", "", "m", "-2", "2"),
                    Field.number("mount.left", "Mounted left of centre", "", "m", "-2", "2"),
                    Field.number("mount.turn", "Mount turned by", "", "deg", "-180", "180"),
                    Field.number("dropout", "Chance a beam returns nothing", "", "0 to 1", "0", "1"))),
    LOCALIZER(
            "localizer",
            "Localizer settings",
            List.of(
                    Field.integer("particles.count", "Particles", "N", "", "1", "1000000"),
                    Field.flag("particles.adaptive", "Adapt the count to the spread", "KLD-sampling"),
                    Field.integer("particles.minCount", "Fewest particles", "", "", "1", "1000000"),
                    Field.integer("particles.maxCount", "Most particles", "", "", "1", "1000000"),
                    Field.number("particles.errorBound", "Error bound for the count", "epsilon", "", "0.001", "0.5"),
                    Field.number("particles.confidence", "Confidence for the count", "1 - delta", "", "0.5", "0.9999"),
                    Field.choice("particles.start", "Particles start", "", List.of("around-start", "everywhere")),
                    Field.number("motionNoise.turnFromTurn", "Turn noise from turning", "alpha1", "", "0", "10"),
                    Field.number("motionNoise.turnFromDrive", "Turn noise from driving", "alpha2", "", "0", "10"),
                    Field.number("motionNoise.driveFromDrive", "Drive noise from driving", "alpha3", "", "0", "10"),
                    Field.number("motionNoise.driveFromTurn", "Drive noise from turning", "alpha4", "", "0", "10"),
                    Field.choice("rangeModel.kind", "Range model", "", List.of("likelihood-field", "beam")),
                    Field.integer("rangeModel.beamStep", "Use every k-th beam", "", "", "1", "4096"),
                    Field.number("rangeModel.hitWeight", "Hit weight", "z_hit", "", "0", "1"),
                    Field.number("rangeModel.shortWeight", "Short weight", "z_short", "", "0", "1"),
                    Field.number("rangeModel.maxWeight", "Max-range weight", "z_max", "", "0", "1"),
                    Field.number("rangeModel.randomWeight", "Random weight", "z_rand", "", "0", "1"),
                    Field.number("rangeModel.hitSpread", "Hit spread", "sigma_hit", "m", "0.001", "5"),
                    Field.number("rangeModel.shortDecay", "Short-return decay", "lambda_short", "1/m", "0.001", "100"),
                    Field.choice(
                            "resampling.scheme",
                            "Resampling scheme",
                            "",
                            List.of("systematic", "stratified", "residual", "multinomial")),
                    Field.number(
                            "resampling.essFraction",
                            "Resample under this share of effective particles",
                            "N_eff / N",
                            "",
                            "0",
                            "1"),
                    Field.flag("recovery.injection", "Inject random particles when lost", "augmented MCL"),
                    Field.number("recovery.slowRate", "Slow likelihood average rate", "alpha_slow", "", "0.0001", "1"),
                    Field.number(
                            "recovery.fastRate", "Fast likelihood average rate", "alpha_fast", "", "0.0001", "1")));

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
     * @param min smallest value offered by the input (the validator has the last word)
     * @param max largest value offered by the input
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
            List<String> choices) {

        static Field number(String key, String label, String symbol, String unit, String min, String max) {
            return new Field(key, label, symbol, unit, Kind.NUMBER, min, max, List.of());
        }

        static Field integer(String key, String label, String symbol, String unit, String min, String max) {
            return new Field(key, label, symbol, unit, Kind.INTEGER, min, max, List.of());
        }

        static Field flag(String key, String label, String symbol) {
            return new Field(key, label, symbol, "", Kind.FLAG, "", "", List.of());
        }

        static Field choice(String key, String label, String symbol, List<String> choices) {
            return new Field(key, label, symbol, "", Kind.CHOICE, "", "", choices);
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
