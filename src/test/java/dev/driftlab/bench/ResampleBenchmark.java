package dev.driftlab.bench;

import dev.driftlab.localizer.Resampler;
import dev.driftlab.scenario.LocalizerSettings.Scheme;
import java.util.SplittableRandom;
import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Level;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Param;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;

/** Time to draw 100,000 ancestor indices from 100,000 uneven weights; target under 1 ms. */
@State(Scope.Thread)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MICROSECONDS)
@Fork(1)
public class ResampleBenchmark {

    static final int N = 100_000;

    @Param({"SYSTEMATIC", "STRATIFIED", "RESIDUAL", "MULTINOMIAL"})
    public Scheme scheme;

    double[] weights = new double[N];
    int[] out = new int[N];
    /** Kept between calls, as the localizer keeps it. */
    double[] spacings = new double[N + 1];

    SplittableRandom rng;

    @Setup(Level.Trial)
    public void setUp() {
        SplittableRandom r = new SplittableRandom(3);
        double sum = 0;
        for (int i = 0; i < N; i++) {
            weights[i] = Math.exp(-5 * r.nextDouble());
            sum += weights[i];
        }
        for (int i = 0; i < N; i++) {
            weights[i] /= sum;
        }
        rng = new SplittableRandom(4);
    }

    @Benchmark
    public int[] resample() {
        Resampler.resample(scheme, weights, N, N, rng, out, spacings);
        return out;
    }
}
