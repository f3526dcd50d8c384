package dev.driftlab.trial;

import dev.driftlab.evaluation.EpisodeRules;
import dev.driftlab.evaluation.RunTrace;
import dev.driftlab.evaluation.TrialEnd;
import dev.driftlab.evaluation.TrialOutcome;
import dev.driftlab.geometry.Bounds;
import dev.driftlab.geometry.FreeSpace;
import dev.driftlab.geometry.GridMap;
import dev.driftlab.geometry.Pose;
import dev.driftlab.localizer.Hypothesis;
import dev.driftlab.localizer.LocalizerFailure;
import dev.driftlab.localizer.MapViews;
import dev.driftlab.localizer.ParticleSet;
import dev.driftlab.localizer.TrialLocalizer;
import dev.driftlab.localizer.UpdateReport;
import dev.driftlab.recording.ChunkSink;
import dev.driftlab.recording.Frame;
import dev.driftlab.recording.FrameHypothesis;
import dev.driftlab.recording.FrameRecorder;
import dev.driftlab.recording.FrameSink;
import dev.driftlab.scenario.LocalizerSettings;
import dev.driftlab.scenario.Scenario;
import dev.driftlab.scenario.SettingsVariant;
import dev.driftlab.sim.EventKind;
import dev.driftlab.sim.RangeScan;
import dev.driftlab.sim.RunSummary;
import dev.driftlab.sim.SimEvent;
import dev.driftlab.sim.SimListener;
import dev.driftlab.sim.SimOptions;
import dev.driftlab.sim.Simulator;
import dev.driftlab.site.BelievedMap;
import dev.driftlab.site.CompiledSite;
import dev.driftlab.site.SiteCompiler;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.concurrent.ConcurrentHashMap;
import java.util.function.BooleanSupplier;

/**
 * Runs trials of one scenario: the simulator and the localizer in lockstep, one filter update per
 * scan, streaming frames to a sink. The site is compiled once and the believed map rasterised once
 * per cell size, so many trials can share them (they are read-only; a runner is safe to use from
 * several threads).
 *
 * <p>A trial is a pure function of (scenario, variant settings, seed). The simulator draws from
 * its own streams, split from the seed, and never reads the localizer settings; the localizer gets
 * a seed derived from the same seed. Two variants run with one seed therefore see identical
 * simulated data (paired comparison).
 */
public final class TrialRunner {

    /** Mixed into the seed to give the localizer a stream independent of the simulator's. */
    private static final long LOCALIZER_STREAM = 0x9E3779B97F4A7C15L;

    private final Scenario scenario;
    private final CompiledSite site;
    private final BelievedMap believed;
    private final Map<Double, Prepared> views = new ConcurrentHashMap<>();
    private final Bounds bounds;
    private final LocalizerSource localizers;

    /** The believed map rasterised at one cell size, and the built-in filter's views of it. */
    private record Prepared(GridMap grid, MapViews views) {}

    /** Compiles the scenario's site once; trials run the built-in localizer. The scenario must be valid. */
    public TrialRunner(Scenario scenario) {
        this(scenario, LocalizerSource.BUILT_IN);
    }

    /**
     * Compiles the scenario's site once; trials run localizers from the given source. The scenario
     * must be valid.
     */
    public TrialRunner(Scenario scenario, LocalizerSource localizers) {
        this.localizers = java.util.Objects.requireNonNull(localizers, "localizers");
        this.scenario = scenario;
        this.site = SiteCompiler.compile(scenario.site());
        this.believed = site.believedMap();
        this.bounds = scenario.drawingBounds().padded(1);
    }

    /** The scenario this runner runs. */
    public Scenario scenario() {
        return scenario;
    }

    /** Where this runner's localizers come from. */
    public LocalizerSource localizers() {
        return localizers;
    }

    /** Site bounds in metres (rooms and start), padded by one metre. */
    public Bounds bounds() {
        return bounds;
    }

    /** A frame recorder sized for this scenario's site and rangefinder. */
    public FrameRecorder recorder(int framesPerChunk, ChunkSink sink) {
        return new FrameRecorder(bounds, scenario.rangefinder().maxRange(), framesPerChunk, sink);
    }

    /**
     * The result of one trial.
     *
     * @param outcome evaluated figures
     * @param trace per-frame figures
     * @param summary how the simulation ended
     * @param cancelled whether the trial was stopped early
     */
    public record Result(TrialOutcome outcome, RunTrace trace, RunSummary summary, boolean cancelled) {}

    /**
     * Runs one trial.
     *
     * @param variant the settings to run
     * @param seed the trial's seed
     * @param sink where frames go ({@link FrameSink#NONE} to skip recording)
     * @param rules thresholds for convergence, lost and recovery
     * @param cancelled polled once per scan; when it turns true the trial stops
     */
    public Result run(
            SettingsVariant variant, long seed, FrameSink sink, EpisodeRules rules, BooleanSupplier cancelled) {
        return run(variant, seed, sink, rules, cancelled, t -> {});
    }

    /**
     * Runs one trial, reporting the robot time of every scan (seconds) to {@code progress}.
     *
     * @see #run(SettingsVariant, long, FrameSink, EpisodeRules, BooleanSupplier)
     */
    public Result run(
            SettingsVariant variant,
            long seed,
            FrameSink sink,
            EpisodeRules rules,
            BooleanSupplier cancelled,
            java.util.function.DoubleConsumer progress) {
        LocalizerSettings settings = variant.settings();
        Prepared map = views.computeIfAbsent(settings.rangeModel().cellSize(), this::viewsFor);
        Simulator sim = new Simulator(scenario, site, seed, SimOptions.defaults());
        double[] angles = sim.scanGeometry().copyAngles();
        Pose mount = sim.scanGeometry().mount();
        double maxRange = sim.scanGeometry().maxRange();
        RunTrace trace = new RunTrace();
        boolean record = sink != FrameSink.NONE;
        Lockstep step = new Lockstep(
                trace, sink, record, angles, mount, maxRange, scenario.route().start());
        boolean stopped = false;
        LocalizerFailure failure = null;
        TrialLocalizer filter = null;
        try {
            filter = localizers.open(new LocalizerSource.Setup(
                    scenario,
                    settings,
                    believed,
                    map.grid(),
                    map.views(),
                    seed ^ LOCALIZER_STREAM,
                    angles,
                    mount,
                    maxRange,
                    record));
            step.filter = filter;
            while (sim.advance(step)) {
                if (step.scanned) {
                    progress.accept(trace.time(trace.size() - 1));
                    if (cancelled.getAsBoolean()) {
                        stopped = true;
                        break;
                    }
                }
                step.scanned = false;
            }
        } catch (LocalizerFailure e) {
            failure = e;
        } finally {
            if (filter != null) {
                filter.close();
            }
        }
        sink.finish();
        if (failure != null && trace.size() == 0) {
            // failed before its first answer: one row at the failing scan, with no estimate
            Pose t = step.pendingTruth;
            trace.add(
                    step.pendingTime,
                    t.x(),
                    t.y(),
                    t.heading(),
                    Double.NaN,
                    Double.NaN,
                    Double.NaN,
                    Double.NaN,
                    Double.NaN,
                    TrialLocalizer.UNKNOWN_COUNT,
                    0,
                    Double.NaN,
                    Double.NaN);
        }
        if (trace.size() == 0) {
            throw new IllegalStateException("the run produced no scans; check the rangefinder rate");
        }
        double end = trace.time(trace.size() - 1);
        int last = trace.size() - 1;
        TrialEnd ending;
        if (failure != null) {
            Pose t = step.pendingTruth;
            ending = new TrialEnd(TrialEnd.Kind.LOCALIZER_FAILED, step.pendingTime, t.x(), t.y());
        } else if (stopped) {
            ending = new TrialEnd(TrialEnd.Kind.CANCELLED, end, trace.trueX(last), trace.trueY(last));
        } else {
            ending = switch (sim.summary().outcome()) {
                case FINISHED -> TrialEnd.completed(end, trace.trueX(last), trace.trueY(last));
                case BLOCKED ->
                    sim.firstContact()
                            .map(c -> new TrialEnd(TrialEnd.Kind.CONTACT, c.time(), c.x(), c.y()))
                            .orElseThrow();
                case STEP_LIMIT -> new TrialEnd(TrialEnd.Kind.TIME_LIMIT, end, trace.trueX(last), trace.trueY(last));
                case STOPPED -> new TrialEnd(TrialEnd.Kind.CANCELLED, end, trace.trueX(last), trace.trueY(last));
            };
        }
        TrialOutcome outcome = TrialOutcome.of(
                        variant.name(),
                        seed,
                        trace,
                        rules,
                        step.collisions,
                        ending,
                        sim.faultFirings(ending.time(), ending.kind() == TrialEnd.Kind.COMPLETED))
                .withAnswerTimes(step.answerPercentile(50), step.answerPercentile(99));
        if (failure != null) {
            outcome = outcome.withLocalizerTrouble(failure.describe());
        }
        RunSummary summary;
        if (failure != null) {
            summary = new RunSummary(
                    ending.time(),
                    Math.round(ending.time() / sim.stepLength()),
                    trace.size(),
                    dev.driftlab.sim.Outcome.STOPPED,
                    "the localizer failed at " + ending.time() + " s: " + failure.getMessage());
        } else if (stopped) {
            summary = new RunSummary(
                    end,
                    Math.round(end / sim.stepLength()),
                    trace.size(),
                    dev.driftlab.sim.Outcome.STOPPED,
                    "stopped at " + end + " s before the route ended");
        } else {
            summary = sim.summary();
        }
        return new Result(outcome, trace, summary, stopped);
    }

    /** The localizer's views of the believed map for these settings (cached per cell size). */
    MapViews views(LocalizerSettings settings) {
        return views.computeIfAbsent(settings.rangeModel().cellSize(), this::viewsFor)
                .views();
    }

    private Prepared viewsFor(double cellSize) {
        GridMap grid = believed.gridMap(cellSize);
        Pose start = scenario.route().start();
        double clearance = freeSpaceClearance(scenario);
        FreeSpace free = grid.freeSpace(start.x(), start.y(), clearance);
        return new Prepared(grid, MapAdapters.views(grid, free));
    }

    /**
     * How far from walls the free space the filter samples from keeps, metres: the robot's centre
     * cannot be closer than most of its footprint.
     */
    public static double freeSpaceClearance(Scenario scenario) {
        return Math.min(scenario.robot().footprintRadius() * 0.8, 0.25);
    }

    /** Feeds each scan to the filter and records the result. */
    private static final class Lockstep implements SimListener {
        TrialLocalizer filter;
        private final RunTrace trace;
        private final FrameSink sink;
        private final boolean record;
        private final double[] angles;
        private final Pose mount;
        private final double maxRange;
        private final double[] ranges;
        private final List<String> events = new ArrayList<>();
        private int frameIndex;
        private double[] answers = new double[256];
        private int answered;
        int collisions;
        boolean scanned;
        /** Time and true pose of the scan being answered (the start before the first scan). */
        double pendingTime;

        Pose pendingTruth;

        Lockstep(
                RunTrace trace,
                FrameSink sink,
                boolean record,
                double[] angles,
                Pose mount,
                double maxRange,
                Pose start) {
            this.pendingTruth = start;
            this.trace = trace;
            this.sink = sink;
            this.record = record;
            this.angles = angles;
            this.mount = mount;
            this.maxRange = maxRange;
            this.ranges = new double[angles.length];
        }

        @Override
        public void onEvent(SimEvent e) {
            if (e.kind() == EventKind.KIDNAPPED) {
                trace.addKidnap(e.time());
            } else if (e.kind() == EventKind.BUMPED) {
                trace.addJump(e.time());
            } else if (e.kind() == EventKind.COLLISION) {
                collisions++;
            }
            if (record && e.kind() != EventKind.WAYPOINT_REACHED) {
                events.add(eventText(e));
            }
        }

        @Override
        public void onScan(RangeScan scan) {
            scanned = true;
            for (int i = 0; i < ranges.length; i++) {
                ranges[i] = scan.range(i);
            }
            pendingTime = scan.time();
            pendingTruth = scan.truth();
            dev.driftlab.localizer.Scan seen = dev.driftlab.localizer.Scan.of(ranges, angles, mount, maxRange);
            long asked = System.nanoTime();
            UpdateReport r = filter.update(scan.time(), scan.odometry(), seen);
            timed((System.nanoTime() - asked) / 1e9);
            Pose est = filter.judged(r);
            Pose truth = scan.truth();
            trace.add(
                    scan.time(),
                    truth.x(),
                    truth.y(),
                    truth.heading(),
                    est.x(),
                    est.y(),
                    est.heading(),
                    r.meanLikelihood(),
                    r.effectiveSampleSize(),
                    r.particleCount(),
                    r.injected(),
                    r.slowAverage(),
                    r.fastAverage());
            if (record) {
                sink.accept(frame(scan, r, est));
                events.clear();
            }
        }

        private void timed(double seconds) {
            if (answered == answers.length) {
                answers = java.util.Arrays.copyOf(answers, answered * 2);
            }
            answers[answered++] = seconds;
        }

        /** Nearest-rank percentile of the answer times in seconds, NaN when none was timed. */
        double answerPercentile(double p) {
            if (answered == 0) {
                return Double.NaN;
            }
            double[] sorted = java.util.Arrays.copyOf(answers, answered);
            java.util.Arrays.sort(sorted);
            int rank = (int) Math.ceil(p / 100 * answered);
            return sorted[Math.max(0, rank - 1)];
        }

        private Frame frame(RangeScan scan, UpdateReport r, Pose est) {
            ParticleSet ps = filter.particles();
            int n = filter.showsParticles() ? ps.size() : 0;
            float[] x = new float[n];
            float[] y = new float[n];
            float[] h = new float[n];
            float[] w = new float[n];
            for (int i = 0; i < n; i++) {
                x[i] = (float) ps.x(i);
                y[i] = (float) ps.y(i);
                h[i] = (float) ps.heading(i);
                w[i] = (float) ps.weight(i);
            }
            List<FrameHypothesis> hyps = new ArrayList<>(r.hypotheses().size());
            for (Hypothesis hy : r.hypotheses()) {
                hyps.add(new FrameHypothesis(
                        hy.weight(),
                        hy.mean().x(),
                        hy.mean().y(),
                        hy.mean().heading(),
                        hy.covariance().xx(),
                        hy.covariance().xy(),
                        hy.covariance().yy()));
            }
            return new Frame(
                    frameIndex++,
                    scan.time(),
                    scan.truth(),
                    scan.odometry(),
                    est,
                    hyps,
                    r.effectiveSampleSize(),
                    r.meanLikelihood(),
                    r.slowAverage(),
                    r.fastAverage(),
                    r.injected(),
                    scan.copyRanges(),
                    x,
                    y,
                    h,
                    w,
                    new ArrayList<>(events));
        }

        private static String eventText(SimEvent e) {
            String kind = e.kind().name().toLowerCase(java.util.Locale.ROOT).replace('_', ' ');
            return e.subject().isEmpty() ? kind : kind + " " + e.subject();
        }
    }
}
