package dev.driftlab.app.browser;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.File;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.PosixFilePermissions;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** The browser is found the way .ci/run finds it: first on the PATH, then in /usr/bin. */
class BrowserLookupTest {

    @TempDir
    Path tmp;

    @Test
    void find_whenOnThePath_thenTheFirstExecutableInPathOrder() throws IOException {
        Path first = Files.createDirectories(tmp.resolve("first"));
        Path second = Files.createDirectories(tmp.resolve("second"));
        Path third = Files.createDirectories(tmp.resolve("third"));
        file(first, "chromium", false); // present but not executable: not a candidate
        file(second, "chromium", true);
        file(third, "chromium", true);
        String path = String.join(File.pathSeparator, "", first.toString(), second.toString(), third.toString());

        assertThat(Browser.find("chromium", path)).isEqualTo(second.resolve("chromium"));
    }

    @Test
    void find_whenNotOnThePath_thenUsrBin() throws IOException {
        Path empty = Files.createDirectories(tmp.resolve("empty"));

        assertThat(Browser.find("chromedriver", empty.toString())).isEqualTo(Path.of("/usr/bin/chromedriver"));
        assertThat(Browser.find("chromedriver", null)).isEqualTo(Path.of("/usr/bin/chromedriver"));
    }

    @Test
    void find_whenADirectoryHasTheName_thenItIsSkipped() throws IOException {
        Path dir = Files.createDirectories(tmp.resolve("bin"));
        Files.createDirectories(dir.resolve("chromium"));

        assertThat(Browser.find("chromium", dir.toString())).isEqualTo(Path.of("/usr/bin/chromium"));
    }

    private static void file(Path dir, String name, boolean executable) throws IOException {
        Path f = Files.createFile(dir.resolve(name));
        Files.setPosixFilePermissions(f, PosixFilePermissions.fromString(executable ? "rwxr-xr-x" : "rw-r--r--"));
    }
}
