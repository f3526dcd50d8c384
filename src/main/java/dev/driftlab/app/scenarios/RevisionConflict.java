package dev.driftlab.app.scenarios;

/** A save based on a revision that is no longer the latest. Nothing was stored. */
public class RevisionConflict extends RuntimeException {

    private final int base;
    private final int latest;

    public RevisionConflict(int base, int latest, String latestAuthor) {
        super("Not saved: you edited revision " + base + ", but revision " + latest + " (by " + latestAuthor
                + ") has been saved since. Open the latest revision, apply your change again and save.");
        this.base = base;
        this.latest = latest;
    }

    public int base() {
        return base;
    }

    public int latest() {
        return latest;
    }
}
