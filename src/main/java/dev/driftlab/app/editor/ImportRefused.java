package dev.driftlab.app.editor;

/** An occupancy image that cannot be turned into a floor plan; the message names the field. */
public class ImportRefused extends RuntimeException {

    private final String field;

    /** A refusal of one form field with a plain message. */
    public ImportRefused(String field, String message) {
        super(field + ": " + message);
        this.field = field;
    }

    /** The form field at fault. */
    public String field() {
        return field;
    }
}
