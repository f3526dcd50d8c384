package dev.driftlab.cli;

import static org.assertj.core.api.Assertions.assertThat;

import dev.driftlab.localizer.FoxBound;
import dev.driftlab.scenario.Limits;
import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import javax.xml.parsers.DocumentBuilderFactory;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.w3c.dom.Document;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;

/** The run, batch and sweep commands end to end: files written, exit codes, one-line errors. */
class JobsTest {

    // Exit statuses as documented for users (README, "Command line"): 0 every gate holds, 1 a gate
    // fails or validation found errors, 2 bad input. Literal, so a changed constant in Cli fails here.
    private static final int EXIT_OK = 0;
    private static final int EXIT_FAILED = 1;
    private static final int EXIT_BAD_INPUT = 2;

    private final ByteArrayOutputStream out = new ByteArrayOutputStream();
    private final ByteArrayOutputStream err = new ByteArrayOutputStream();

    private int run(String... args) {
        return Cli.run(
                args,
                new PrintStream(out, true, StandardCharsets.UTF_8),
                new PrintStream(err, true, StandardCharsets.UTF_8));
    }

    private String err() {
        return err.toString(StandardCharsets.UTF_8);
    }

    private static JsonNode json(Path p) throws Exception {
        return JsonMapper.builder().build().readTree(Files.readString(p));
    }

    private static Document xml(Path p) throws Exception {
        return DocumentBuilderFactory.newInstance().newDocumentBuilder().parse(p.toFile());
    }

    @Test
    void run_writesResultReportJunitAndFrames(@TempDir Path dir) throws Exception {
        int status = run(
                "run", "sample-projects/storage-hall-kidnap.json", "--seed", "2", "--out", dir.toString(), "--quiet");

        assertThat(status).isEqualTo(EXIT_OK);
        JsonNode result = json(dir.resolve("result.json"));
        assertThat(result.get("format").asString()).isEqualTo("driftlab-result/2");
        assertThat(result.get("kind").asString()).isEqualTo("run");
        assertThat(result.get("verdict").asString()).isEqualTo("pass");
        assertThat(result.get("trials").get(0).get("end").get("kind").asString())
                .isEqualTo("completed");
        assertThat(result.get("trials")
                        .get(0)
                        .get("kidnaps")
                        .get(0)
                        .get("recovered")
                        .asBoolean())
                .isTrue();
        assertThat(result.get("series").get("time").size()).isGreaterThan(1000);
        String html = Files.readString(dir.resolve("report.html"));
        assertThat(html)
                .contains("Simulation results do not certify safety")
                .contains("Before the kidnap", "Just after the kidnap", "Recovered (")
                .contains("Verdict: pass")
                .doesNotContain("<script");
        Document junit = xml(dir.resolve("junit.xml"));
        // the scenario's two gates plus the default whole-route gate
        assertThat(junit.getElementsByTagName("testcase").getLength()).isEqualTo(3);
        assertThat(junit.getElementsByTagName("failure").getLength()).isZero();
        JsonNode index = json(dir.resolve("frames/index.json"));
        int chunks = index.get("chunks").asInt();
        assertThat(chunks).isGreaterThan(10);
        byte[] chunk = Files.readAllBytes(dir.resolve("frames/chunk-00003.bin"));
        assertThat(dev.driftlab.recording.FrameChunk.frame(chunk, 4).index()).isEqualTo(3 * 50 + 4);
    }

    @Test
    void batch_withFailingGate_exitsOne_andListsTheFailureInJunit(@TempDir Path dir) throws Exception {
        // the no-injection variant cannot recover from the kidnap, so its recovery gate fails
        int status = run(
                "batch",
                "sample-projects/storage-hall-kidnap.json",
                "--seeds",
                "2",
                "--out",
                dir.toString(),
                "--threads",
                "2",
                "--quiet");

        assertThat(status).isEqualTo(EXIT_FAILED);
        JsonNode result = json(dir.resolve("result.json"));
        assertThat(result.get("passed").asBoolean()).isFalse();
        assertThat(result.get("trials").size()).isEqualTo(4);
        assertThat(result.get("comparisons").get(0).get("pairs").asInt()).isEqualTo(2);
        Document junit = xml(dir.resolve("junit.xml"));
        assertThat(junit.getElementsByTagName("failure").getLength()).isGreaterThanOrEqualTo(1);
        assertThat(Files.readAllLines(dir.resolve("trials.jsonl"))).hasSize(4);
    }

    @Test
    void batch_withVariantsFromASecondFile(@TempDir Path dir) throws Exception {
        Path variants = dir.resolve("variants.json");
        Files.writeString(variants, """
                {"format": "driftlab-variants/1",
                 "variants": [{"name": "500 particles", "localizer": {"particles": {"count": 500}}}]}""");

        int status = run(
                "batch",
                "sample-projects/office-carpet-stall.json",
                "--seeds",
                "1",
                "--out",
                dir.resolve("out").toString(),
                "--variants",
                variants.toString(),
                "--quiet");

        JsonNode result = json(dir.resolve("out/result.json"));
        assertThat(status).isEqualTo(result.get("passed").asBoolean() ? EXIT_OK : EXIT_FAILED);
        assertThat(result.get("variants").size()).isEqualTo(3);
        assertThat(result.get("variants").get(2).get("name").asString()).isEqualTo("500 particles");
    }

    @Test
    void sweep_reportsEveryCount_andTheKldBound(@TempDir Path dir) throws Exception {
        int status = run(
                "sweep",
                "sample-projects/office-carpet-stall.json",
                "--particles",
                "100,1000",
                "--seeds",
                "1",
                "--out",
                dir.toString(),
                "--quiet");

        JsonNode result = json(dir.resolve("result.json"));
        assertThat(status).isEqualTo(result.get("passed").asBoolean() ? EXIT_OK : EXIT_FAILED);
        assertThat(result.get("kind").asString()).isEqualTo("sweep");
        // Fox's bound (IJRR 22(12), 2003, Wilson-Hilferty form) at the sample's default epsilon 0.05
        // and delta 0.01, for a whole number of occupied bins, and above the 100 the report flags
        int required = result.get("kldRequiredParticles").asInt();
        assertThat(required).isGreaterThan(100);
        assertThat(FoxBound.binsFor(required, 0.05, Limits.MAX_PARTICLES))
                .as("%d particles is the KLD bound for a whole number of bins", required)
                .isPresent();
        assertThat(result.get("variants").get(0).get("name").asString()).isEqualTo("100 particles");
        assertThat(Files.readString(dir.resolve("report.html")))
                .contains("below")
                .contains("KLD bound");
    }

    @Test
    void zeroSeeds_isOneLineBadInput(@TempDir Path dir) {
        int status = run("batch", "sample-projects/office-carpet-stall.json", "--seeds", "0", "--out", dir.toString());

        assertThat(status).isEqualTo(EXIT_BAD_INPUT);
        assertThat(err().strip()).isEqualTo("driftlab batch: --seeds must be between 1 and 100000, got 0");
    }

    @Test
    void unknownOption_isOneLineBadInput(@TempDir Path dir) {
        int status = run("run", "sample-projects/office-carpet-stall.json", "--speed", "3", "--out", dir.toString());

        assertThat(status).isEqualTo(EXIT_BAD_INPUT);
        assertThat(err().strip()).isEqualTo("driftlab run: unknown option '--speed' for run");
    }

    @Test
    void missingFile_isOneLineBadInput(@TempDir Path dir) {
        int status = run("run", "nowhere.json", "--out", dir.toString());

        assertThat(status).isEqualTo(EXIT_BAD_INPUT);
        assertThat(err().strip()).isEqualTo("driftlab run: nowhere.json: cannot read: no such file");
    }

    @Test
    void invalidScenario_listsProblems_andExitsTwo(@TempDir Path dir) throws Exception {
        Path bad = dir.resolve("bad.json");
        Files.writeString(
                bad,
                Files.readString(Path.of("sample-projects/office-carpet-stall.json"))
                        .replace("\"count\": 2000", "\"count\": 0"));

        int status = run("run", bad.toString(), "--out", dir.resolve("o").toString());

        assertThat(status).isEqualTo(EXIT_BAD_INPUT);
        assertThat(err()).contains("bad.json: refused (1 error)").contains("localizer.particles.count");
        assertThat(err()).doesNotContain("Exception").doesNotContain("\tat ");
    }

    @Test
    void missingOut_isBadInput() {
        assertThat(run("run", "sample-projects/office-carpet-stall.json")).isEqualTo(EXIT_BAD_INPUT);
        assertThat(err().strip()).isEqualTo("driftlab run: run needs --out");
    }
}
