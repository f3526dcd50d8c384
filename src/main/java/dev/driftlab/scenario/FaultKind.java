package dev.driftlab.scenario;

import java.util.List;
import java.util.Map;
import java.util.Optional;

/**
 * The one list of fault kinds: each kind's name in the file, its label and timeline mark, and the
 * fields it takes besides {@code id}, {@code kind} and the trigger. The reader and writer, the
 * schema test, the editor's fault form and the run player all take kinds from here, so a kind
 * added here is one the whole app knows.
 */
public enum FaultKind {
    SLIP(
            "slip",
            "slip",
            "S",
            Fault.Slip.class,
            List.of(
                    Field.choice("wheel", "Wheel", "wheel", "left"),
                    Field.number("fraction", "Share of motion lost (0 to 1)", 0.3),
                    Field.number("duration", "Duration (s)", 2))),
    STALL(
            "stall",
            "stall",
            "T",
            Fault.Stall.class,
            List.of(
                    Field.choice("wheel", "Wheel", "wheel", "left"),
                    Field.number("duration", "Duration (s)", 1.5),
                    new Field("encoderSeesIt", "Encoder sees it", "bool", "", false))),
    KIDNAP(
            "kidnap",
            "kidnap",
            "K",
            Fault.Kidnap.class,
            List.of(
                    Field.number("to.x", "Carried to x (m)", 0),
                    Field.number("to.y", "Carried to y (m)", 0),
                    Field.number("to.heading", "Set down heading (deg)", 0))),
    BUMP(
            "bump",
            "bump",
            "B",
            Fault.Bump.class,
            List.of(
                    Field.number("forward", "Pushed forward (m)", 0.1),
                    Field.number("left", "Pushed left (m)", 0),
                    Field.number("turn", "Turned (deg)", 10))),
    DOOR_CHANGE(
            "door-change",
            "door change",
            "D",
            Fault.DoorChange.class,
            List.of(
                    new Field("door", "Door", "ref", "doors", ""),
                    Field.choice("state", "Becomes", "door-state", "closed"))),
    CLUTTER(
            "clutter",
            "clutter",
            "C",
            Fault.ClutterChange.class,
            List.of(
                    new Field("clutter", "Clutter item", "ref", "clutter", ""),
                    Field.choice("action", "Action", "clutter-action", "appear"))),
    BLACKOUT("blackout", "blackout", "O", Fault.Blackout.class, List.of(Field.number("duration", "Duration (s)", 2))),
    NOISE_BURST(
            "noise-burst",
            "noise burst",
            "N",
            Fault.NoiseBurst.class,
            List.of(Field.number("duration", "Duration (s)", 2), Field.number("factor", "Noise factor", 5))),
    SPURIOUS_MAX_RANGE(
            "spurious-max-range",
            "spurious max range",
            "M",
            Fault.SpuriousMaxRange.class,
            List.of(
                    Field.number("duration", "Duration (s)", 2),
                    Field.number("share", "Share of beams reading max range (0 to 1)", 0.3)));

    /** The words of the fixed choices a fault field may offer, by the field's choice name. */
    public static final Map<String, List<String>> CHOICES = Map.of(
            "wheel", List.of("left", "right", "both"),
            "door-state", List.of("open", "closed"),
            "clutter-action", List.of("appear", "vanish"));

    /**
     * One field of a fault kind in the file.
     *
     * @param key key in the fault object, dotted for nested keys ({@code to.x})
     * @param label label in the editor
     * @param type {@code number}, {@code bool}, {@code choice} (words in {@link #CHOICES} under
     *     {@code source}) or {@code ref} (ids of the site list named by {@code source})
     * @param source the choice list or site list a choice or reference draws from, else empty
     * @param initial value a new fault starts with in the editor; for a reference, empty means
     *     the first item of the list
     */
    public record Field(String key, String label, String type, String source, Object initial) {

        static Field number(String key, String label, double initial) {
            return new Field(key, label, "number", "", initial);
        }

        static Field choice(String key, String label, String source, String initial) {
            return new Field(key, label, "choice", source, initial);
        }
    }

    private final String fileName;
    private final String label;
    private final String mark;
    private final Class<? extends Fault> type;
    private final List<Field> fields;

    FaultKind(String fileName, String label, String mark, Class<? extends Fault> type, List<Field> fields) {
        this.fileName = fileName;
        this.label = label;
        this.mark = mark;
        this.type = type;
        this.fields = fields;
    }

    /** The kind's name in the file, e.g. {@code door-change}. */
    public String fileName() {
        return fileName;
    }

    /** The kind's name in words, e.g. "door change". */
    public String label() {
        return label;
    }

    /** One letter marking the kind on the editor's timeline. */
    public String mark() {
        return mark;
    }

    /** The fields the kind takes besides id, kind and trigger, in file order. */
    public List<Field> fields() {
        return fields;
    }

    /**
     * The key of the pose a fault of this kind sets on the plan ({@code to}: where a kidnap sets the
     * robot down), or empty when it sets none: the prefix shared by the kind's {@code .x}, {@code .y}
     * and {@code .heading} fields. The editor draws, picks and places this pose for every kind that
     * has one, so it need not know which kinds those are.
     */
    public String target() {
        for (Field f : fields) {
            if (f.key().endsWith(".heading")) {
                String prefix = f.key().substring(0, f.key().length() - ".heading".length());
                if (hasField(prefix + ".x") && hasField(prefix + ".y")) {
                    return prefix;
                }
            }
        }
        return "";
    }

    private boolean hasField(String key) {
        return fields.stream().anyMatch(f -> f.key().equals(key));
    }

    /** The kind of a fault. */
    public static FaultKind of(Fault f) {
        for (FaultKind k : values()) {
            if (k.type.isInstance(f)) {
                return k;
            }
        }
        throw new IllegalStateException("no kind for " + f.getClass().getName());
    }

    /** The kind with a file name, if any. */
    public static Optional<FaultKind> byFileName(String name) {
        for (FaultKind k : values()) {
            if (k.fileName.equals(name)) {
                return Optional.of(k);
            }
        }
        return Optional.empty();
    }
}
