package dev.driftlab.report;

import static org.assertj.core.api.Assertions.assertThat;

import dev.driftlab.geometry.Pose;
import dev.driftlab.recording.Frame;
import dev.driftlab.recording.FrameHypothesis;
import dev.driftlab.scenario.Scenario;
import dev.driftlab.scenario.ScenarioJson;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;

class FrameSvgTest {

    @Test
    void render_truthFilledEstimateOpen_scanEndsSquare_soShapesTellThemApart() throws Exception {
        Scenario s = ScenarioJson.read(Files.readString(Path.of("sample-projects/storage-hall-kidnap.json")));
        float[] ranges = {2, 3, 4};
        Frame f = new Frame(
                0,
                0.1,
                Pose.of(2, 2, 0),
                Pose.of(2.5, 2, 0),
                Pose.of(2, 2, 0),
                List.of(new FrameHypothesis(1, 2.5, 2, 0, 0.01, 0, 0.01)),
                2,
                0.4,
                0.38,
                0.41,
                0,
                ranges,
                new float[] {2.4f, 2.6f},
                new float[] {2, 2},
                new float[] {0, 0},
                new float[] {0.5f, 0.5f},
                List.of());

        String svg = FrameSvg.render(s, f, new double[] {-0.5, 0, 0.5}, "caption");

        assertThat(svg).containsPattern("<title>true pose</title><circle [^>]*fill=\"#009E73\"");
        assertThat(svg).containsPattern("<title>estimate</title><circle [^>]*fill=\"none\"");
        assertThat(svg.split("<rect [^>]*fill=\"#D55E00\"", -1)).hasSize(4);
    }

    /** A frame with the given numbers of particles (spread along the corridor), beams and hypotheses. */
    static Frame frame(int particles, int beams, int hypotheses) {
        float[] x = new float[particles];
        float[] y = new float[particles];
        float[] w = new float[particles];
        for (int i = 0; i < particles; i++) {
            x[i] = 1 + (i % 100) * 0.05f;
            y[i] = 1 + (i / 100) * 0.01f;
            w[i] = 1f / particles;
        }
        float[] ranges = new float[beams];
        java.util.Arrays.fill(ranges, 2);
        List<FrameHypothesis> hs = new java.util.ArrayList<>();
        for (int i = 0; i < hypotheses; i++) {
            hs.add(new FrameHypothesis(1.0 / hypotheses, 2 + i, 2, 0, 0.01, 0, 0.01));
        }
        return new Frame(
                0,
                0.1,
                Pose.of(2, 2, 0),
                Pose.of(2.5, 2, 0),
                Pose.of(2, 2, 0),
                hs,
                particles,
                0.4,
                0.38,
                0.41,
                0,
                ranges,
                x,
                y,
                new float[particles],
                w,
                List.of());
    }
}
