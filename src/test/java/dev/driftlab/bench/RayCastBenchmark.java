package dev.driftlab.bench;

import dev.driftlab.geometry.FreeSpace;
import dev.driftlab.geometry.GridMap;
import dev.driftlab.geometry.OccupancyGrid;
import dev.driftlab.geometry.SegmentCaster;
import dev.driftlab.site.BelievedMap;
import dev.driftlab.site.SiteCompiler;
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
 * one thread. The grid caster is measured one ray per call (the scalar march) and in batches (the
 * vector lanes, as the beam model calls it); the lanes take several seconds of warm-up before C2
 * has compiled them, hence five warm-up iterations.
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.Throughput)
@OutputTimeUnit(TimeUnit.SECONDS)
@Fork(1)
@Warmup(iterations = 5, time = 2)
@Measurement(iterations = 5, time = 2)
public class RayCastBenchmark {

    private static final int RAYS = 1 << 14;
    private static final double MAX_RANGE = 12;

    /** Particles in the clouds of {@link #gridCasterTrackingCloud} and {@link #gridCasterSpreadCloud}. */
    private static final int PARTICLES = 2000;

    /** Beams per particle, evenly over the 270 degree field of the sample rangefinder. */
    private static final int BEAMS = 60;

    private static final int CLOUD_RAYS = PARTICLES * BEAMS;

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
    private final double[][] tracking = new double[4][];
    private final double[][] spread = new double[4][];
    private final double[] cloudOut = new double[CLOUD_RAYS];
    /** Each ray's origin, for the batch calls: the particle positions repeated per beam. */
    private final double[][] trackingOrigins = new double[2][CLOUD_RAYS];

    private final double[][] spreadOrigins = new double[2][CLOUD_RAYS];

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
        SplittableRandom rng = new SplittableRandom(2L);
        trackingCloud(free, rng, tracking);
        spreadCloud(free, rng, spread);
        for (int k = 0; k < CLOUD_RAYS; k++) {
            trackingOrigins[0][k] = tracking[0][k / BEAMS];
            trackingOrigins[1][k] = tracking[1][k / BEAMS];
            spreadOrigins[0][k] = spread[0][k / BEAMS];
            spreadOrigins[1][k] = spread[1][k / BEAMS];
        }
    }

    /**
     * Eight tracking clouds at random free poses, 250 particles each with 0.3 m and 0.15 rad
     * spread, kept in free space: {xs, ys, beam directions east, north}.
     */
    private static void trackingCloud(FreeSpace free, SplittableRandom rng, double[][] cloud) {
        double[] cx = new double[8];
        double[] cy = new double[8];
        double[] ch = new double[8];
        free.samplePoses(rng, cx, cy, ch, 0, 8);
        double[] px = new double[PARTICLES];
        double[] py = new double[PARTICLES];
        double[] ph = new double[PARTICLES];
        for (int p = 0; p < PARTICLES; p++) {
            int c = p % 8;
            do {
                px[p] = cx[c] + 0.3 * rng.nextGaussian();
                py[p] = cy[c] + 0.3 * rng.nextGaussian();
            } while (!free.contains(px[p], py[p]));
            ph[p] = ch[c] + 0.15 * rng.nextGaussian();
        }
        fillCloud(px, py, ph, cloud);
    }

    /** Particles spread uniformly over the free space, as at the start of global localization. */
    private static void spreadCloud(FreeSpace free, SplittableRandom rng, double[][] cloud) {
        double[] px = new double[PARTICLES];
        double[] py = new double[PARTICLES];
        double[] ph = new double[PARTICLES];
        free.samplePoses(rng, px, py, ph, 0, PARTICLES);
        fillCloud(px, py, ph, cloud);
    }

    private static void fillCloud(double[] px, double[] py, double[] ph, double[][] cloud) {
        double[] dx = new double[CLOUD_RAYS];
        double[] dy = new double[CLOUD_RAYS];
        double fov = Math.toRadians(270);
        for (int p = 0; p < PARTICLES; p++) {
            for (int b = 0; b < BEAMS; b++) {
                double a = ph[p] - fov / 2 + fov * b / (BEAMS - 1);
                dx[p * BEAMS + b] = Math.cos(a);
                dy[p * BEAMS + b] = Math.sin(a);
            }
        }
        cloud[0] = px;
        cloud[1] = py;
        cloud[2] = dx;
        cloud[3] = dy;
    }

    /**
     * The grid caster as the beam model casts while tracking: 2,000 particles in eight clouds at
     * random free poses of the site, 60 beams each over 270 degrees, all beams as one batch.
     */
    @Benchmark
    @OperationsPerInvocation(CLOUD_RAYS)
    public double gridCasterTrackingCloudBatch() {
        return castCloud(trackingOrigins, tracking);
    }

    /**
     * As {@link #gridCasterTrackingCloudBatch} with the particles spread uniformly over the reachable
     * free space (the first steps of global localization, or after a kidnap).
     */
    @Benchmark
    @OperationsPerInvocation(CLOUD_RAYS)
    public double gridCasterSpreadCloudBatch() {
        return castCloud(spreadOrigins, spread);
    }

    private double castCloud(double[][] origins, double[][] cloud) {
        grid.caster().castRays(origins[0], origins[1], cloud[2], cloud[3], 0, CLOUD_RAYS, MAX_RANGE, cloudOut);
        double sum = 0;
        for (int k = 0; k < CLOUD_RAYS; k += BEAMS) {
            sum += cloudOut[k];
        }
        return sum;
    }

    /**
     * Random rays, each from its own random point of the free space, cast as one batch: the
     * caster's throughput with no shared origins or directions to help it.
     */
    @Benchmark
    @OperationsPerInvocation(RAYS)
    public double gridCasterBatch() {
        grid.caster().castRays(xs, ys, dirX, dirY, 0, RAYS, MAX_RANGE, out);
        double sum = 0;
        for (int k = 0; k < RAYS; k++) {
            sum += out[k];
        }
        return sum;
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
}
