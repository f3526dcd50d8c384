package dev.driftlab.cli;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class CliTest {

    // Exit statuses as documented for users (README, "Command line"): 1 a gate fails or validation
    // found errors, 2 bad input. Literal, so a changed constant in Cli fails here.
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

    private String out() {
        return out.toString(StandardCharsets.UTF_8);
    }

    private String err() {
        return err.toString(StandardCharsets.UTF_8);
    }

    @Test
    void validate_samples_exitZero() {
        int status =
                run("validate", "sample-projects/storage-hall-kidnap.json", "sample-projects/office-carpet-stall.json");

        assertThat(status).isZero();
        assertThat(out()).contains("storage-hall-kidnap.json: valid", "office-carpet-stall.json: valid");
    }

    @Test
    void validate_badFile_listsEveryProblemWithPath_andExitsOne(@TempDir Path dir) throws Exception {
        String good = Files.readString(Path.of("sample-projects/storage-hall-kidnap.json"));
        String bad = good.replace("\"count\": 2000", "\"count\": 0").replace("\"at\": 85", "\"at\": 900");
        Path file = dir.resolve("bad.json");
        Files.writeString(file, bad);

        int status = run("validate", file.toString());

        assertThat(status).isEqualTo(EXIT_FAILED);
        assertThat(out())
                .contains("bad.json: refused (2 errors)")
                .contains("error localizer.particles.count: must be at least 1, got 0")
                .contains("error faults[0].at: 900 s is after the route ends");
    }

    @Test
    void validate_missingFile_isBadInput_withOneLine() {
        int status = run("validate", "no/such/file.json");

        assertThat(status).isEqualTo(EXIT_BAD_INPUT);
        assertThat(err().strip()).isEqualTo("no/such/file.json: cannot read: no such file");
    }

    @Test
    void unknownCommand_isBadInput() {
        assertThat(run("fly")).isEqualTo(EXIT_BAD_INPUT);
        assertThat(err()).startsWith("driftlab: unknown command 'fly'");
    }

    @Test
    void validate_withoutFiles_isBadInput() {
        assertThat(run("validate")).isEqualTo(EXIT_BAD_INPUT);
    }
}
