package dev.driftlab.bench;

import dev.driftlab.geometry.FreeSpace;
import dev.driftlab.geometry.GridMap;
import dev.driftlab.geometry.OccupancyGrid;
import dev.driftlab.geometry.SegmentCaster;
import dev.driftlab.geometry.site.BelievedMap;
import dev.driftlab.geometry.site.SiteCompiler;
import java.util.SplittableRandom;
import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OperationsPerInvocation;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Param;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.Warmup;

/**
 * Rays per second of the exact and the grid caster, from random points of the reachable free space
 * in random directions, 12 m max range, 5 cm cells: on the largest sample site (the storage hall,
 * 24 x 16 m) and on a larger invented floor (60 x 40 m, 80 rooms). Scores are rays per second on
 * one thread.
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.Throughput)
@OutputTimeUnit(TimeUnit.SECONDS)
@Fork(1)
@Warmup(iterations = 3, time = 2)
@Measurement(iterations = 5, time = 2)
public class RayCastBenchmark {

    private static final int RAYS = 1 << 14;
    private static final double MAX_RANGE = 12;

    /** Which site: the largest sample, or the larger invented floor. */
    @Param({"storage-hall", "large-floor"})
    public String site;

    private SegmentCaster exact;
    private GridMap grid;
    private final double[] xs = new double[RAYS];
    private final double[] ys = new double[RAYS];
    private final double[] angles = new double[RAYS];
    private final double[] dirX = new double[RAYS];
    private final double[] dirY = new double[RAYS];
    private final double[] out = new double[RAYS];

    @Setup
    public void setUp() throws java.io.IOException {
        dev.driftlab.scenario.Scenario scenario = site.equals("storage-hall")
                ? dev.driftlab.scenario.ScenarioFiles.load(java.nio.file.Files.readString(
                        java.nio.file.Path.of("sample-projects/storage-hall-kidnap.json")))
                : BenchSites.threeMinuteDrive();
        BelievedMap map = SiteCompiler.compile(scenario.site()).believedMap();
        exact = map.exactCaster();
        grid = map.gridMap(OccupancyGrid.DEFAULT_CELL_SIZE);
        dev.driftlab.geometry.Pose start = scenario.route().start();
        FreeSpace free = grid.freeSpace(start.x(), start.y(), 0.1);
        free.samplePoses(new SplittableRandom(1L), xs, ys, angles, 0, RAYS);
        for (int k = 0; k < RAYS; k++) {
            dirX[k] = Math.cos(angles[k]);
            dirY[k] = Math.sin(angles[k]);
        }
    }

    @Benchmark
    @OperationsPerInvocation(RAYS)
    public double exactCaster() {
        double sum = 0;
        for (int k = 0; k < RAYS; k++) {
            sum += exact.cast(xs[k], ys[k], angles[k], MAX_RANGE);
        }
        return sum;
    }

    @Benchmark
    @OperationsPerInvocation(RAYS)
    public double gridCaster() {
        double sum = 0;
        for (int k = 0; k < RAYS; k++) {
            sum += grid.caster().cast(xs[k], ys[k], angles[k], MAX_RANGE);
        }
        return sum;
    }

    /**
     * The grid caster given unit directions instead of angles, as the localizer's beam model calls
     * it (it rotates precomputed beam directions per particle, so no trigonometry per ray).
     */
    @Benchmark
    @OperationsPerInvocation(RAYS)
    public double gridCasterAlongDirections() {
        double sum = 0;
        var caster = grid.caster();
        for (int k = 0; k < RAYS; k++) {
            sum += caster.castAlong(xs[k], ys[k], dirX[k], dirY[k], MAX_RANGE);
        }
        return sum;
    }

    /**
     * The grid caster fed many rays per origin, as the beam model casts a particle's beams: four
     * rays advance in lockstep so their lookups overlap. Groups of 60 rays share an origin.
     */
    @Benchmark
    @OperationsPerInvocation(RAYS)
    public double gridCasterManyPerOrigin() {
        var caster = grid.caster();
        double sum = 0;
        for (int k = 0; k + 60 <= RAYS; k += 60) {
            caster.castAlongMany(xs[k], ys[k], dirX, dirY, k, 60, MAX_RANGE, out);
        }
        for (int k = 0; k < RAYS; k++) {
            sum += out[k];
        }
        return sum;
    }

    /** The single-ray call on the same rays and origins as {@link #gridCasterManyPerOrigin}. */
    @Benchmark
    @OperationsPerInvocation(RAYS)
    public double gridCasterOnePerCallSameOrigins() {
        var caster = grid.caster();
        double sum = 0;
        for (int k = 0; k + 60 <= RAYS; k += 60) {
            for (int j = k; j < k + 60; j++) {
                out[j] = caster.castAlong(xs[k], ys[k], dirX[j], dirY[j], MAX_RANGE);
            }
        }
        for (int k = 0; k < RAYS; k++) {
            sum += out[k];
        }
        return sum;
    }
}
