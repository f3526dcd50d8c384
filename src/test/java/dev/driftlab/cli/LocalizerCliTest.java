package dev.driftlab.cli;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.ByteArrayInputStream;
import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;

/**
 * The command line with an outside localizer: {@code --localizer} on batch and run, the sample
 * dead-reckoning localizer judged by the samples' own gates, {@code localizer-stdio} refusing a
 * greeting of another version, and the splitting of the command.
 */
class LocalizerCliTest {

    private final ByteArrayOutputStream out = new ByteArrayOutputStream();
    private final ByteArrayOutputStream err = new ByteArrayOutputStream();

    private int run(String... args) {
        return Cli.run(
                args,
                new PrintStream(out, true, StandardCharsets.UTF_8),
                new PrintStream(err, true, StandardCharsets.UTF_8));
    }

    private static JsonNode json(Path p) throws Exception {
        return JsonMapper.builder().build().readTree(Files.readString(p));
    }

    private static final String DEAD_RECKONING = "'" + java() + "' sample-projects/localizers/DeadReckoning.java";

    private static String java() {
        return Path.of(System.getProperty("java.home"), "bin", "java").toString();
    }

    private JsonNode gate(JsonNode result, String id) {
        for (JsonNode g : result.path("gates")) {
            if (g.path("id").asString().equals(id)) {
                return g;
            }
        }
        throw new AssertionError("no gate " + id);
    }

    @Test
    void deadReckoning_failsTheKidnapCase(@TempDir Path dir) throws Exception {
        int status = run(
                "batch",
                "sample-projects/storage-hall-kidnap.json",
                "--seeds",
                "2",
                "--threads",
                "2",
                "--out",
                dir.toString(),
                "--quiet",
                "--localizer",
                DEAD_RECKONING);

        assertThat(status).as(err.toString(StandardCharsets.UTF_8)).isEqualTo(1);
        JsonNode result = json(dir.resolve("result.json"));
        assertThat(result.path("localizer").path("name").asString()).endsWith("DeadReckoning.java");
        assertThat(result.path("localizer").path("timedTrials").asInt())
                .isEqualTo(result.path("trials").size())
                .isPositive();
        JsonNode recovers = gate(result, "recovers");
        assertThat(recovers.path("pass").asBoolean()).isFalse();
        assertThat(recovers.path("passedTrials").asInt()).isZero();
        for (JsonNode t : result.path("trials")) {
            assertThat(t.has("localizerTrouble")).isFalse();
            assertThat(t.path("answerTimeP99").asDouble()).isPositive();
        }
        String html = Files.readString(dir.resolve("report.html"));
        assertThat(html).contains("outside: ").contains("DeadReckoning.java").contains("Answer time per scan");
    }

    @Test
    void deadReckoning_failsTheStallCase(@TempDir Path dir) throws Exception {
        int status = run(
                "batch",
                "sample-projects/office-carpet-stall.json",
                "--seeds",
                "2",
                "--threads",
                "2",
                "--out",
                dir.toString(),
                "--quiet",
                "--localizer",
                DEAD_RECKONING);

        assertThat(status).isEqualTo(1);
        JsonNode result = json(dir.resolve("result.json"));
        assertThat(gate(result, "final-error").path("pass").asBoolean()).isFalse();
        assertThat(gate(result, "final-error").path("passedTrials").asInt()).isZero();
    }

    @Test
    void run_withALocalizerThatShowsNoParticles_recordsFramesAndSaysSo(@TempDir Path dir) throws Exception {
        int status = run(
                "run",
                "sample-projects/storage-hall-kidnap.json",
                "--out",
                dir.toString(),
                "--quiet",
                "--localizer",
                "sh src/test/resources/localizers/steady.sh");

        assertThat(status).as(err.toString(StandardCharsets.UTF_8)).isEqualTo(1);
        JsonNode trial = json(dir.resolve("result.json")).path("trials").get(0);
        assertThat(trial.path("meanParticles").isNull()).as("absent, not zero").isTrue();
        assertThat(trial.path("end").path("kind").asString()).isEqualTo("completed");
        String html = Files.readString(dir.resolve("report.html"));
        assertThat(html).contains("the localizer reported no particles").contains("no spread reported");
        assertThat(html).doesNotContain("NaN");
    }

    @Test
    void crashingLocalizer_batchFinishes_andEveryFileSaysWhatHappened(@TempDir Path dir) throws Exception {
        int status = run(
                "batch",
                "sample-projects/storage-hall-kidnap.json",
                "--seeds",
                "2",
                "--threads",
                "2",
                "--out",
                dir.toString(),
                "--localizer",
                "sh src/test/resources/localizers/crash.sh");

        assertThat(status).isEqualTo(1);
        String printed = out.toString(StandardCharsets.UTF_8);
        assertThat(printed)
                .contains("The localizer failed (crash) in 4 of 4 trials")
                .contains("exited with status 3");
        JsonNode result = json(dir.resolve("result.json"));
        assertThat(result.path("verdict").asString()).isEqualTo("ended-early");
        for (JsonNode t : result.path("trials")) {
            assertThat(t.path("end").path("kind").asString()).isEqualTo("localizer-failed");
            assertThat(t.path("localizerTrouble").asString()).contains("fatal: the map reader ran out of cells");
        }
        assertThat(Files.readAllLines(dir.resolve("trials.jsonl"))).hasSize(4);
        String html = Files.readString(dir.resolve("report.html"));
        assertThat(html)
                .contains("stopped because the localizer failed")
                .contains("fatal: the map reader ran out of cells");
    }

    @Test
    void builtInBatch_reportsItsAnswerTimesToo(@TempDir Path dir) throws Exception {
        run("batch", "sample-projects/storage-hall-kidnap.json", "--seeds", "1", "--out", dir.toString(), "--quiet");

        JsonNode result = json(dir.resolve("result.json"));
        assertThat(result.path("localizer").path("name").asString()).isEqualTo("built-in");
        assertThat(result.path("localizer").path("answerTimeP50").asDouble()).isPositive();
        assertThat(result.path("localizer").path("scanPeriod").asDouble()).isPositive();
    }

    @Test
    void answerLimit_withoutALocalizer_isABadCommandLine(@TempDir Path dir) {
        int status = run(
                "batch", "sample-projects/storage-hall-kidnap.json", "--out", dir.toString(), "--answer-limit", "1");

        assertThat(status).isEqualTo(2);
        assertThat(err.toString(StandardCharsets.UTF_8))
                .contains("--answer-limit")
                .contains("--localizer");
    }

    @Test
    void localizerStdio_refusesAnotherVersion_withAClearMessage() {
        String greeting = "{\"type\":\"greeting\",\"protocol\":\"driftlab-localizer/9\"}\n";
        ByteArrayOutputStream answer = new ByteArrayOutputStream();
        int status = LocalizerStdio.serve(
                new ByteArrayInputStream(greeting.getBytes(StandardCharsets.UTF_8)),
                answer,
                new PrintStream(err, true, StandardCharsets.UTF_8));

        assertThat(status).isEqualTo(2);
        assertThat(answer.toString(StandardCharsets.UTF_8))
                .startsWith("{\"type\":\"refused\"")
                .contains("driftlab-localizer/9")
                .contains("driftlab-localizer/1");
        assertThat(err.toString(StandardCharsets.UTF_8)).contains("driftlab-localizer/9");
    }

    @Test
    void command_isSplitLikeAShellSplitsSimpleQuoting() {
        assertThat(CommandLine.split("localizer", "java  My.java --noise 0.1"))
                .containsExactly("java", "My.java", "--noise", "0.1");
        assertThat(CommandLine.split("localizer", "'/opt/my tools/loc' \"a b\" c\\ d \"say \\\"hi\\\"\" ''"))
                .containsExactly("/opt/my tools/loc", "a b", "c d", "say \"hi\"", "");
        assertThat(CommandLine.split("localizer", "run.sh ';' '$HOME' `x`"))
                .as("nothing else is interpreted")
                .isEqualTo(List.of("run.sh", ";", "$HOME", "`x`"));
    }

    @Test
    void command_withAnUnclosedQuote_isABadCommandLine(@TempDir Path dir) {
        int status = run(
                "batch",
                "sample-projects/storage-hall-kidnap.json",
                "--out",
                dir.toString(),
                "--localizer",
                "java 'My.java");

        assertThat(status).isEqualTo(2);
        assertThat(err.toString(StandardCharsets.UTF_8)).contains("--localizer has an unclosed single quote");
    }
}
