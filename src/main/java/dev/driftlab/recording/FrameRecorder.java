package dev.driftlab.recording;

import dev.driftlab.geometry.Bounds;
import java.io.ByteArrayOutputStream;
import java.io.DataOutputStream;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.util.ArrayList;
import java.util.List;

/**
 * Records frames into self-describing chunks of up to {@code framesPerChunk} frames. Each frame
 * inside a chunk is compressed on its own, so a player can read one frame without inflating its
 * neighbours.
 */
public final class FrameRecorder implements FrameSink {

    static final int MAGIC = 0x444c4643; // "DLFC"
    static final int VERSION = 1;

    private final Bounds bounds;
    private final double maxRange;
    private final FrameCodec codec;
    private final int framesPerChunk;
    private final ChunkSink sink;
    private final List<byte[]> pending = new ArrayList<>();
    private int chunkIndex;
    private int firstFrame;
    private int frames;
    private long bytes;

    /**
     * A recorder for one run.
     *
     * @param bounds site bounds, metres (written into every chunk's header)
     * @param maxRange rangefinder max range, metres
     * @param framesPerChunk frames per chunk, at least 1
     * @param sink where chunks go
     */
    public FrameRecorder(Bounds bounds, double maxRange, int framesPerChunk, ChunkSink sink) {
        if (framesPerChunk < 1) {
            throw new IllegalArgumentException("framesPerChunk must be at least 1");
        }
        this.bounds = bounds;
        this.maxRange = maxRange;
        this.codec = new FrameCodec(bounds, maxRange);
        this.framesPerChunk = framesPerChunk;
        this.sink = sink;
    }

    @Override
    public void accept(Frame frame) {
        pending.add(codec.encode(frame));
        frames++;
        if (pending.size() == framesPerChunk) {
            flush();
        }
    }

    @Override
    public void finish() {
        if (!pending.isEmpty()) {
            flush();
        }
    }

    /** Frames recorded so far. */
    public int frames() {
        return frames;
    }

    /** Chunks emitted so far. */
    public int chunks() {
        return chunkIndex;
    }

    /** Total bytes of the emitted chunks. */
    public long bytes() {
        return bytes;
    }

    /** Frames per chunk. */
    public int framesPerChunk() {
        return framesPerChunk;
    }

    private void flush() {
        try {
            ByteArrayOutputStream buf = new ByteArrayOutputStream();
            DataOutputStream out = new DataOutputStream(buf);
            out.writeInt(MAGIC);
            out.writeInt(VERSION);
            out.writeDouble(bounds.minX());
            out.writeDouble(bounds.minY());
            out.writeDouble(bounds.maxX());
            out.writeDouble(bounds.maxY());
            out.writeDouble(maxRange);
            out.writeInt(firstFrame);
            out.writeInt(pending.size());
            int offset = 0;
            for (byte[] p : pending) {
                out.writeInt(offset);
                offset += p.length;
            }
            out.writeInt(offset);
            for (byte[] p : pending) {
                out.write(p);
            }
            out.flush();
            byte[] data = buf.toByteArray();
            bytes += data.length;
            sink.store(chunkIndex, firstFrame, pending.size(), data);
            chunkIndex++;
            firstFrame += pending.size();
            pending.clear();
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }
}
