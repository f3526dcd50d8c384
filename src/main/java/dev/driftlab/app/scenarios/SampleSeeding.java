package dev.driftlab.app.scenarios;

import org.slf4j.Logger;
import org.slf4j.LoggerFactory;
import org.springframework.beans.factory.SmartInitializingSingleton;
import org.springframework.boot.autoconfigure.condition.ConditionalOnProperty;
import org.springframework.dao.DataIntegrityViolationException;
import org.springframework.stereotype.Component;

/**
 * Loads the packaged samples as scenarios the first time the app meets a database. Runs before the
 * web server opens, so the very first page already lists them; a sample is never loaded twice,
 * even when two servers share one PostgreSQL database and start together.
 */
@Component
@ConditionalOnProperty(name = "driftlab.role", havingValue = "server", matchIfMissing = true)
public class SampleSeeding implements SmartInitializingSingleton {

    private static final Logger LOG = LoggerFactory.getLogger(SampleSeeding.class);

    private final SampleLibrary samples;
    private final ScenarioStore store;

    SampleSeeding(SampleLibrary samples, ScenarioStore store) {
        this.samples = samples;
        this.store = store;
    }

    @Override
    public void afterSingletonsInstantiated() {
        for (SampleLibrary.Sample s : samples.all()) {
            if (!s.checked().ok()) {
                LOG.warn("packaged sample {} has errors and is not loaded", s.file());
                continue;
            }
            try {
                store.seedSample(s.file(), s.json())
                        .ifPresent(c -> LOG.info("loaded sample {} as scenario {}", s.file(), c.scenarioId()));
            } catch (DataIntegrityViolationException e) {
                LOG.info("sample {} was loaded by another server at the same moment", s.file());
            }
        }
    }
}
