package dev.driftlab.app;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;

/**
 * A server that ran out of memory keeps serving with threads dead and caches half-built; it must
 * exit so its supervisor restarts it. Checked on the build file because spring-boot:run starts a
 * JVM of its own.
 */
class ServerJvmOptionsTest {

    @Test
    void springBootRun_exitsOnOutOfMemory() throws Exception {
        String pom = Files.readString(Path.of("pom.xml"));
        String plugin = pom.substring(pom.indexOf("<artifactId>spring-boot-maven-plugin</artifactId>"));
        String args = plugin.substring(plugin.indexOf("<jvmArguments>"), plugin.indexOf("</jvmArguments>"));

        assertThat(args).contains("-XX:+ExitOnOutOfMemoryError");
    }
}
