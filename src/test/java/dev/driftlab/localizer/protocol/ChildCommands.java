package dev.driftlab.localizer.protocol;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

/** Commands that start test localizers as child processes with this JVM's class path. */
public final class ChildCommands {

    private ChildCommands() {}

    /** This JVM's {@code java} program. */
    public static String java() {
        return Path.of(System.getProperty("java.home"), "bin", "java").toString();
    }

    /** {@code java ... dev.driftlab.Driftlab localizer-stdio}: the built-in localizer behind the protocol. */
    public static List<String> localizerStdio() {
        return List.of(
                java(),
                "--add-modules",
                "jdk.incubator.vector",
                "-XX:TieredStopAtLevel=1",
                "-cp",
                System.getProperty("java.class.path"),
                "dev.driftlab.Driftlab",
                "localizer-stdio");
    }

    /** {@code java FILE ARGS}: a single-file program run from source. */
    public static List<String> singleFile(Path file, String... args) {
        List<String> c = new ArrayList<>(List.of(java(), file.toString()));
        c.addAll(List.of(args));
        return c;
    }

    /** A test localizer under {@code src/test/resources/localizers/}. */
    public static Path testLocalizer(String name) {
        return Path.of("src/test/resources/localizers", name);
    }
}
