package dev.driftlab.app.player;

import dev.driftlab.app.system.RenderGate;
import java.util.Locale;
import java.util.function.Supplier;

/**
 * Bounds what the player's answers (a run's scene, a chunk's frames as JSON) may cost the server:
 * one {@link RenderGate} for both, so only a few are built at once and those of finished runs are
 * kept, and a size budget each answer's estimate is checked against before it is built.
 */
public final class PlayerRenders {

    /** An answer whose estimated size is over the budget; nothing was built. */
    public static final class TooLarge extends RuntimeException {
        TooLarge(String message) {
            super(message);
        }
    }

    private final RenderGate<byte[]> gate;
    private final long maxAnswerBytes;

    /**
     * @param concurrent scenes and frame chunks built at once
     * @param cacheBytes budget of the cache of finished runs' answers
     * @param maxAnswerBytes largest answer built, bytes of JSON
     */
    public PlayerRenders(int concurrent, long cacheBytes, long maxAnswerBytes) {
        this.gate = new RenderGate<>("player scenes and frames", concurrent, cacheBytes, b -> b.length + 40L);
        this.maxAnswerBytes = maxAnswerBytes;
    }

    /**
     * A run's scene from the cache, or built under the bound and kept when the run is settled.
     *
     * @throws RenderGate.Busy when as many answers as allowed are being built
     */
    public byte[] scene(long runId, boolean settled, Supplier<byte[]> build) {
        return gate.render("scene/" + runId, settled, build);
    }

    /** A chunk's frames from the cache, or built under the bound and kept when the run is settled. */
    public byte[] frames(long runId, int chunk, boolean settled, Supplier<byte[]> build) {
        return gate.render("frames/" + runId + "/" + chunk, settled, build);
    }

    /**
     * Refuses an answer estimated over the budget, saying what it would hold.
     *
     * @param what the answer, as the message names it ("The scene of this run")
     * @param estimate its estimated size, bytes
     * @param holds what makes it large, for the message ("12,000 walls")
     * @param advice what would make it smaller, a sentence
     * @throws TooLarge over the budget
     */
    public void checkBudget(String what, long estimate, String holds, String advice) {
        if (estimate > maxAnswerBytes) {
            throw new TooLarge(String.format(
                    Locale.ROOT,
                    "%s would be about %s of JSON (%s), over the player's budget of %s;" + " it is not built. %s",
                    what,
                    megabytes(estimate),
                    holds,
                    megabytes(maxAnswerBytes),
                    advice));
        }
    }

    /** The gate, so a test can hold its permits or look at what it keeps. */
    public RenderGate<byte[]> gate() {
        return gate;
    }

    private static String megabytes(long bytes) {
        return bytes >= 1 << 20
                ? String.format(Locale.ROOT, "%,.1f MB", bytes / (double) (1 << 20))
                : String.format(Locale.ROOT, "%,d KB", Math.max(1, (bytes + 1023) / 1024));
    }
}
