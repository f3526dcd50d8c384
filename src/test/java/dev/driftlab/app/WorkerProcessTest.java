package dev.driftlab.app;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import org.junit.jupiter.api.Test;

/** The worker command's own options; starting real workers is {@code WorkersAcrossProcessesE2ETest}. */
class WorkerProcessTest {

    private final ByteArrayOutputStream err = new ByteArrayOutputStream();

    private int run(String... args) {
        return WorkerProcess.run(args, new PrintStream(err, true, StandardCharsets.UTF_8));
    }

    @Test
    void threadsMustBeAWholeNumberInRange() {
        assertThat(run("--threads", "0")).isEqualTo(2);
        assertThat(err.toString(StandardCharsets.UTF_8))
                .contains("--threads must be a whole number from 1 to 256, got '0'");
        assertThat(run("--threads=many")).isEqualTo(2);
        assertThat(run("--threads")).isEqualTo(2);
        assertThat(run("--threads", "100000")).isEqualTo(2);
    }

    @Test
    void unknownArgumentsAreRefusedWithTheUsage() {
        assertThat(run("serve")).isEqualTo(2);
        assertThat(err.toString(StandardCharsets.UTF_8))
                .contains("unknown argument 'serve'")
                .contains("usage: java -jar driftlab.jar worker");
    }

    @Test
    void helpPrintsTheUsage() {
        assertThat(run("--help")).isZero();
        assertThat(err.toString(StandardCharsets.UTF_8)).contains("--threads N");
    }
}
