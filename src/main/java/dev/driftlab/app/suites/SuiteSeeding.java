package dev.driftlab.app.suites;

import dev.driftlab.app.scenarios.SampleSeeding;
import dev.driftlab.app.scenarios.ScenarioStore;
import dev.driftlab.app.sharing.ShareLinks;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;
import org.springframework.beans.factory.SmartInitializingSingleton;
import org.springframework.boot.autoconfigure.condition.ConditionalOnProperty;
import org.springframework.dao.DataIntegrityViolationException;
import org.springframework.stereotype.Component;

/**
 * Loads the packaged suites once, over the sample scenarios {@link SampleSeeding} loaded (server
 * role only, like the samples). A suite whose samples are missing is skipped with a log line.
 */
@Component
@ConditionalOnProperty(name = "driftlab.role", havingValue = "server", matchIfMissing = true)
public class SuiteSeeding implements SmartInitializingSingleton {

    private static final Logger LOG = LoggerFactory.getLogger(SuiteSeeding.class);

    private final SuiteSamples samples;
    private final SuiteStore suites;
    private final ScenarioStore scenarios;
    private final ShareLinks links;
    private final SampleSeeding sampleSeeding;

    SuiteSeeding(
            SuiteSamples samples,
            SuiteStore suites,
            ScenarioStore scenarios,
            ShareLinks links,
            SampleSeeding sampleSeeding) {
        this.samples = samples;
        this.suites = suites;
        this.scenarios = scenarios;
        this.links = links;
        this.sampleSeeding = sampleSeeding;
    }

    @Override
    public void afterSingletonsInstantiated() {
        // the scenarios first, whichever order the container calls us in
        sampleSeeding.afterSingletonsInstantiated();
        for (String file : samples.suiteFiles()) {
            samples.asDocument(file, scenarios, links)
                    .ifPresentOrElse(
                            d -> {
                                try {
                                    suites.seedSample(file, d)
                                            .ifPresent(c -> LOG.info("loaded suite {} as suite {}", file, c.suiteId()));
                                } catch (SuiteRefused e) {
                                    LOG.warn("packaged suite {} is refused: {}", file, e.getMessage());
                                } catch (DataIntegrityViolationException e) {
                                    LOG.info("suite {} was loaded by another server at the same moment", file);
                                }
                            },
                            () -> LOG.warn("packaged suite {} names samples that are not loaded; skipped", file));
        }
    }
}
