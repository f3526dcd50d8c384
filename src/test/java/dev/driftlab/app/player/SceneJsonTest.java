package dev.driftlab.app.player;

import static org.assertj.core.api.Assertions.assertThat;

import dev.driftlab.geometry.Bounds;
import dev.driftlab.geometry.Polygon;
import dev.driftlab.geometry.Pose;
import dev.driftlab.recording.Frame;
import dev.driftlab.recording.FrameHypothesis;
import dev.driftlab.recording.FrameRecorder;
import dev.driftlab.scenario.Room;
import dev.driftlab.scenario.Scenario;
import dev.driftlab.scenario.ScenarioFiles;
import dev.driftlab.scenario.Scenarios;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

/**
 * The size estimates the player's budget is checked against, compared with what is then written:
 * never under it (or the budget would not hold), and not so far over that answers well within the
 * budget are refused.
 */
class SceneJsonTest {

    static Scenario manyRooms(int rooms) {
        Scenarios.Builder b = Scenarios.corridor();
        for (int i = 0; i < rooms; i++) {
            b.withRoom(new Room("r" + i, "Room " + i, Polygon.rectangle(30 + (i % 100) * 3, (i / 100) * 3, 2, 2)));
        }
        return b.build();
    }

    @Test
    void sceneBytes_isAtLeastTheSceneWritten_andWithinThreeTimesIt() throws IOException {
        List<Scenario> scenarios = new ArrayList<>(List.of(Scenarios.corridor().build(), manyRooms(2_000)));
        try (var files = Files.list(Path.of("sample-projects"))) {
            for (Path f :
                    files.filter(p -> p.toString().endsWith(".json")).sorted().toList()) {
                ScenarioFiles.check(Files.readString(f)).scenario().ifPresent(scenarios::add);
            }
        }
        assertThat(scenarios).hasSizeGreaterThan(5);

        for (Scenario s : scenarios) {
            long written = SceneJson.bytes(SceneJson.scene(s, "", List.of(0, 1))).length;
            long estimate = SceneJson.sceneBytes(s, 0, 0);
            assertThat(estimate).as(s.name()).isGreaterThanOrEqualTo(written).isLessThan(3 * written + 4_000);
        }
    }

    @Test
    void sceneBytes_countsTheSeriesOfRecordedFrames() {
        List<byte[]> chunks = chunks(400, 50, 10, false);
        long series = SceneJson.bytes(SceneJson.series(chunks)).length;

        long added = SceneJson.sceneBytes(Scenarios.corridor().build(), 0, 400)
                - SceneJson.sceneBytes(Scenarios.corridor().build(), 0, 0);

        assertThat(added).isGreaterThanOrEqualTo(series).isLessThan(3 * series);
        assertThat(SceneJson.series(chunks).get("time").size()).isEqualTo(400);
    }

    @Test
    void chunkSize_isAtLeastTheChunkWritten_andWithinTwiceIt_readFromTheFrameHeads() {
        for (int particles : new int[] {0, 40, 3_000}) {
            for (boolean spread : new boolean[] {false, true}) {
                byte[] chunk = chunks(20, 20, particles, spread).get(0);
                long written = SceneJson.bytes(SceneJson.chunk(chunk)).length;

                SceneJson.ChunkSize size = SceneJson.chunkSize(chunk);

                assertThat(size.frames()).isEqualTo(20);
                assertThat(size.particles()).isEqualTo(20L * particles);
                assertThat(size.bytes())
                        .as("%d particles, spread %s", particles, spread)
                        .isGreaterThanOrEqualTo(written)
                        .isLessThan(2 * written + 20 * 500);
            }
        }
    }

    /** {@code frames} frames of {@code particles} particles in chunks of {@code perChunk}, on a 900 m site. */
    private static List<byte[]> chunks(int frames, int perChunk, int particles, boolean spread) {
        List<byte[]> chunks = new ArrayList<>();
        FrameRecorder rec = new FrameRecorder(
                new Bounds(-450, -450, 450, 450), 30, perChunk, (index, first, count, data) -> chunks.add(data));
        SplittableRandom rng = new SplittableRandom(3);
        for (int i = 0; i < frames; i++) {
            float[] x = new float[particles];
            float[] y = new float[particles];
            float[] h = new float[particles];
            float[] w = new float[particles];
            for (int k = 0; k < particles; k++) {
                // spread over the whole site the coordinates are as long as they get
                x[k] = (float) (spread ? -450 + 900 * rng.nextDouble() : 1 + rng.nextDouble());
                y[k] = (float) (spread ? -450 + 900 * rng.nextDouble() : 1 + rng.nextDouble());
                h[k] = (float) (Math.PI * (2 * rng.nextDouble() - 1));
                w[k] = (float) rng.nextDouble();
            }
            float[] ranges = new float[360];
            for (int b = 0; b < ranges.length; b++) {
                ranges[b] = (float) (30 * rng.nextDouble());
            }
            rec.accept(new Frame(
                    i,
                    0.1 * (i + 1),
                    Pose.of(-123.456789, 321.987654, -3.1),
                    Pose.of(-123.4, 321.9, -3.0),
                    Pose.of(-123.5, 322.0, 3.1),
                    List.of(
                            new FrameHypothesis(0.7, -123.4, 321.9, 3.0, 0.0123456, -0.001234, 0.0234567),
                            new FrameHypothesis(0.3, 400.1, -400.2, -1.0, 1.5, 0.2, 2.5)),
                    particles * 0.713,
                    1.0 / 3,
                    2.0 / 7,
                    5.0 / 11,
                    i % 3,
                    ranges,
                    x,
                    y,
                    h,
                    w,
                    i == 3 ? List.of("kidnap kidnap", "door d1 closed") : List.of()));
        }
        rec.finish();
        return chunks;
    }
}
