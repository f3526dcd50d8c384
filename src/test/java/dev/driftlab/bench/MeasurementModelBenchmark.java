package dev.driftlab.bench;

import dev.driftlab.geometry.Pose;
import dev.driftlab.localizer.BeamModel;
import dev.driftlab.localizer.DistanceGrid;
import dev.driftlab.localizer.LikelihoodFieldModel;
import dev.driftlab.localizer.Scan;
import dev.driftlab.localizer.TestRooms;
import dev.driftlab.scenario.LocalizerSettings.RangeModel;
import dev.driftlab.scenario.LocalizerSettings.RangeModelKind;
import java.util.SplittableRandom;
import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Level;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OperationsPerInvocation;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.TearDown;
import org.openjdk.jmh.infra.Blackhole;

/**
 * Measurement update speed, in particle-beam evaluations per second on one thread: the likelihood
 * field against a naive textbook version (an object per particle, trigonometry and exp per beam),
 * and the beam model with an exact rectangle caster. Targets: likelihood field at least 100 M/s and
 * 10x the naive version; beam model at least 10 M/s.
 */
@State(Scope.Thread)
@BenchmarkMode(Mode.Throughput)
@OutputTimeUnit(TimeUnit.SECONDS)
@Fork(1)
public class MeasurementModelBenchmark {

    static final int PARTICLES = 2000;
    static final int BEAMS = 60;
    static final int EVALS = PARTICLES * BEAMS;
    static final double Z_MAX = 12.0;
    static final double SIGMA = 0.1;
    static final double HIT = 0.9;
    static final double RAND = 0.08;

    TestRooms.Room room;
    LikelihoodFieldModel field;
    BeamModel beam;
    double[] x = new double[PARTICLES];
    double[] y = new double[PARTICLES];
    double[] h = new double[PARTICLES];
    double[] out = new double[PARTICLES];
    NaiveParticle[] naive = new NaiveParticle[PARTICLES];
    double[] ranges;
    double[] angles;
    DistanceGrid grid;

    /** The textbook shape: one object per particle. */
    static final class NaiveParticle {
        double x;
        double y;
        double theta;
        double weight;
    }

    @Setup(Level.Trial)
    public void setUp() {
        room = TestRooms.rectangle(10.0, 8.0, 0.05);
        grid = room.grid();
        RangeModel lf = new RangeModel(RangeModelKind.LIKELIHOOD_FIELD, 1, HIT, 0, 0.02, RAND, SIGMA, 1, 0.05);
        RangeModel bm = new RangeModel(RangeModelKind.BEAM, 1, 0.8, 0.05, 0.02, 0.13, SIGMA, 1, 0.05);
        field = new LikelihoodFieldModel(grid, lf);
        // the beam model casts on the real grid caster of the same 10 m x 8 m room, as in a run
        dev.driftlab.geometry.GridCaster caster = dev.driftlab.site.SiteCompiler.compile(
                        new dev.driftlab.scenario.SitePlan(
                                java.util.List.of(new dev.driftlab.scenario.Room(
                                        "room", "Room", dev.driftlab.geometry.Polygon.rectangle(0, 0, 10, 8))),
                                java.util.List.of(),
                                java.util.List.of(),
                                java.util.List.of(),
                                java.util.List.of()))
                .believedMap()
                .gridMap(0.05)
                .caster();
        beam = new BeamModel(
                new dev.driftlab.localizer.BeamCaster() {
                    @Override
                    public double cast(double px, double py, double angle, double maxRange) {
                        return caster.cast(px, py, angle, maxRange);
                    }

                    @Override
                    public double castAlong(double px, double py, double dx, double dy, double maxRange) {
                        return caster.castAlong(px, py, dx, dy, maxRange);
                    }

                    @Override
                    public void castRays(
                            double[] px,
                            double[] py,
                            double[] dx,
                            double[] dy,
                            int from,
                            int count,
                            double maxRange,
                            double[] out) {
                        caster.castRays(px, py, dx, dy, from, count, maxRange, out);
                    }
                },
                bm);
        Scan layout = Scan.evenlySpread(new double[BEAMS], Math.toRadians(270), Pose.of(0, 0, 0), Z_MAX);
        ranges = room.noisyScan(4.0, 3.0, 0.4, layout, 0.02, new SplittableRandom(1));
        angles = Scan.evenAngles(BEAMS, Math.toRadians(270));
        Scan scan = Scan.of(ranges, angles, Pose.of(0, 0, 0), Z_MAX);
        field.prepare(scan);
        beam.prepare(scan);
        SplittableRandom rng = new SplittableRandom(2);
        for (int i = 0; i < PARTICLES; i++) {
            x[i] = 4.0 + 0.5 * rng.nextGaussian();
            y[i] = 3.0 + 0.5 * rng.nextGaussian();
            h[i] = 0.4 + 0.2 * rng.nextGaussian();
            naive[i] = new NaiveParticle();
            naive[i].x = x[i];
            naive[i].y = y[i];
            naive[i].theta = h[i];
        }
    }

    @Benchmark
    @OperationsPerInvocation(EVALS)
    public void likelihoodField(Blackhole bh) {
        field.logLikelihoods(x, y, h, 0, PARTICLES, out);
        bh.consume(out);
    }

    @Benchmark
    @OperationsPerInvocation(EVALS)
    public void naiveLikelihoodField(Blackhole bh) {
        naiveUpdate();
        bh.consume(naive);
    }

    @Benchmark
    @OperationsPerInvocation(EVALS)
    public void beamModel(Blackhole bh) {
        beam.logLikelihoods(x, y, h, 0, PARTICLES, out);
        bh.consume(out);
    }

    /** Textbook table 6.3 written plainly: trigonometry, a division and exp for every beam. */
    void naiveUpdate() {
        float[] d = grid.distances();
        for (NaiveParticle p : naive) {
            double q = 1.0;
            for (int k = 0; k < BEAMS; k++) {
                double z = ranges[k];
                if (z >= Z_MAX) {
                    continue;
                }
                double ex = p.x + z * Math.cos(p.theta + angles[k]);
                double ey = p.y + z * Math.sin(p.theta + angles[k]);
                int i = (int) Math.floor((ex - grid.originX()) / grid.cellSize());
                int j = (int) Math.floor((ey - grid.originY()) / grid.cellSize());
                double dist =
                        (i >= 0 && j >= 0 && i < grid.width() && j < grid.height()) ? d[j * grid.width() + i] : Z_MAX;
                double prob = Math.exp(-dist * dist / (2 * SIGMA * SIGMA)) / (Math.sqrt(2 * Math.PI) * SIGMA);
                q *= HIT * prob + RAND / Z_MAX;
            }
            p.weight = q;
        }
    }

    /**
     * Prints our likelihood-field speed as a ratio to the naive version, both timed here in the
     * same JVM and the same trial, interleaved so that neither gets a warmer machine.
     */
    @TearDown(Level.Trial)
    public void printRatio() {
        long ours = 0;
        long theirs = 0;
        for (int round = 0; round < 20; round++) {
            long t0 = System.nanoTime();
            for (int r = 0; r < 10; r++) {
                field.logLikelihoods(x, y, h, 0, PARTICLES, out);
            }
            long t1 = System.nanoTime();
            for (int r = 0; r < 10; r++) {
                naiveUpdate();
            }
            long t2 = System.nanoTime();
            ours += t1 - t0;
            theirs += t2 - t1;
        }
        double evals = 200.0 * EVALS;
        System.out.printf(
                "%nlikelihood field: ours %.1f M evals/s, naive %.1f M evals/s, ours/naive = %.1fx%n",
                evals / ours * 1e3, evals / theirs * 1e3, (double) theirs / ours);
    }
}
