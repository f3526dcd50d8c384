package dev.driftlab.app;

import dev.driftlab.app.runs.RunBoard;
import dev.driftlab.app.runs.RunQueue;
import dev.driftlab.app.runs.ScriptedTrialExecutor;
import dev.driftlab.app.runs.persistence.RunRepository;
import dev.driftlab.app.scenarios.SampleLibrary;
import dev.driftlab.app.scenarios.SampleSeeding;
import dev.driftlab.app.scenarios.ScenarioStore;
import dev.driftlab.app.scenarios.persistence.ScenarioRepository;
import dev.driftlab.app.sharing.ShareLinks;
import dev.driftlab.app.sharing.persistence.ShareLinkRepository;
import dev.driftlab.app.system.web.SecurityConfig;
import java.lang.annotation.ElementType;
import java.lang.annotation.Retention;
import java.lang.annotation.RetentionPolicy;
import java.lang.annotation.Target;
import org.springframework.boot.autoconfigure.ImportAutoConfiguration;
import org.springframework.boot.flyway.autoconfigure.FlywayAutoConfiguration;
import org.springframework.boot.jdbc.test.autoconfigure.AutoConfigureJdbc;
import org.springframework.boot.webmvc.test.autoconfigure.WebMvcTest;
import org.springframework.context.annotation.Import;

/**
 * The web slice (every controller, advice and filter, security included) over the real services
 * on an in-memory H2 database with the packaged samples loaded, and the scripted trial executor in
 * place of the engine.
 */
@Target(ElementType.TYPE)
@Retention(RetentionPolicy.RUNTIME)
@WebMvcTest
@AutoConfigureJdbc
@ImportAutoConfiguration(FlywayAutoConfiguration.class)
@Import({
    SecurityConfig.class,
    SampleLibrary.class,
    SampleSeeding.class,
    ScenarioStore.class,
    ScenarioRepository.class,
    ShareLinks.class,
    ShareLinkRepository.class,
    RunQueue.class,
    RunBoard.class,
    RunRepository.class,
    dev.driftlab.app.runs.persistence.UnitRepository.class,
    dev.driftlab.app.runs.WorkEngine.class,
    dev.driftlab.app.runs.LocalizerAllowList.class,
    dev.driftlab.app.runs.RunPanel.class,
    dev.driftlab.app.runs.WorkerBoard.class,
    dev.driftlab.app.runs.persistence.WorkerRepository.class,
    ScriptedTrialExecutor.class,
    dev.driftlab.app.reports.ReportRenders.class,
    dev.driftlab.app.suites.SuiteStore.class,
    dev.driftlab.app.suites.SuiteRuns.class,
    dev.driftlab.app.suites.SuiteSamples.class,
    dev.driftlab.app.suites.SuiteSeeding.class,
    dev.driftlab.app.suites.persistence.SuiteRepository.class,
    dev.driftlab.app.suites.web.SuiteEntries.class,
    dev.driftlab.app.suites.web.SuiteRunReports.class
})
public @interface WebSlice {}
