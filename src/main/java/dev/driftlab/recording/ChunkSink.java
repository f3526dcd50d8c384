package dev.driftlab.recording;

/** Where finished frame chunks go: files for the command line, database rows for the web app. */
@FunctionalInterface
public interface ChunkSink {

    /**
     * Stores one chunk.
     *
     * @param chunkIndex chunk number from 0
     * @param firstFrame index of the chunk's first frame
     * @param frameCount frames in the chunk
     * @param data the chunk, readable with {@link FrameChunk#frame}
     */
    void store(int chunkIndex, int firstFrame, int frameCount, byte[] data);
}
