package dev.driftlab.app.sharing;

/** A token that opens nothing: never issued, revoked or mistyped. Answered 404, the same in every case. */
public class LinkNotFound extends RuntimeException {
    public LinkNotFound() {
        super("This link does not open anything. It may have been revoked; ask the owner for a new one.");
    }
}
