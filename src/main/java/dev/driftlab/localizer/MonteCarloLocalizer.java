package dev.driftlab.localizer;

import dev.driftlab.geometry.Angles;
import dev.driftlab.geometry.Pose;
import dev.driftlab.scenario.LocalizerSettings;
import dev.driftlab.scenario.LocalizerSettings.RangeModelKind;
import dev.driftlab.scenario.LocalizerSettings.ResampleWhen;
import dev.driftlab.scenario.LocalizerSettings.Start;
import java.util.ArrayList;
import java.util.List;
import java.util.Objects;
import java.util.SplittableRandom;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;

/**
 * Monte Carlo localization on the believed map: the particle filter under test.
 *
 * <p>Use: build it from validated settings, the map views and a seed; call one of the {@code
 * initialize} methods; then feed {@link #update(Pose, Scan)} with the odometry pose and the scan of
 * every sensor cycle. Each update runs, in order: the update-threshold check, the odometry motion
 * model, the KLD-sampling count (if adaptive), the measurement model with log-sum-exp
 * normalisation, the recovery averages, resampling when due, random injection (augmented MCL) and
 * sensor resetting, and returns an {@link UpdateReport}.
 *
 * <p>All randomness comes from one generator seeded at construction, used only on the calling
 * thread. With {@code threads > 1} the measurement model scores disjoint particle ranges on worker
 * threads; each particle's score does not depend on the split, so results are identical for every
 * thread count. Not thread-safe itself: one caller at a time. Close it to stop its worker threads.
 */
public final class MonteCarloLocalizer implements TrialLocalizer {

    /** Log of the smallest normal double: scan likelihoods below it count as underflowed. */
    static final double UNDERFLOW_LOG = Math.log(Double.MIN_NORMAL);

    /** Particles closer than this, in metres, may join one hypothesis (common practice, no source). */
    static final double CLUSTER_CELL = 0.5;

    /** Hypotheses lighter than this share of the weight are not reported. */
    static final double MIN_HYPOTHESIS_WEIGHT = 0.05;

    private final LocalizerSettings settings;
    private final MapViews map;
    private final SplittableRandom rng;
    private final ParticleSet set;
    private final OdometryMotion motion;
    private final MeasurementModel model;
    private final KldSampling kld;
    private final LikelihoodAverages averages;
    private final SensorReset sensorReset;
    private final PoseClusters clusters;
    private final int threads;
    private final ExecutorService pool;

    private final double[] loglik;
    private final double[] weights;
    private final int[] ancestors;
    /** Scratch for the multinomial and residual resamplers' random spacings. */
    private final double[] spacings;

    private double[] bufX;
    private double[] bufY;
    private double[] bufH;

    private Pose lastOdometry;
    private boolean initialised;
    private UpdateReport last;

    /**
     * A single-threaded filter.
     *
     * @param settings localizer settings; refused with a message naming the setting if out of range
     * @param map views of the believed map
     * @param seed seed of the filter's random stream
     */
    public MonteCarloLocalizer(LocalizerSettings settings, MapViews map, long seed) {
        this(settings, map, seed, 1);
    }

    /**
     * A filter whose measurement update runs on {@code threads} threads (the caller's plus {@code
     * threads - 1} workers it owns).
     *
     * @param settings localizer settings; refused with a message naming the setting if out of range
     * @param map views of the believed map
     * @param seed seed of the filter's random stream
     * @param threads threads for the measurement update, 1 to 256
     */
    public MonteCarloLocalizer(LocalizerSettings settings, MapViews map, long seed, int threads) {
        Objects.requireNonNull(settings, "settings");
        Objects.requireNonNull(map, "map");
        SettingsCheck.require(settings);
        if (threads < 1 || threads > 256) {
            throw new IllegalArgumentException("threads must be in [1, 256], got " + threads);
        }
        this.settings = settings;
        this.map = map;
        this.rng = new SplittableRandom(seed);
        var p = settings.particles();
        int capacity = p.adaptive() ? Math.max(p.maxCount(), p.count()) : p.count();
        this.set = new ParticleSet(capacity);
        this.motion = new OdometryMotion(settings.motionNoise());
        this.model = settings.rangeModel().kind() == RangeModelKind.BEAM
                ? new BeamModel(map.caster(), settings.rangeModel())
                : new LikelihoodFieldModel(map.distances(), settings.rangeModel());
        this.kld = p.adaptive() ? new KldSampling(p) : null;
        this.averages = new LikelihoodAverages(
                settings.recovery().slowRate(), settings.recovery().fastRate());
        this.sensorReset = new SensorReset(map.freeSpace());
        this.clusters = new PoseClusters(capacity, CLUSTER_CELL, MIN_HYPOTHESIS_WEIGHT);
        this.loglik = new double[capacity];
        this.weights = new double[capacity];
        this.ancestors = new int[capacity];
        this.spacings = new double[capacity + 1];
        this.bufX = new double[capacity];
        this.bufY = new double[capacity];
        this.bufH = new double[capacity];
        this.threads = threads;
        this.pool = threads > 1
                ? Executors.newFixedThreadPool(threads - 1, r -> {
                    Thread t = new Thread(r, "localizer-measure");
                    t.setDaemon(true);
                    return t;
                })
                : null;
    }

    /**
     * Starts the filter as the settings say: uniform over free space for {@link Start#EVERYWHERE},
     * otherwise around {@code start} with the settings' position and heading spread.
     *
     * @param start the route's start pose, site frame
     * @return the belief before any update
     */
    public UpdateReport initialize(Pose start) {
        Objects.requireNonNull(start, "start");
        var p = settings.particles();
        return p.start() == Start.EVERYWHERE
                ? initializeGlobal()
                : initializeAround(start, p.startSpread(), p.startTurnSpread());
    }

    /**
     * Global localization: particles uniform over the map's free space with uniform headings.
     *
     * @return the belief before any update
     */
    public UpdateReport initializeGlobal() {
        spreadGlobally();
        return started();
    }

    private void spreadGlobally() {
        int n = settings.particles().count();
        set.resize(n);
        map.freeSpace().sample(rng, set.x, set.y, 0, n);
        for (int i = 0; i < n; i++) {
            set.heading[i] = uniformHeading();
        }
        set.setEqualWeights();
    }

    /**
     * Tracking from a known pose: particles Gaussian around it.
     *
     * @param pose centre, site frame
     * @param spread position standard deviation in metres, per axis
     * @param turnSpread heading standard deviation in radians
     * @return the belief before any update
     */
    public UpdateReport initializeAround(Pose pose, double spread, double turnSpread) {
        Objects.requireNonNull(pose, "pose");
        if (!(spread >= 0) || !(turnSpread >= 0) || !Double.isFinite(spread + turnSpread)) {
            throw new IllegalArgumentException(
                    "initial spreads must be finite and >= 0, got " + spread + " m and " + turnSpread + " rad");
        }
        int n = settings.particles().count();
        set.resize(n);
        for (int i = 0; i < n; i++) {
            set.x[i] = pose.x() + spread * rng.nextGaussian();
            set.y[i] = pose.y() + spread * rng.nextGaussian();
            set.heading[i] = ParticleSet.wrap(pose.heading() + turnSpread * rng.nextGaussian());
        }
        return started();
    }

    private UpdateReport started() {
        set.setEqualWeights();
        averages.reset();
        lastOdometry = null;
        initialised = true;
        last = report(true, set.size, 0, 0, 0, 0, false, false);
        return last;
    }

    /**
     * One sensor cycle. Odometry is the robot's own dead-reckoned pose in its odometry frame; only
     * its change since the last update is used. The first update after initialisation weighs the
     * scan without moving the particles. Later updates do nothing until the robot has driven at
     * least {@code minTravel} or turned at least {@code minTurn}.
     *
     * @param odometry dead-reckoned pose, odometry frame
     * @param scan the range scan taken at that pose
     * @return what the update did and the belief after it
     */
    @Override
    public UpdateReport update(Pose odometry, Scan scan) {
        Objects.requireNonNull(odometry, "odometry");
        Objects.requireNonNull(scan, "scan");
        if (!initialised) {
            throw new IllegalStateException("initialize the filter before the first update");
        }
        if (lastOdometry != null) {
            OdometryMotion.Delta delta = OdometryMotion.Delta.between(lastOdometry, odometry);
            double turn = Math.abs(Angles.difference(odometry.heading(), lastOdometry.heading()));
            var noise = settings.motionNoise();
            if (delta.drive() < noise.minTravel() && turn < noise.minTurn()) {
                return skipped();
            }
            motion.apply(set, delta, rng);
        }
        lastOdometry = odometry;
        int target = kld != null ? kld.targetCount(set) : set.size;

        model.prepare(scan);
        int beams = model.beamsUsed();
        int n = set.size;
        if (beams == 0) {
            // Nothing to weigh with: keep the weights, still honour the count.
            return afterWeighting(target, 0.0, false, beams, false);
        }
        measure(n);
        double maxLog = Double.NEGATIVE_INFINITY;
        for (int i = 0; i < n; i++) {
            double l = loglik[i];
            if (l > maxLog) {
                maxLog = l;
            }
            loglik[i] = set.logWeight[i] + l;
        }
        boolean underflow = !(maxLog > UNDERFLOW_LOG);
        double logMarginal = Weights.logSumExp(loglik, n);
        double meanLikelihood = Double.isFinite(logMarginal) ? Math.exp(logMarginal / beams) : 0.0;
        if (!Double.isFinite(meanLikelihood)) {
            meanLikelihood = Double.MAX_VALUE;
        }
        averages.update(meanLikelihood);
        if (underflow) {
            return recoverFromUnderflow(target, meanLikelihood);
        }
        System.arraycopy(loglik, 0, set.logWeight, 0, n);
        // normalizeLog fills weights[] as it goes: the weights are exponentiated once per update
        Weights.normalizeLog(set.logWeight, n, weights);
        return afterWeighting(target, meanLikelihood, false, beams, true);
    }

    /**
     * @param weightsCurrent whether {@code weights[]} already holds exp(logWeight) for every
     *     particle (after {@link Weights#normalizeLog}); otherwise it is filled here
     */
    private UpdateReport afterWeighting(
            int target, double meanLikelihood, boolean underflow, int beams, boolean weightsCurrent) {
        int n = set.size;
        if (!weightsCurrent) {
            for (int i = 0; i < n; i++) {
                weights[i] = Math.exp(set.logWeight[i]);
            }
        }
        double ess = Weights.effectiveSampleSize(weights, n);
        Hypothesis estimate = PoseClusters.estimate(set);
        List<Hypothesis> hypotheses = clusters.hypotheses(set);

        var rec = settings.recovery();
        double pInject = rec.injection() && beams > 0 ? averages.injectionProbability() : 0.0;
        boolean reset = rec.sensorReset()
                && beams > 0
                && averages.slow() > 0
                && meanLikelihood < rec.resetBelow() * averages.slow();
        var rs = settings.resampling();
        boolean resample = rs.when() == ResampleWhen.EVERY_UPDATE
                || ess < rs.essFraction() * n
                || target != n
                || pInject > 0
                || reset;
        if (resample) {
            resample(target);
        }
        int injected = 0;
        if (pInject > 0) {
            injected = inject(pInject);
        }
        int resetCount = 0;
        if (reset) {
            resetCount = resetFromScan(rec.resetShare());
        }
        last = new UpdateReport(
                true,
                estimate,
                hypotheses,
                ess,
                set.size,
                meanLikelihood,
                averages.slow(),
                averages.fast(),
                pInject,
                injected,
                resetCount,
                resample,
                underflow);
        return last;
    }

    private UpdateReport recoverFromUnderflow(int target, double meanLikelihood) {
        // No particle explains the scan: the weights carry no information, so the configured
        // recovery rule replaces them instead of a division by a zero sum.
        var rec = settings.recovery();
        int injected = 0;
        int resetCount = 0;
        boolean resampled = false;
        if (rec.injection()) {
            spreadGlobally();
            averages.reset();
            injected = set.size;
        } else {
            set.setEqualWeights();
            java.util.Arrays.fill(weights, 0, set.size, 1.0 / set.size);
            if (target != set.size || rec.sensorReset()) {
                resample(target);
                resampled = true;
            }
            if (rec.sensorReset()) {
                resetCount = resetFromScan(rec.resetShare());
            }
        }
        last = report(
                true, set.size, meanLikelihood, rec.injection() ? 1.0 : 0.0, injected, resetCount, resampled, true);
        return last;
    }

    private UpdateReport skipped() {
        return new UpdateReport(
                false,
                last.estimate(),
                last.hypotheses(),
                last.effectiveSampleSize(),
                set.size,
                last.meanLikelihood(),
                averages.slow(),
                averages.fast(),
                0.0,
                0,
                0,
                false,
                false);
    }

    private UpdateReport report(
            boolean updated,
            int count,
            double meanLikelihood,
            double pInject,
            int injected,
            int resetCount,
            boolean resampled,
            boolean underflow) {
        int n = set.size;
        for (int i = 0; i < n; i++) {
            weights[i] = Math.exp(set.logWeight[i]);
        }
        return new UpdateReport(
                updated,
                PoseClusters.estimate(set),
                clusters.hypotheses(set),
                Weights.effectiveSampleSize(weights, n),
                count,
                meanLikelihood,
                averages.slow(),
                averages.fast(),
                pInject,
                injected,
                resetCount,
                resampled,
                underflow);
    }

    private void measure(int n) {
        if (pool == null || n < 64 * threads) {
            model.logLikelihoods(set.x, set.y, set.heading, 0, n, loglik);
            return;
        }
        int chunk = (n + threads - 1) / threads;
        List<Future<?>> futures = new ArrayList<>(threads - 1);
        for (int t = 1; t < threads; t++) {
            int from = Math.min(n, t * chunk);
            int to = Math.min(n, from + chunk);
            futures.add(pool.submit(() -> model.logLikelihoods(set.x, set.y, set.heading, from, to, loglik)));
        }
        model.logLikelihoods(set.x, set.y, set.heading, 0, Math.min(n, chunk), loglik);
        for (Future<?> f : futures) {
            try {
                f.get();
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                throw new IllegalStateException("measurement update interrupted", e);
            } catch (ExecutionException e) {
                throw new IllegalStateException("measurement update failed", e.getCause());
            }
        }
    }

    /**
     * Resamples into {@code target} particles with equal weights; weights[] must hold the current
     * weights (every caller has just set them).
     */
    private void resample(int target) {
        int n = set.size;
        Resampler.resample(settings.resampling().scheme(), weights, n, target, rng, ancestors, spacings);
        for (int k = 0; k < target; k++) {
            int a = ancestors[k];
            bufX[k] = set.x[a];
            bufY[k] = set.y[a];
            bufH[k] = set.heading[a];
        }
        double[] t = set.x;
        set.x = bufX;
        bufX = t;
        t = set.y;
        set.y = bufY;
        bufY = t;
        t = set.heading;
        set.heading = bufH;
        bufH = t;
        set.resize(target);
        set.setEqualWeights();
    }

    /** Replaces each particle with probability p by a uniform free-space pose; weights stay equal. */
    private int inject(double p) {
        int count = 0;
        int n = set.size;
        for (int i = 0; i < n; i++) {
            if (rng.nextDouble() < p) {
                map.freeSpace().sample(rng, set.x, set.y, i, 1);
                set.heading[i] = uniformHeading();
                count++;
            }
        }
        return count;
    }

    /** Replaces each particle with probability {@code share} by a pose that fits the scan. */
    private int resetFromScan(double share) {
        if (!(share > 0)) {
            return 0;
        }
        sensorReset.score(model, rng);
        int count = 0;
        int n = set.size;
        for (int i = 0; i < n; i++) {
            if (rng.nextDouble() < share) {
                sensorReset.draw(set, i, rng);
                count++;
            }
        }
        return count;
    }

    private double uniformHeading() {
        return ParticleSet.wrap(-Math.PI + 2 * Math.PI * rng.nextDouble());
    }

    /** The live particle set; read it between updates, do not keep it across them. */
    @Override
    public ParticleSet particles() {
        return set;
    }

    /** The settings this filter runs with. */
    public LocalizerSettings settings() {
        return settings;
    }

    /** The report of the last initialisation or update. */
    public UpdateReport lastReport() {
        if (last == null) {
            throw new IllegalStateException("the filter has not been initialised");
        }
        return last;
    }

    /** Stops the worker threads, if any. */
    @Override
    public void close() {
        if (pool != null) {
            pool.shutdownNow();
        }
    }
}
