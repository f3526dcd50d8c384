package dev.driftlab.cli;

import static org.assertj.core.api.Assertions.assertThat;

import dev.driftlab.scenario.Gate;
import dev.driftlab.scenario.GateMetric;
import dev.driftlab.scenario.Scenarios;
import dev.driftlab.scenario.Waypoint;
import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import javax.xml.parsers.DocumentBuilderFactory;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.w3c.dom.Document;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;
import tools.jackson.databind.node.ObjectNode;

/** The suite command end to end: files written, baseline comparison, exit codes, refusals that write nothing. */
class SuiteJobTest {

    // Exit statuses as documented for users (README, "Suites and profiles"). Literal, so a changed
    // constant in Cli fails here.
    private static final int EXIT_OK = 0;
    private static final int EXIT_FAILED = 1;
    private static final int EXIT_BAD_INPUT = 2;

    private static final JsonMapper JSON = JsonMapper.builder().build();

    @TempDir
    Path dir;

    private Path out;
    private final ByteArrayOutputStream stdout = new ByteArrayOutputStream();
    private final ByteArrayOutputStream stderr = new ByteArrayOutputStream();

    private int run(String... args) {
        return Cli.run(
                args,
                new PrintStream(stdout, true, StandardCharsets.UTF_8),
                new PrintStream(stderr, true, StandardCharsets.UTF_8));
    }

    private String err() {
        return stderr.toString(StandardCharsets.UTF_8);
    }

    /** A short corridor drive with few particles and beams; one gate that holds, one that cannot. */
    private static String scenario(String name, double rmseBound) {
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
        return tree.toString();
    }

    private Path write(String name, String text) throws Exception {
        Path p = dir.resolve(name);
        Files.writeString(p, text);
        return p;
    }

    private Path suite(String scenarios, String profiles) throws Exception {
        return write(
                "team.suite.json",
                "{\"format\":\"driftlab-suite/1\",\"name\":\"Team\",\"seeds\":2,\"scenarios\":[" + scenarios
                        + "],\"profiles\":[" + profiles + "]}");
    }

    private static String profile(String name, String part, String changes) {
        return "{\"format\":\"driftlab-profile/1\",\"name\":\"" + name + "\",\"" + part + "\":" + changes + "}";
    }

    @BeforeEach
    void files() throws Exception {
        out = dir.resolve("out");
        write("a.json", scenario("Corridor A", 5.0));
        write("b.json", scenario("Corridor B", 5.0));
        write("noisy.profile.json", profile("noisy", "rangefinder", "{\"rangeSigma\":0.3,\"dropout\":0.3}"));
        write("few.profile.json", profile("few", "localizer", "{\"particles\":{\"count\":30}}"));
    }

    @Test
    void suite_writesResultReportAndJunit_withOneTestSuitePerScenario() throws Exception {
        Path s = suite(
                "{\"file\":\"a.json\"},{\"file\":\"b.json\",\"seeds\":3}",
                "\"noisy.profile.json\",\"few.profile.json\"");

        int status = run("suite", s.toString(), "--threads", "2", "--out", out.toString(), "--quiet");

        assertThat(status).as(err()).isEqualTo(EXIT_OK);
        JsonNode r = JSON.readTree(Files.readString(out.resolve("result.json")));
        assertThat(r.path("format").asString()).isEqualTo("driftlab-suite-result/1");
        assertThat(r.path("verdict").asString()).isEqualTo("pass");
        assertThat(r.path("columns").toString()).isEqualTo("[\"as is\",\"noisy\",\"few\"]");
        assertThat(r.path("trialsFinished").asInt()).isEqualTo((2 + 3) * 3);
        JsonNode cell = r.path("scenarios").get(1).path("cells").get(2);
        assertThat(cell.path("column").asString()).isEqualTo("few");
        assertThat(cell.path("trials")).hasSize(3);
        assertThat(cell.path("gates").get(0).path("marks")).hasSize(3);
        assertThat(r.path("baseline").isNull()).isTrue();

        Document junit = DocumentBuilderFactory.newInstance()
                .newDocumentBuilder()
                .parse(out.resolve("junit.xml").toFile());
        assertThat(junit.getElementsByTagName("testsuite").getLength()).isEqualTo(2);
        // per scenario: 3 gates (final, rmse, the default route gate) x 3 columns
        assertThat(junit.getElementsByTagName("testcase").getLength()).isEqualTo(2 * 3 * 3);

        String html = Files.readString(out.resolve("report.html"));
        assertThat(html).contains("Simulation results do not certify safety");
        assertThat(html.indexOf("id=\"verdict\"")).isLessThan(html.indexOf("id=\"matrix-h\""));
        assertThat(html.indexOf("id=\"matrix-h\"")).isLessThan(html.indexOf("id=\"reg-h\""));
        assertThat(html.indexOf("id=\"reg-h\"")).isLessThan(html.indexOf("id=\"imp-h\""));
        assertThat(html).contains("No trend: there is no earlier run").doesNotContain("<script");
        assertThat(html).contains("\u2713</span> pass: final");
    }

    @Test
    void baseline_flagsExactlyTheGatesThatChanged_andCarriesTheTrend() throws Exception {
        Path s = suite("{\"file\":\"a.json\"},{\"file\":\"b.json\"}", "\"noisy.profile.json\"");
        assertThat(run("suite", s.toString(), "--out", out.toString(), "--quiet"))
                .as(err())
                .isEqualTo(EXIT_OK);

        // the same run again against itself: nothing changed
        Path again = dir.resolve("again");
        int same = run(
                "suite",
                s.toString(),
                "--out",
                again.toString(),
                "--quiet",
                "--baseline",
                out.resolve("result.json").toString());
        assertThat(same).as(err()).isEqualTo(EXIT_OK);
        JsonNode r2 = JSON.readTree(Files.readString(again.resolve("result.json")));
        assertThat(r2.path("sinceBaseline")).isEmpty();
        assertThat(r2.path("history")).hasSize(1);
        assertThat(Files.readString(again.resolve("report.html")))
                .contains("No gate that held in the baseline fails now")
                .contains("<svg")
                .doesNotContain("No trend");

        // a baseline in which one gate failed and another held where it fails now would flag those two only
        ObjectNode base = (ObjectNode) JSON.readTree(Files.readString(out.resolve("result.json")));
        ObjectNode flipped = (ObjectNode)
                base.path("scenarios").get(1).path("cells").get(1).path("gates").get(0);
        flipped.put("pass", false);
        Path edited = write("edited.json", base.toString());
        // make a gate fail now: B's rmse bound too tight for any trial
        write("b.json", scenario("Corridor B", 0.0001));
        Path third = dir.resolve("third");
        int status = run("suite", s.toString(), "--out", third.toString(), "--quiet", "--baseline", edited.toString());

        assertThat(status).isEqualTo(EXIT_FAILED);
        JsonNode r3 = JSON.readTree(Files.readString(third.resolve("result.json")));
        List<String> changes = new ArrayList<>();
        r3.path("sinceBaseline")
                .forEach(c -> changes.add(c.path("kind").asString() + " "
                        + c.path("scenario").asString() + " ["
                        + c.path("column").asString() + "] " + c.path("gate").asString()));
        assertThat(changes)
                .containsExactly(
                        "regression Corridor B [as is] rmse",
                        "regression Corridor B [noisy] rmse",
                        "improvement Corridor B [noisy] " + flipped.path("id").asString());
        JsonNode reg = r3.path("sinceBaseline").get(0);
        assertThat(reg.path("pairs").asInt()).isEqualTo(2);
        assertThat(reg.path("difference").asDouble()).isEqualTo(-1.0);
        assertThat(r3.path("history")).hasSize(1);
        assertThat(stdout.toString(StandardCharsets.UTF_8)).contains("REGRESSION Corridor B [as is] rmse");
        assertThat(Files.readString(third.resolve("junit.xml"))).contains("type=\"regression\"");
    }

    @Test
    void missingScenarioFile_isRefusedNamingIt_andWritesNothing() throws Exception {
        Path s = suite("{\"file\":\"a.json\"},{\"file\":\"gone.json\"}", "");

        assertThat(run("suite", s.toString(), "--out", out.toString())).isEqualTo(EXIT_BAD_INPUT);
        assertThat(err()).contains("scenarios[1].file").contains("gone.json");
        assertThat(out).doesNotExist();
    }

    @Test
    void emptySuite_isRefused_andWritesNothing() throws Exception {
        Path s = suite("", "");

        assertThat(run("suite", s.toString(), "--out", out.toString())).isEqualTo(EXIT_BAD_INPUT);
        assertThat(err()).contains("scenarios").contains("empty");
        assertThat(out).doesNotExist();
    }

    @Test
    void profileSettingAFieldThatDoesNotExist_isRefusedNamingTheFieldPath_andWritesNothing() throws Exception {
        Path typo = write("typo.profile.json", profile("typo", "rangefinder", "{\"rangeSgma\":0.3}"));
        Path s = suite("{\"file\":\"a.json\"}", "");

        assertThat(run("suite", s.toString(), "--profile", typo.toString(), "--out", out.toString()))
                .isEqualTo(EXIT_BAD_INPUT);
        assertThat(err()).contains("profile \"typo\": rangefinder.rangeSgma: unknown key");
        assertThat(out).doesNotExist();
    }

    @Test
    void profileMakingEveryScenarioInvalid_isReportedPerScenario_andExitsOne() throws Exception {
        Path bad = write("bad.profile.json", profile("too many beams", "rangefinder", "{\"beams\":100000}"));
        Path s = suite("{\"file\":\"a.json\"},{\"file\":\"b.json\"}", "");

        int status = run("suite", s.toString(), "--profile", bad.toString(), "--out", out.toString(), "--quiet");

        assertThat(status).isEqualTo(EXIT_FAILED);
        JsonNode r = JSON.readTree(Files.readString(out.resolve("result.json")));
        assertThat(r.path("verdict").asString()).isEqualTo("not-exercised");
        for (JsonNode sc : r.path("scenarios")) {
            JsonNode asIs = sc.path("cells").get(0);
            JsonNode cell = sc.path("cells").get(1);
            assertThat(asIs.path("status").asString()).isEqualTo("ran");
            assertThat(cell.path("status").asString()).isEqualTo("invalid");
            assertThat(cell.path("problems").get(0).path("path").asString()).isEqualTo("rangefinder.beams");
            assertThat(cell.path("trials")).isEmpty();
        }
        assertThat(stdout.toString(StandardCharsets.UTF_8)).contains("INVALID Corridor A [too many beams]");
        assertThat(Files.readString(out.resolve("report.html"))).contains("invalid under this profile");
    }

    @Test
    void folderOfScenarios_isASuite_andProfilesOnTheCommandLineReplaceTheSuitesOwn() throws Exception {
        Path only = dir.resolve("only");
        Files.createDirectories(only);
        Files.writeString(only.resolve("a.json"), scenario("Corridor A", 5.0));
        Files.copy(dir.resolve("few.profile.json"), only.resolve("few.profile.json"));

        int status = run(
                "suite",
                only.toString(),
                "--seeds",
                "1",
                "--profile",
                dir.resolve("noisy.profile.json").toString(),
                "--out",
                out.toString(),
                "--quiet");

        assertThat(status).as(err()).isEqualTo(EXIT_OK);
        JsonNode r = JSON.readTree(Files.readString(out.resolve("result.json")));
        assertThat(r.path("columns").toString()).isEqualTo("[\"as is\",\"noisy\"]");
        assertThat(r.path("scenarios")).hasSize(1);
        assertThat(r.path("trialsFinished").asInt()).isEqualTo(2);
    }

    @Test
    void badBaseline_isRefused() throws Exception {
        Path s = suite("{\"file\":\"a.json\"}", "");
        Path notSuite = write("batch.json", "{\"format\":\"driftlab-result/2\"}");

        assertThat(run("suite", s.toString(), "--baseline", notSuite.toString(), "--out", out.toString()))
                .isEqualTo(EXIT_BAD_INPUT);
        assertThat(err()).contains("format").contains("not of a suite");
        assertThat(out).doesNotExist();
    }

    @Test
    void outsideLocalizer_isJudgedInEveryCell_andTheReportSaysWhichOne() throws Exception {
        // the example dead-reckoning localizer: one child process per trial (see LocalizerCliTest)
        String java = Path.of(System.getProperty("java.home"), "bin", "java").toString();
        Path s = suite("{\"file\":\"a.json\",\"seeds\":1}", "\"few.profile.json\"");

        int status = run(
                "suite",
                s.toString(),
                "--localizer",
                "'" + java + "' sample-projects/localizers/DeadReckoning.java",
                "--threads",
                "2",
                "--quiet",
                "--out",
                out.toString());

        assertThat(status).as(err()).isIn(0, 1);
        String result = Files.readString(out.resolve("result.json"));
        // every trial was judged on the outside program: no particles reported, so none counted
        assertThat(JSON.readTree(result).path("localizer").asString()).endsWith("DeadReckoning.java");
        assertThat(Files.readString(out.resolve("report.html")))
                .contains("outside: ")
                .contains("DeadReckoning.java");
        // a dead-reckoning localizer reports no particle set; the built-in one always does
        JsonNode cells = JSON.readTree(result).path("scenarios").get(0).path("cells");
        assertThat(cells.size()).isEqualTo(2);
        for (JsonNode cell : cells) {
            assertThat(cell.path("trials").size()).isEqualTo(1);
            for (JsonNode t : cell.path("trials")) {
                assertThat(t.path("meanParticles").isNull()).as(t.toString()).isTrue();
            }
        }
    }
}
