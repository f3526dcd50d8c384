package dev.driftlab.app.runs;

/** The run queue has no room for the submission; nothing was queued. Answered 503 with Retry-After. */
public class QueueFull extends RuntimeException {
    public QueueFull(int asked, int free) {
        super("The server is busy: " + asked + " run(s) asked for, room for " + free
                + " right now. Nothing was queued; try again in a little while.");
    }
}
