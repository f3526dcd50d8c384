package dev.driftlab.app.suites;

import dev.driftlab.app.suites.persistence.SuiteRepository;
import dev.driftlab.app.suites.persistence.SuiteRepository.SuiteRunRow;
import java.time.Duration;
import java.util.concurrent.Executors;
import java.util.concurrent.ScheduledExecutorService;
import java.util.concurrent.TimeUnit;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;
import org.springframework.beans.factory.annotation.Value;
import org.springframework.boot.autoconfigure.condition.ConditionalOnProperty;
import org.springframework.context.SmartLifecycle;
import org.springframework.stereotype.Component;

/**
 * Stores the result of every suite run whose cells have all ended, a few seconds after the last
 * one ends, whether or not anyone has its page open. Runs on the server (workers only run units);
 * {@link SuiteRuns#settle} writes a result once even when two servers race for it.
 */
@Component
@ConditionalOnProperty(name = "driftlab.role", havingValue = "server", matchIfMissing = true)
public class SuiteSettler implements SmartLifecycle {

    /** Suite runs looked at per pass; the rest wait for the next pass. */
    static final int PER_PASS = 50;

    private static final Logger LOG = LoggerFactory.getLogger(SuiteSettler.class);

    private final SuiteRepository suites;
    private final SuiteRuns runs;
    private final Duration every;
    private ScheduledExecutorService timer;
    private volatile boolean running;

    SuiteSettler(
            SuiteRepository suites, SuiteRuns runs, @Value("${driftlab.suites.settle-every:PT3S}") Duration every) {
        this.suites = suites;
        this.runs = runs;
        this.every = every;
    }

    /** One pass: settles every running suite run whose cells have all ended; returns how many. */
    int settleEnded() {
        int settled = 0;
        for (SuiteRunRow r : suites.running(PER_PASS)) {
            try {
                if (runs.settle(r.id()).finished()) {
                    settled++;
                }
            } catch (RuntimeException e) {
                LOG.warn("suite run {} could not be settled", r.id(), e);
            }
        }
        return settled;
    }

    @Override
    public void start() {
        if (running) {
            return;
        }
        running = true;
        timer = Executors.newSingleThreadScheduledExecutor(r -> {
            Thread t = new Thread(r, "driftlab-suite-settler");
            t.setDaemon(true);
            return t;
        });
        long ms = Math.max(100, every.toMillis());
        timer.scheduleWithFixedDelay(
                () -> {
                    try {
                        settleEnded();
                    } catch (RuntimeException e) {
                        LOG.debug("suite settle pass failed", e);
                    }
                },
                ms,
                ms,
                TimeUnit.MILLISECONDS);
    }

    @Override
    public void stop() {
        running = false;
        if (timer != null) {
            timer.shutdownNow();
            timer = null;
        }
    }

    @Override
    public boolean isRunning() {
        return running;
    }
}
