package dev.driftlab.bench;

import dev.driftlab.scenario.Scenario;
import dev.driftlab.sim.Outcome;
import dev.driftlab.sim.RangeScan;
import dev.driftlab.sim.RunSummary;
import dev.driftlab.sim.SimListener;
import dev.driftlab.sim.SimOptions;
import dev.driftlab.sim.SimStep;
import dev.driftlab.sim.Simulator;
import dev.driftlab.site.CompiledSite;
import dev.driftlab.site.SiteCompiler;
import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.Warmup;
import org.openjdk.jmh.infra.Blackhole;

/**
 * Wall time to simulate about three minutes of robot time on the large invented floor: 100 Hz
 * internal steps, 360-beam scans at 10 Hz against the actual world, wheel and range noise. The
 * site is compiled once outside the measurement, as a batch would do. Score: milliseconds per run.
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
@Fork(1)
@Warmup(iterations = 3, time = 2)
@Measurement(iterations = 5, time = 2)
public class SimulationBenchmark {

    private Scenario scenario;
    private CompiledSite site;
    private long seed;

    @Setup
    public void setUp() {
        scenario = BenchSites.threeMinuteDrive();
        site = SiteCompiler.compile(scenario.site());
        RunSummary s = new Simulator(scenario, site, 1L, SimOptions.defaults()).run(new SimListener() {});
        if (s.outcome() != Outcome.FINISHED || s.endTime() < 175 || s.endTime() > 200) {
            throw new IllegalStateException("benchmark route should drive about 180 s, got " + s);
        }
    }

    @Benchmark
    public RunSummary threeMinutes(Blackhole bh) {
        SimListener sink = new SimListener() {
            @Override
            public void onStep(SimStep step) {
                bh.consume(step);
            }

            @Override
            public void onScan(RangeScan scan) {
                bh.consume(scan);
            }
        };
        return new Simulator(scenario, site, ++seed, SimOptions.defaults()).run(sink);
    }
}
