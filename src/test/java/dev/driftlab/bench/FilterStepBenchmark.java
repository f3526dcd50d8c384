package dev.driftlab.bench;

import dev.driftlab.geometry.Pose;
import dev.driftlab.localizer.MonteCarloLocalizer;
import dev.driftlab.localizer.Scan;
import dev.driftlab.localizer.TestRooms;
import dev.driftlab.localizer.UpdateReport;
import dev.driftlab.scenario.LocalizerSettings;
import dev.driftlab.scenario.LocalizerSettings.MotionNoise;
import dev.driftlab.scenario.LocalizerSettings.Particles;
import dev.driftlab.scenario.LocalizerSettings.RangeModel;
import dev.driftlab.scenario.LocalizerSettings.RangeModelKind;
import dev.driftlab.scenario.LocalizerSettings.Recovery;
import dev.driftlab.scenario.LocalizerSettings.ResampleWhen;
import dev.driftlab.scenario.LocalizerSettings.Resampling;
import dev.driftlab.scenario.LocalizerSettings.Scheme;
import dev.driftlab.scenario.LocalizerSettings.Start;
import java.util.SplittableRandom;
import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Level;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.TearDown;

/**
 * One full filter step on one thread (motion, likelihood-field measurement over all 60 beams,
 * resampling every update, estimate and clustering) with 5,000 particles; target under 5 ms.
 */
@State(Scope.Thread)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
@Fork(1)
public class FilterStepBenchmark {

    MonteCarloLocalizer filter;
    Scan[] scans = new Scan[2];
    Pose[] odometry = {Pose.of(0, 0, 0), Pose.of(0.1, 0, 0.05)};
    int step;

    @Setup(Level.Trial)
    public void setUp() {
        TestRooms.Room room = TestRooms.rectangle(10.0, 8.0, 0.05);
        LocalizerSettings s = new LocalizerSettings(
                new Particles(5000, false, 100, 5000, 0.05, 0.99, 0.5, 0.17, Start.AROUND_START, 0.3, 0.1),
                new MotionNoise(0.02, 0.01, 0.01, 0.02, 0, 0),
                new RangeModel(RangeModelKind.LIKELIHOOD_FIELD, 1, 0.9, 0, 0.02, 0.08, 0.1, 1, 0.05),
                new Resampling(Scheme.SYSTEMATIC, ResampleWhen.EVERY_UPDATE, 0.5),
                new Recovery(true, 0.001, 0.1, false, 0.1, 0.2));
        filter = new MonteCarloLocalizer(s, room.views(), 7);
        filter.initialize(Pose.of(4, 3, 0.4));
        Scan layout = Scan.evenlySpread(new double[60], Math.toRadians(270), Pose.of(0.1, 0, 0), 12.0);
        SplittableRandom rng = new SplittableRandom(5);
        scans[0] = Scan.evenlySpread(
                room.noisyScan(4, 3, 0.4, layout, 0.02, rng), Math.toRadians(270), Pose.of(0.1, 0, 0), 12.0);
        scans[1] = Scan.evenlySpread(
                room.noisyScan(4.1, 3.0, 0.45, layout, 0.02, rng), Math.toRadians(270), Pose.of(0.1, 0, 0), 12.0);
    }

    @Benchmark
    public UpdateReport step() {
        // Odometry swings between two poses so that every call passes the update thresholds.
        int k = step++ & 1;
        return filter.update(odometry[k], scans[k]);
    }

    @TearDown(Level.Trial)
    public void close() {
        filter.close();
    }
}
