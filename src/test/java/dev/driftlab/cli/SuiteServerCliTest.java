package dev.driftlab.cli;

import static org.assertj.core.api.Assertions.assertThat;

import dev.driftlab.app.DriftlabApplication;
import dev.driftlab.report.ResultDocs;
import dev.driftlab.scenario.Gate;
import dev.driftlab.scenario.GateMetric;
import dev.driftlab.scenario.Scenarios;
import dev.driftlab.scenario.Waypoint;
import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.test.web.server.LocalServerPort;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;
import tools.jackson.databind.node.ArrayNode;
import tools.jackson.databind.node.ObjectNode;

/**
 * {@code suite --server} against the whole app on a real port, with the real trial engine: the
 * result it writes against a local run of the same suite on the same seeds, the server's own
 * baseline for a suite run again by its link, a baseline file compared here, and the exit
 * statuses of refusals, unreachable servers and timeouts.
 */
@SpringBootTest(classes = DriftlabApplication.class, webEnvironment = SpringBootTest.WebEnvironment.RANDOM_PORT)
class SuiteServerCliTest {

    // Exit statuses as documented for users (README, "Suites on a server from CI"). Literal, so a
    // changed constant in Cli fails here.
    private static final int EXIT_OK = 0;
    private static final int EXIT_FAILED = 1;
    private static final int EXIT_BAD_INPUT = 2;
    private static final int EXIT_NO_ANSWER = 3;

    private static final JsonMapper JSON = JsonMapper.builder().build();
    private static final Pattern SUITE_LINK = Pattern.compile("suite: (http://\\S+/suites/(\\S+))");
    private static final Pattern RUN_LINK = Pattern.compile("run: http://\\S+/suite-runs/(\\S+)");
    private static final Path SAMPLES = Path.of("sample-projects").toAbsolutePath();

    @LocalServerPort
    int port;

    private ByteArrayOutputStream out = new ByteArrayOutputStream();
    private ByteArrayOutputStream err = new ByteArrayOutputStream();

    private String server() {
        return "http://localhost:" + port;
    }

    private int cli(String... args) {
        out = new ByteArrayOutputStream();
        err = new ByteArrayOutputStream();
        return Cli.run(
                args,
                new PrintStream(out, true, StandardCharsets.UTF_8),
                new PrintStream(err, true, StandardCharsets.UTF_8));
    }

    private String out() {
        return out.toString(StandardCharsets.UTF_8);
    }

    private String err() {
        return err.toString(StandardCharsets.UTF_8);
    }

    private static JsonNode json(Path p) throws Exception {
        return JSON.readTree(Files.readString(p));
    }

    private static String group(Pattern p, String text) {
        Matcher m = p.matcher(text);
        assertThat(m.find()).as(text).isTrue();
        return m.group(m.groupCount());
    }

    /** Each scenario's cells (gates with their marks and reasons, trials without answer times). */
    private static JsonNode cells(JsonNode result) {
        ArrayNode rows = JSON.createArrayNode();
        for (JsonNode s : result.path("scenarios")) {
            ObjectNode row = rows.addObject();
            row.put("name", s.path("name").asString());
            row.set("seeds", s.path("seeds"));
            ArrayNode cells = row.putArray("cells");
            for (JsonNode c : s.path("cells")) {
                cells.add(ResultDocs.withoutTimings(c));
            }
        }
        return rows;
    }

    /** A suite file of the sample office with both sample profiles, two seeds: cheap, and its gates fail. */
    private static Path sampleSuite(Path dir) throws Exception {
        Path file = dir.resolve("office.suite.json");
        Files.writeString(file, """
                {"format": "driftlab-suite/1", "name": "Office under the sample profiles", "seeds": 2,
                 "scenarios": [{"file": "%s"}],
                 "profiles": ["%s", "%s"]}""".formatted(
                        SAMPLES.resolve("office-carpet-stall.json"),
                        SAMPLES.resolve("suites/noisier-rangefinder.profile.json"),
                        SAMPLES.resolve("suites/fewer-particles.profile.json")));
        return file;
    }

    /** A short corridor drive whose RMS gate holds with {@code rmseBound} 5 m and cannot with 1 mm. */
    private static Path corridorSuite(Path dir, String name, double rmseBound) throws Exception {
        String doc = Scenarios.corridor()
                .withName(name)
                .withoutWaypoints()
                .withWaypoints(new Waypoint(7, 1, 0.6, 0))
                .withGate(new Gate("final", GateMetric.FINAL_ERROR, 0.5, 0.5))
                .withGate(new Gate("rmse", GateMetric.POSITION_RMSE, rmseBound, 1.0))
                .json();
        ObjectNode tree = (ObjectNode) JSON.readTree(doc);
        ((ObjectNode) tree.path("localizer").path("particles")).put("count", 150);
        ((ObjectNode) tree.path("rangefinder")).put("beams", 45);
        Files.writeString(dir.resolve("corridor.json"), tree.toString());
        Files.writeString(
                dir.resolve("few.profile.json"),
                "{\"format\":\"driftlab-profile/1\",\"name\":\"few\",\"localizer\":{\"particles\":{\"count\":60}}}");
        Path file = dir.resolve("corridor.suite.json");
        Files.writeString(file, """
                {"format": "driftlab-suite/1", "name": "%s", "seeds": 2,
                 "scenarios": [{"file": "corridor.json"}], "profiles": ["few.profile.json"]}""".formatted(name));
        return file;
    }

    @Test
    void sampleSuite_onTheServer_judgesEveryCellAsALocalRunOnTheSameSeeds(@TempDir Path dir) throws Exception {
        Path suite = sampleSuite(dir);
        int local = cli("suite", suite.toString(), "--threads", "2", "--out", dir + "/local", "--quiet");
        String localOut = out();

        int remote = cli("suite", suite.toString(), "--server", server(), "--out", dir + "/remote");

        // two seeds are too few for the office's 90 % gates: a failing suite, on both sides
        assertThat(local).isEqualTo(EXIT_FAILED);
        assertThat(remote).as(err()).isEqualTo(EXIT_FAILED);
        JsonNode a = json(dir.resolve("local/result.json"));
        JsonNode b = json(dir.resolve("remote/result.json"));
        assertThat(b.path("format").asString()).isEqualTo("driftlab-suite-result/1");
        assertThat(b.path("columns")).isEqualTo(a.path("columns"));
        // one scenario, three columns of two trials each, every gate with a mark per seed
        JsonNode localCells = cells(a).get(0).path("cells");
        assertThat(localCells).hasSize(3);
        for (JsonNode cell : localCells) {
            assertThat(cell.path("trials")).hasSize(2);
            assertThat(cell.path("gates")).isNotEmpty();
            assertThat(cell.path("gates").get(0).path("marks")).hasSize(2);
        }
        assertThat(cells(b)).isEqualTo(cells(a));
        for (String key : List.of("passed", "verdict", "gatesPlanned", "gatesPassing", "trialsFinished")) {
            assertThat(b.path(key)).as(key).isEqualTo(a.path(key));
        }
        assertThat(b.path("baseline").isNull()).isTrue();
        assertThat(Files.readString(dir.resolve("remote/junit.xml"))).contains("<testsuite");
        assertThat(Files.readString(dir.resolve("remote/report.html")))
                .contains("Simulation results do not certify safety");
        assertThat(out().lines().findFirst()).isEqualTo(localOut.lines().findFirst());
        assertThat(err()).contains("suite: 100 %, 3/3 cells ended");
        assertThat(group(SUITE_LINK, err())).isNotBlank();

        // the same suite again on the server, compared here with a baseline file: the local result in
        // which one gate that fails now had held, so exactly that gate regressed
        ObjectNode base = (ObjectNode) a.deepCopy();
        ObjectNode flipped = null;
        for (JsonNode g : base.path("scenarios").get(0).path("cells").get(0).path("gates")) {
            if (!g.path("pass").asBoolean() && flipped == null) {
                flipped = (ObjectNode) g;
            }
        }
        assertThat(flipped).as("a failing gate of the office as it is").isNotNull();
        flipped.put("pass", true);
        flipped.put("passedTrials", flipped.path("exercisedTrials").asInt());
        for (JsonNode mark : flipped.path("marks")) {
            ((ObjectNode) mark)
                    .put("passed", ((ObjectNode) mark).path("exercised").asBoolean());
        }
        Path baseline = dir.resolve("baseline.json");
        Files.writeString(baseline, base.toString());
        int compared = cli(
                "suite",
                suite.toString(),
                "--server",
                server(),
                "--baseline",
                baseline.toString(),
                "--out",
                dir + "/compared",
                "--quiet");
        assertThat(compared).as(err()).isEqualTo(EXIT_FAILED);
        assertThat(err()).isEmpty();
        JsonNode c = json(dir.resolve("compared/result.json"));
        assertThat(cells(c)).isEqualTo(cells(a));
        assertThat(c.path("scenarios").get(0).path("source").asString()).startsWith("revision 1");
        assertThat(c.path("baseline").path("suite").asString()).isEqualTo("Office under the sample profiles");
        assertThat(c.path("baseline").path("generatedAt")).isEqualTo(a.path("generatedAt"));
        assertThat(c.path("history")).hasSize(1);
        JsonNode changes = c.path("sinceBaseline");
        assertThat(changes).hasSize(1);
        assertThat(changes.get(0).path("kind").asString()).isEqualTo("regression");
        assertThat(changes.get(0).path("column").asString()).isEqualTo("as is");
        assertThat(changes.get(0).path("gate").asString())
                .isEqualTo(flipped.path("id").asString());
        assertThat(out()).contains("REGRESSION Open office");
        assertThat(Files.readString(dir.resolve("compared/junit.xml"))).contains("<testsuite");
        assertThat(Files.readString(dir.resolve("compared/report.html")))
                .contains("Simulation results do not certify safety");
    }

    @Test
    void passingSuite_exitsZero_andItsLinkRunsAgainstTheServersPreviousRun(@TempDir Path dir) throws Exception {
        Path suite = corridorSuite(dir, "Corridor on the server", 5.0);

        int first = cli("suite", suite.toString(), "--server", server(), "--out", dir + "/first");

        assertThat(first).as(err()).isEqualTo(EXIT_OK);
        assertThat(out()).startsWith("PASS: suite Corridor on the server (");
        JsonNode r1 = json(dir.resolve("first/result.json"));
        assertThat(r1.path("passed").asBoolean()).isTrue();
        assertThat(r1.path("baseline").isNull()).isTrue();
        String viewLink = group(SUITE_LINK, err());
        String view = viewLink.substring(viewLink.lastIndexOf('/') + 1);

        // the stored suite by its view link (a whole URL, as pasted from the log): the server's baseline applies
        Matcher m = SUITE_LINK.matcher(err());
        assertThat(m.find()).isTrue();
        int again = cli("suite", "--link", m.group(1), "--server", server(), "--out", dir + "/again", "--quiet");

        assertThat(again).as(err()).isEqualTo(EXIT_OK);
        JsonNode r2 = json(dir.resolve("again/result.json"));
        assertThat(r2.path("baseline").path("generatedAt")).isEqualTo(r1.path("generatedAt"));
        assertThat(r2.path("history")).hasSize(1);
        assertThat(cells(r2)).isEqualTo(cells(r1));
        assertThat(view).hasSize(43);
    }

    @Test
    void failingGate_exitsOne_withTheVerdictAndTheGateNamed(@TempDir Path dir) throws Exception {
        Path suite = corridorSuite(dir, "Corridor held to a millimetre", 0.001);

        int status = cli("suite", suite.toString(), "--server", server(), "--out", dir.toString(), "--quiet");

        assertThat(status).as(err()).isEqualTo(EXIT_FAILED);
        assertThat(out()).startsWith("FAIL: suite Corridor held to a millimetre (");
        assertThat(out()).contains("FAIL Corridor held to a millimetre [as is] rmse:");
        assertThat(out()).contains("FAIL Corridor held to a millimetre [few] rmse:");
        assertThat(json(dir.resolve("result.json")).path("passed").asBoolean()).isFalse();
    }

    @Test
    void badInput_exitsTwo_namingWhatIsWrong(@TempDir Path dir) throws Exception {
        assertThat(cli("suite", dir + "/missing.suite.json", "--server", server(), "--out", dir + "/o"))
                .isEqualTo(EXIT_BAD_INPUT);
        assertThat(err()).contains("missing.suite.json: cannot read");
        assertThat(dir.resolve("o")).doesNotExist();

        assertThat(cli("suite", "--link", "A".repeat(43), "--server", server(), "--out", dir + "/o"))
                .isEqualTo(EXIT_BAD_INPUT);
        assertThat(err()).startsWith("driftlab suite: --link: ");

        assertThat(cli("suite", "--link", "not a token", "--server", server(), "--out", dir + "/o"))
                .isEqualTo(EXIT_BAD_INPUT);
        assertThat(err()).contains("--link must be a suite link (.../suites/TOKEN) or its token");

        Path suite = corridorSuite(dir, "Corridor", 5.0);
        assertThat(cli("suite", suite.toString(), "--server", "ftp://example", "--out", dir + "/o"))
                .isEqualTo(EXIT_BAD_INPUT);
        assertThat(err()).contains("--server must be an http:// or https:// address");

        assertThat(cli("suite", "--link", "A".repeat(43), "--seeds", "3", "--server", server(), "--out", dir + "/o"))
                .isEqualTo(EXIT_BAD_INPUT);
        assertThat(err()).contains("--seeds goes with a suite file; a link runs the suite as the server stores it");

        assertThat(cli("suite", suite.toString(), "--timeout", "5", "--out", dir + "/o"))
                .isEqualTo(EXIT_BAD_INPUT);
        assertThat(err()).contains("--timeout goes with --server");

        // more profiles than a stored suite takes: the server's refusal, worded as it worded it, naming the field
        StringBuilder profiles = new StringBuilder();
        for (int i = 0; i < 7; i++) {
            Files.writeString(
                    dir.resolve("p" + i + ".profile.json"),
                    "{\"format\":\"driftlab-profile/1\",\"name\":\"p" + i
                            + "\",\"localizer\":{\"particles\":{\"count\":" + (100 + i) + "}}}");
            profiles.append(i == 0 ? "" : ",").append("\"p").append(i).append(".profile.json\"");
        }
        Path many = dir.resolve("many.suite.json");
        Files.writeString(
                many,
                "{\"format\":\"driftlab-suite/1\",\"name\":\"Many\",\"seeds\":1,"
                        + "\"scenarios\":[{\"file\":\"corridor.json\"}],\"profiles\":[" + profiles + "]}");
        int refused = cli("suite", many.toString(), "--server", server(), "--out", dir + "/o");
        assertThat(refused).as(err()).isEqualTo(EXIT_BAD_INPUT);
        assertThat(err())
                .contains("driftlab suite: the server refused the suite")
                .contains("profiles");
    }

    @Test
    void unreachableServer_exitsThree_sayingSo(@TempDir Path dir) throws Exception {
        Path suite = corridorSuite(dir, "Corridor", 5.0);
        // port 1 on the loopback address: nothing listens there
        int status = cli("suite", suite.toString(), "--server", "http://127.0.0.1:1", "--out", dir + "/o");

        assertThat(status).isEqualTo(EXIT_NO_ANSWER);
        assertThat(err()).contains("driftlab suite: cannot reach the server at http://127.0.0.1:1");
        assertThat(dir.resolve("o/result.json")).doesNotExist();
    }

    @Test
    void timeout_exitsThree_andCancelsTheRunItStarted(@TempDir Path dir) throws Exception {
        // 60 trials of a kidnap scenario of about three minutes of robot time each: even at under a
        // second per trial on two threads, far longer than the 3 s the timeout allows
        Path suite = dir.resolve("long.suite.json");
        Files.writeString(suite, """
                {"format": "driftlab-suite/1", "name": "Long", "seeds": 60,
                 "scenarios": [{"file": "%s"}]}""".formatted(SAMPLES.resolve("storage-hall-kidnap.json")));

        int status = cli("suite", suite.toString(), "--server", server(), "--timeout", "0.05", "--out", dir + "/o");

        assertThat(status).as(err()).isEqualTo(EXIT_NO_ANSWER);
        assertThat(err())
                .contains("driftlab suite: the suite run did not finish within 0.05 minutes (--timeout); cancelled it");
        assertThat(dir.resolve("o/result.json")).doesNotExist();
        HttpResponse<String> r = HttpClient.newHttpClient()
                .send(
                        HttpRequest.newBuilder(URI.create(server() + "/api/suite-runs/" + group(RUN_LINK, err())))
                                .build(),
                        HttpResponse.BodyHandlers.ofString());
        JsonNode run = JSON.readTree(r.body());
        assertThat(run.path("cells").get(0).path("runState").asString()).isEqualTo("cancelled");
    }
}
