package dev.driftlab.cli;

import static org.assertj.core.api.Assertions.assertThat;

import dev.driftlab.scenario.Scenarios;
import dev.driftlab.scenario.Waypoint;
import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import javax.xml.parsers.DocumentBuilderFactory;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.w3c.dom.Document;
import org.w3c.dom.Element;
import org.w3c.dom.NodeList;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;

/**
 * A route through a door whose robot is stopped by the wall beside it: the batch must fail with
 * exit status 1 (the documented status for a failing gate) and every output must say the trials
 * ended early.
 */
class VerdictCliTest {

    private final ByteArrayOutputStream out = new ByteArrayOutputStream();

    private int run(String... args) {
        return Cli.run(
                args,
                new PrintStream(out, true, StandardCharsets.UTF_8),
                new PrintStream(new ByteArrayOutputStream(), true, StandardCharsets.UTF_8));
    }

    @Test
    void routeBlockedByAWall_exitsOne_andEveryOutputSaysItEndedEarly(@TempDir Path dir) throws Exception {
        // the side room's door spans x = 2.55 to 3.45 on the corridor's north wall; x = 4.2 is wall
        String scenario = Scenarios.corridor()
                .withName("Door to the side room, missed")
                .withoutWaypoints()
                .withWaypoints(new Waypoint(4.2, 1, 0.5, 0), new Waypoint(4.2, 4, 0.5, 0))
                .json();
        Path file = dir.resolve("missed-door.json");
        Files.writeString(file, scenario);
        Path outDir = dir.resolve("out");

        int status =
                run("batch", file.toString(), "--seeds", "2", "--threads", "2", "--out", outDir.toString(), "--quiet");

        assertThat(status).isEqualTo(1);
        assertThat(out.toString(StandardCharsets.UTF_8))
                .startsWith("ENDED EARLY: Door to the side room, missed (2 of 2 trials)")
                .contains("  ! 2 of 2 trials stopped at a contact near (4.2, 1.");
        JsonNode result = JsonMapper.builder()
                .build()
                .readTree(outDir.resolve("result.json").toFile());
        assertThat(result.get("format").asString()).isEqualTo("driftlab-result/2");
        assertThat(result.get("passed").asBoolean()).isFalse();
        assertThat(result.get("verdict").asString()).isEqualTo("ended-early");
        JsonNode gate = result.get("gates").get(0);
        assertThat(gate.get("id").asString()).isEqualTo("route-completed (default)");
        assertThat(gate.get("byDefault").asBoolean()).isTrue();
        assertThat(gate.get("passedTrials").asInt()).isZero();
        assertThat(gate.get("exercisedTrials").asInt()).isEqualTo(2);
        JsonNode end = result.get("trials").get(0).get("end");
        assertThat(end.get("kind").asString()).isEqualTo("contact");
        assertThat(end.get("y").asDouble()).isBetween(1.2, 2.0);
        assertThat(result.get("variants")
                        .get(0)
                        .get("earlyEnds")
                        .get(0)
                        .get("trials")
                        .asInt())
                .isEqualTo(2);

        Document junit = DocumentBuilderFactory.newInstance()
                .newDocumentBuilder()
                .parse(outDir.resolve("junit.xml").toFile());
        NodeList failures = junit.getElementsByTagName("failure");
        assertThat(failures.getLength()).isEqualTo(1);
        assertThat(((Element) failures.item(0)).getAttribute("message")).startsWith("0 of 2 trials (0 %");
        String html = Files.readString(outDir.resolve("report.html"));
        assertThat(html)
                .contains("Verdict: ended early")
                .contains("Read this first")
                .contains("2 of 2 trials stopped at a contact near (4.2, 1.")
                .contains("<h2>Glossary</h2>");
    }
}
