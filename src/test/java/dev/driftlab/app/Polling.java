package dev.driftlab.app;

import java.time.Duration;

/** Waits for a condition in tests, and fails the test when it does not hold within a deadline. */
public final class Polling {

    /** Long enough for a queued scripted run on a loaded build machine, short enough to fail. */
    public static final Duration DEFAULT_LIMIT = Duration.ofSeconds(30);

    /** A condition that may call into the app. */
    @FunctionalInterface
    public interface Condition {
        boolean holds() throws Exception;
    }

    private Polling() {}

    /** Polls every 10 ms until the condition holds; fails naming {@code what} after 30 s. */
    public static void until(String what, Condition condition) throws Exception {
        until(what, DEFAULT_LIMIT, condition);
    }

    /** Polls every 10 ms until the condition holds; fails naming {@code what} after {@code limit}. */
    public static void until(String what, Duration limit, Condition condition) throws Exception {
        long deadline = System.nanoTime() + limit.toNanos();
        while (!condition.holds()) {
            if (System.nanoTime() - deadline > 0) {
                throw new AssertionError(what + " did not happen within " + limit.toSeconds() + " s");
            }
            Thread.sleep(10);
        }
    }
}
