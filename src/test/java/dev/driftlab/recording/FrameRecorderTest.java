package dev.driftlab.recording;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import dev.driftlab.geometry.Angles;
import dev.driftlab.geometry.Bounds;
import dev.driftlab.geometry.Pose;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

class FrameRecorderTest {

    private static final double MIN_X = 0;
    private static final double MIN_Y = 0;
    private static final double MAX_X = 24;
    private static final double MAX_Y = 16;
    private static final double MAX_RANGE = 12;

    /** A frame with particles around (cx, cy) with the given spread (uniform over the site if spread < 0). */
    static Frame frame(int index, double cx, double cy, double spread, int n, SplittableRandom rng) {
        float[] x = new float[n];
        float[] y = new float[n];
        float[] h = new float[n];
        float[] w = new float[n];
        double sum = 0;
        for (int i = 0; i < n; i++) {
            if (spread < 0) {
                x[i] = (float) (MAX_X * rng.nextDouble());
                y[i] = (float) (MAX_Y * rng.nextDouble());
                h[i] = (float) (2 * Math.PI * rng.nextDouble() - Math.PI);
            } else {
                x[i] = (float) (cx + spread * gauss(rng));
                y[i] = (float) (cy + spread * gauss(rng));
                h[i] = (float) Angles.wrap(0.3 + 0.05 * gauss(rng));
            }
            w[i] = (float) (0.5 + rng.nextDouble());
            sum += w[i];
        }
        for (int i = 0; i < n; i++) {
            w[i] /= (float) sum;
        }
        float[] ranges = new float[360];
        for (int b = 0; b < ranges.length; b++) {
            ranges[b] = (float) (1 + 10 * rng.nextDouble());
        }
        return new Frame(
                index,
                index * 0.1,
                Pose.of(cx, cy, 0.3),
                Pose.of(cx + 0.1, cy, 0.31),
                Pose.of(cx + 0.02, cy - 0.01, 0.29),
                List.of(new FrameHypothesis(1, cx, cy, 0.3, 0.01, 0, 0.01)),
                n * 0.7,
                0.4,
                0.38,
                0.41,
                0,
                ranges,
                x,
                y,
                h,
                w,
                index == 3 ? List.of("kidnap carried-off") : List.of());
    }

    private static double gauss(SplittableRandom rng) {
        double u = 1 - rng.nextDouble();
        return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * rng.nextDouble());
    }

    @Test
    void roundTrip_withinStatedQuantisationBounds() {
        SplittableRandom rng = new SplittableRandom(5);
        Frame f = frame(3, 10, 5, 0.5, 2000, rng);
        FrameCodec codec = new FrameCodec(new Bounds(MIN_X, MIN_Y, MAX_X, MAX_Y), MAX_RANGE);

        Frame back = codec.decode(codec.encode(f));

        assertThat(back.index()).isEqualTo(3);
        assertThat(back.truth()).isEqualTo(f.truth());
        assertThat(back.estimate()).isEqualTo(f.estimate());
        assertThat(back.hypotheses()).isEqualTo(f.hypotheses());
        assertThat(back.events()).containsExactly("kidnap carried-off");
        assertThat(back.effectiveSize()).isEqualTo(f.effectiveSize());
        for (int b = 0; b < 360; b++) {
            assertThat(back.ranges()[b]).isCloseTo(f.ranges()[b], within((float) (MAX_RANGE / 65535 / 2 + 1e-6)));
        }
        // Particles come back in the codec's order: by quantised x, ties in recording order. Each
        // decoded particle j is matched to exactly the particle it was made from.
        double step = codec.positionStep();
        assertThat(step).isEqualTo(0.01);
        int n = f.particleCount();
        assertThat(back.particleCount()).isEqualTo(n);
        Integer[] order = new Integer[n];
        for (int i = 0; i < n; i++) {
            order[i] = i;
        }
        java.util.Arrays.sort(
                order,
                java.util.Comparator.<Integer>comparingLong(i -> Math.round((f.particleX()[i] - MIN_X) / step))
                        .thenComparingInt(i -> i));
        float wMax = 0;
        for (float w : f.particleWeight()) {
            wMax = Math.max(wMax, w);
        }
        for (int j = 0; j < n; j++) {
            int i = order[j];
            assertThat((double) back.particleX()[j])
                    .as("x of particle %d", i)
                    .isCloseTo(f.particleX()[i], within(step / 2 + 1e-5));
            assertThat((double) back.particleY()[j])
                    .as("y of particle %d", i)
                    .isCloseTo(f.particleY()[i], within(step / 2 + 1e-5));
            assertThat(Math.abs(Angles.difference(back.particleHeading()[j], f.particleHeading()[i])))
                    .as("heading of particle %d", i)
                    .isLessThanOrEqualTo(Math.PI / 256 + 1e-6);
            // every weight here is above a millionth of the largest: 2.8 % relative error
            assertThat(f.particleWeight()[i]).isGreaterThan(wMax * 1e-6f);
            assertThat((double) back.particleWeight()[j])
                    .as("weight of particle %d", i)
                    .isCloseTo(f.particleWeight()[i], within(f.particleWeight()[i] * 0.028));
        }
    }

    @Test
    void shape_readFromTheFrameHead_matchesTheDecodedFrame_andInflatesOnlyTheHead() {
        SplittableRandom rng = new SplittableRandom(11);
        FrameCodec codec = new FrameCodec(new Bounds(MIN_X, MIN_Y, MAX_X, MAX_Y), MAX_RANGE);
        List<byte[]> chunks = new java.util.ArrayList<>();
        FrameRecorder rec = new FrameRecorder(
                new Bounds(MIN_X, MIN_Y, MAX_X, MAX_Y), MAX_RANGE, 5, (index, first, count, data) -> chunks.add(data));
        for (int i = 0; i < 5; i++) {
            rec.accept(frame(i, 10, 5, 0.5, 100 + 1000 * i, rng));
        }
        rec.finish();
        byte[] chunk = chunks.get(0);

        for (int i = 0; i < 5; i++) {
            FrameCodec.Shape s = FrameChunk.shape(chunk, i);
            Frame f = FrameChunk.frame(chunk, i);
            assertThat(s.particles()).isEqualTo(f.particleCount()).isEqualTo(100 + 1000 * i);
            assertThat(s.beams()).isEqualTo(f.ranges().length);
            assertThat(s.hypotheses()).isEqualTo(f.hypotheses().size());
            assertThat(s.eventChars())
                    .isEqualTo(f.events().stream().mapToInt(String::length).sum());
        }
        // a frame cut off after its head still tells its shape: the particles are never read
        byte[] whole = codec.encode(frame(0, 10, 5, 0.5, 200_000, rng));
        byte[] head = java.util.Arrays.copyOf(whole, whole.length / 4);
        assertThat(FrameCodec.shape(head).particles()).isEqualTo(200_000);
        assertThatThrownBy(() -> codec.decode(head)).isInstanceOf(IllegalArgumentException.class);
        assertThatThrownBy(() -> FrameCodec.shape(new byte[] {1, 2, 3}))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessageContaining("damaged");
    }

    @Test
    void weights_withinStatedRelativeError() {
        FrameCodec codec = new FrameCodec(new Bounds(MIN_X, MIN_Y, MAX_X, MAX_Y), MAX_RANGE);
        float[] w = {1f, 0.5f, 0.1f, 1e-3f, 1e-5f};
        float[] x = {1, 2, 3, 4, 5};
        Frame f = new Frame(
                0,
                0,
                Pose.of(0, 0, 0),
                Pose.of(0, 0, 0),
                Pose.of(0, 0, 0),
                List.of(),
                1,
                1,
                1,
                1,
                0,
                new float[0],
                x,
                new float[5],
                new float[5],
                w,
                List.of());

        Frame back = codec.decode(codec.encode(f));

        // x increases with the index, so the order survives the sort by x
        for (int i = 0; i < 5; i++) {
            assertThat((double) back.particleWeight()[i]).isCloseTo(w[i], within(w[i] * 0.028));
        }
    }

    @Test
    void threeMinuteRun_2000Particles_fitsIn16MB_andAnyFrameReadsAlone() {
        SplittableRandom rng = new SplittableRandom(9);
        Map<Integer, byte[]> chunks = new HashMap<>();
        FrameRecorder rec = new FrameRecorder(
                new Bounds(MIN_X, MIN_Y, MAX_X, MAX_Y), MAX_RANGE, 50, (i, first, count, data) -> chunks.put(i, data));
        int frames = 1800; // 3 minutes at 10 Hz
        for (int i = 0; i < frames; i++) {
            double t = i * 0.1;
            // tracking, a kidnap at 85 s with 10 s of spread-out particles, then tracking again
            double spread = t >= 85 && t < 95 ? -1 : 0.15;
            rec.accept(frame(i, 2 + 20 * (t / 180), 4 + 3 * Math.sin(t / 20), spread, 2000, rng));
        }
        rec.finish();

        assertThat(rec.frames()).isEqualTo(frames);
        assertThat(rec.chunks()).isEqualTo(36);
        assertThat(rec.bytes()).isLessThan(16L * 1024 * 1024);
        Frame f = FrameChunk.frame(chunks.get(17), 7);
        assertThat(f.index()).isEqualTo(17 * 50 + 7);
        assertThat(FrameChunk.firstFrame(chunks.get(17))).isEqualTo(850);
        assertThat(FrameChunk.frameCount(chunks.get(35))).isEqualTo(50);
    }

    @Test
    void damagedChunk_isRefusedCleanly() {
        assertThatThrownBy(() -> FrameChunk.frame(new byte[10], 0)).isInstanceOf(IllegalArgumentException.class);
        byte[][] holder = new byte[1][];
        FrameRecorder rec = new FrameRecorder(new Bounds(0, 0, 10, 10), 10, 5, (i, a, b, data) -> holder[0] = data);
        rec.accept(frame(0, 5, 5, 0.1, 100, new SplittableRandom(1)));
        rec.finish();
        byte[] cut = java.util.Arrays.copyOf(holder[0], holder[0].length - 20);
        assertThatThrownBy(() -> FrameChunk.frame(cut, 0)).isInstanceOf(IllegalArgumentException.class);
        assertThatThrownBy(() -> FrameChunk.frame(holder[0], 1)).hasMessageContaining("not in this chunk");
    }
}
