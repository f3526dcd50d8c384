package dev.driftlab.geometry;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;

/**
 * A JVM started without {@code --add-modules jdk.incubator.vector} (plain {@code java -jar}) must
 * still cast, ray by ray, and give the very ranges the vector lanes give: run results may not
 * depend on how the JVM was started.
 */
class GridCasterWithoutVectorModuleTest {

    private static final int RAYS = 2000;

    @Test
    void castRays_inAJvmWithoutTheVectorModule_giveTheSameRangesBitForBit() throws Exception {
        Path launcher = Path.of(System.getProperty("java.home"), "bin", "java");
        String classPath =
                Path.of("target", "classes") + java.io.File.pathSeparator + Path.of("target", "test-classes");
        Process process = new ProcessBuilder(launcher.toString(), "-cp", classPath, Probe.class.getName())
                .redirectErrorStream(true)
                .start();
        List<String> lines;
        try (var reader = process.inputReader(StandardCharsets.UTF_8)) {
            lines = reader.lines().toList();
        }
        assertThat(process.waitFor(60, TimeUnit.SECONDS)).isTrue();
        assertThat(process.exitValue()).as(String.join("\n", lines)).isZero();
        assertThat(lines.get(0)).isEqualTo("lanes=false");

        GridCaster here = Probe.caster();
        assertThat(here.usesVectorLanes()).isTrue();
        List<String> expected = Probe.ranges(here);
        assertThat(lines.subList(1, lines.size())).containsExactlyElementsOf(expected);
    }

    /** Casts a fixed set of rays and prints whether lanes were used, then each range's bits. */
    public static final class Probe {

        public static void main(String[] args) throws IOException {
            GridCaster caster = caster();
            System.out.println("lanes=" + caster.usesVectorLanes());
            for (String line : ranges(caster)) {
                System.out.println(line);
            }
        }

        static GridCaster caster() {
            return GridMap.of(OccupancyGrid.rasterize(TestSites.office(40, 24), List.of(), 0.05, 0.5))
                    .caster();
        }

        static List<String> ranges(GridCaster caster) {
            SplittableRandom rng = new SplittableRandom(3L);
            double[] x = new double[RAYS];
            double[] y = new double[RAYS];
            double[] dx = new double[RAYS];
            double[] dy = new double[RAYS];
            for (int k = 0; k < RAYS; k++) {
                x[k] = -2 + rng.nextDouble() * 44;
                y[k] = -2 + rng.nextDouble() * 28;
                double a = rng.nextDouble() * 2 * Math.PI;
                dx[k] = Math.cos(a);
                dy[k] = Math.sin(a);
            }
            double[] out = new double[RAYS];
            caster.castRays(x, y, dx, dy, 0, RAYS, 12, out);
            List<String> lines = new ArrayList<>();
            for (double r : out) {
                lines.add(Long.toHexString(Double.doubleToRawLongBits(r)));
            }
            return lines;
        }
    }
}
