package dev.driftlab.app.system.web;

import dev.driftlab.geometry.GridCaster;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;
import org.springframework.boot.context.event.ApplicationReadyEvent;
import org.springframework.context.event.EventListener;
import org.springframework.stereotype.Component;

/**
 * Says once at start-up whether the grid ray caster runs on vector lanes, so whoever runs the
 * server knows why beam-model runs are fast or slow (the results are the same either way).
 */
@Component
class CasterModeLog {

    private static final Logger LOG = LoggerFactory.getLogger(CasterModeLog.class);

    @EventListener(ApplicationReadyEvent.class)
    void report() {
        if (GridCaster.LANES_AVAILABLE) {
            LOG.info("Grid ray caster: vector lanes on");
        } else {
            LOG.info("Grid ray caster: one ray at a time; start the JVM with --add-modules"
                    + " jdk.incubator.vector for a beam-model update about three times faster (same results)");
        }
    }
}
