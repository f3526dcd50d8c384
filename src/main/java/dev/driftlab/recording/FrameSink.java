package dev.driftlab.recording;

/** Receives the frames of a run as they are made. */
public interface FrameSink {

    /** Takes one frame; frames arrive in order. */
    void accept(Frame frame);

    /** Called once after the last frame. */
    default void finish() {}

    /** A sink that drops every frame (batches without recording). */
    FrameSink NONE = frame -> {};
}
