package dev.driftlab.recording;

import dev.driftlab.geometry.Bounds;
import java.nio.BufferUnderflowException;
import java.nio.ByteBuffer;
import java.util.Arrays;

/** Reads frames out of a chunk written by {@link FrameRecorder}. */
public final class FrameChunk {

    private FrameChunk() {}

    /** Number of frames in a chunk. */
    public static int frameCount(byte[] chunk) {
        return header(chunk).getInt(FRAME_COUNT_AT);
    }

    /** Index (in the run) of the chunk's first frame. */
    public static int firstFrame(byte[] chunk) {
        return header(chunk).getInt(FIRST_FRAME_AT);
    }

    private static final int BOUNDS_AT = 8;
    private static final int FIRST_FRAME_AT = BOUNDS_AT + 5 * 8;
    private static final int FRAME_COUNT_AT = FIRST_FRAME_AT + 4;
    private static final int OFFSETS_AT = FRAME_COUNT_AT + 4;

    /**
     * Decodes the i-th frame of a chunk (0-based within the chunk) without touching the others.
     *
     * @throws IllegalArgumentException when the chunk is damaged or i is out of range
     */
    public static Frame frame(byte[] chunk, int i) {
        try {
            ByteBuffer b = header(chunk);
            int count = b.getInt(FRAME_COUNT_AT);
            if (i < 0 || i >= count) {
                throw new IllegalArgumentException("frame " + i + " is not in this chunk of " + count);
            }
            FrameCodec codec = new FrameCodec(
                    new Bounds(
                            b.getDouble(BOUNDS_AT),
                            b.getDouble(BOUNDS_AT + 8),
                            b.getDouble(BOUNDS_AT + 16),
                            b.getDouble(BOUNDS_AT + 24)),
                    b.getDouble(BOUNDS_AT + 32));
            int dataAt = OFFSETS_AT + 4 * (count + 1);
            int from = dataAt + b.getInt(OFFSETS_AT + 4 * i);
            int to = dataAt + b.getInt(OFFSETS_AT + 4 * (i + 1));
            if (from < dataAt || to > chunk.length || to < from) {
                throw new IllegalArgumentException("frame chunk is damaged");
            }
            return codec.decode(Arrays.copyOfRange(chunk, from, to));
        } catch (IndexOutOfBoundsException | BufferUnderflowException e) {
            throw new IllegalArgumentException("frame chunk is damaged", e);
        }
    }

    /**
     * What the i-th frame of a chunk holds, read without decoding it (see {@link FrameCodec#shape}).
     *
     * @throws IllegalArgumentException when the chunk is damaged or i is out of range
     */
    public static FrameCodec.Shape shape(byte[] chunk, int i) {
        try {
            ByteBuffer b = header(chunk);
            int count = b.getInt(FRAME_COUNT_AT);
            if (i < 0 || i >= count) {
                throw new IllegalArgumentException("frame " + i + " is not in this chunk of " + count);
            }
            int dataAt = OFFSETS_AT + 4 * (count + 1);
            int from = dataAt + b.getInt(OFFSETS_AT + 4 * i);
            int to = dataAt + b.getInt(OFFSETS_AT + 4 * (i + 1));
            if (from < dataAt || to > chunk.length || to < from) {
                throw new IllegalArgumentException("frame chunk is damaged");
            }
            return FrameCodec.shape(Arrays.copyOfRange(chunk, from, to));
        } catch (IndexOutOfBoundsException | BufferUnderflowException e) {
            throw new IllegalArgumentException("frame chunk is damaged", e);
        }
    }

    private static ByteBuffer header(byte[] chunk) {
        if (chunk.length < OFFSETS_AT) {
            throw new IllegalArgumentException("frame chunk is too short");
        }
        ByteBuffer b = ByteBuffer.wrap(chunk);
        if (b.getInt(0) != FrameRecorder.MAGIC || b.getInt(4) != FrameRecorder.VERSION) {
            throw new IllegalArgumentException("not a frame chunk of this version");
        }
        return b;
    }
}
