package dev.driftlab.app.runs;

/** A run request that names something wrong (unknown variant, too many seeds). Nothing was queued. */
public class RunRefused extends RuntimeException {

    private final String field;

    public RunRefused(String field, String message) {
        super(field + ": " + message);
        this.field = field;
    }

    /** The request field at fault. */
    public String field() {
        return field;
    }
}
