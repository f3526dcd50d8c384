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
}
