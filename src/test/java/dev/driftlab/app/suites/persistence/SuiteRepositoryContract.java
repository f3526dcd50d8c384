package dev.driftlab.app.suites.persistence;

import static org.assertj.core.api.Assertions.assertThat;

import dev.driftlab.app.runs.persistence.RunRepository;
import dev.driftlab.app.scenarios.ScenarioStore;
import dev.driftlab.app.scenarios.persistence.ScenarioRepository;
import dev.driftlab.app.sharing.ShareLinks;
import dev.driftlab.app.sharing.persistence.LinkTable;
import dev.driftlab.app.sharing.persistence.ShareLinkRepository;
import dev.driftlab.app.suites.persistence.SuiteRepository.SuiteRunRow;
import dev.driftlab.evaluation.Verdict;
import dev.driftlab.scenario.Scenarios;
import java.time.OffsetDateTime;
import java.time.ZoneOffset;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.context.annotation.Import;
import org.springframework.transaction.annotation.Propagation;
import org.springframework.transaction.annotation.Transactional;

/**
 * The suite tables on every supported database (migration V4 is portable SQL): revisions and the
 * head's compare-and-set, links, suite runs with their cells, the automatic baseline, the result
 * written once, and a run's profile column. Run on H2 and on PostgreSQL by the subclasses.
 */
@Import({
    SuiteRepository.class,
    RunRepository.class,
    ScenarioStore.class,
    ScenarioRepository.class,
    ShareLinks.class,
    ShareLinkRepository.class
})
@Transactional(propagation = Propagation.NOT_SUPPORTED)
abstract class SuiteRepositoryContract {

    static final OffsetDateTime T = OffsetDateTime.of(2026, 3, 1, 12, 0, 0, 0, ZoneOffset.UTC);

    @Autowired
    SuiteRepository suites;

    @Autowired
    RunRepository runs;

    @Autowired
    ScenarioStore scenarios;

    @Test
    void revisions_headMovesOnlyFromTheLatest_andLinksResolveUntilRevoked() {
        long id = suites.insertSuite("Nightly", "", T);
        suites.insertRevision(id, 1, "Ana", "start", T, "{\"name\":\"Nightly\"}");
        assertThat(suites.advanceHead(id, 1, "Nightly 2", "", T)).isTrue();
        suites.insertRevision(id, 2, "Ben", "more", T, "{\"name\":\"Nightly 2\"}");
        assertThat(suites.advanceHead(id, 1, "stale", "", T)).isFalse();
        assertThat(suites.find(id).orElseThrow().latestRevision()).isEqualTo(2);
        assertThat(suites.revisions(id))
                .extracting(SuiteRepository.RevisionRow::number)
                .containsExactly(2, 1);

        suites.links().insert("v".repeat(43), id, "view", T);
        suites.links().insert("e".repeat(43), id, "edit", T);
        assertThat(suites.links().activeViewLinks(List.of(id, id + 1000)))
                .extracting(LinkTable.LinkRow::token)
                .containsExactly("v".repeat(43));
        suites.links().revoke(id, "edit", T);
        assertThat(suites.links().findActive("e".repeat(43))).isEmpty();
        assertThat(suites.links().findActive("v".repeat(43)).orElseThrow().ownerId())
                .isEqualTo(id);
    }

    @Test
    void runs_cellsKeepTheirRuns_baselineIsThePreviousFinished_andTheResultIsWrittenOnce() {
        ScenarioStore.Created sc = scenarios.create(Scenarios.corridor().json(), "Ana", "x");
        long revision = scenarios.view(sc.scenarioId()).latest().id();
        long cellRun = runs.insert(
                sc.scenarioId(),
                revision,
                "batch-a",
                "r".repeat(43),
                "base",
                "[1,2]",
                "{}",
                "{\"format\":\"driftlab-profile/1\",\"name\":\"p\",\"rangefinder\":{\"rangeSigma\":0.1}}",
                T);
        assertThat(runs.find(cellRun).orElseThrow().label()).isEqualTo("base under profile p");

        long suite = suites.insertSuite("S", "", T);
        suites.insertRevision(suite, 1, "Ana", "", T, "{}");
        long rev = suites.revision(suite, 1).orElseThrow().id();
        long first = suites.insertRun(suite, rev, "a".repeat(43), "{\"entries\":[],\"profiles\":[]}", null, T);
        suites.insertCell(first, 0, 0, cellRun, null);
        suites.insertCell(first, 0, 1, null, "[\"rangefinder.maxRange: must be more than 0\"]");
        long second = suites.insertRun(suite, rev, "b".repeat(43), "{}", null, T);

        assertThat(suites.cells(first)).extracting(c -> c.runId().orElse(-1L)).containsExactly(cellRun, -1L);
        assertThat(suites.cells(first).get(1).problems().orElseThrow()).contains("maxRange");
        assertThat(suites.previousFinished(suite, second, null)).isEmpty();
        assertThat(suites.running(suite)).hasSize(2);

        assertThat(suites.finish(first, T, null, Verdict.FAIL, 3, 4, "{\"r\":1}"))
                .isTrue();
        assertThat(suites.finish(first, T, null, Verdict.PASS, 4, 4, "{\"r\":2}"))
                .isFalse();
        SuiteRunRow done = suites.run(first).orElseThrow();
        assertThat(done.finished()).isTrue();
        assertThat(done.verdict()).contains(Verdict.FAIL);
        assertThat(done.passing()).isEqualTo(3);
        assertThat(suites.result(first)).contains("{\"r\":1}");
        assertThat(suites.previousFinished(suite, second, null).map(SuiteRunRow::id))
                .contains(first);
        assertThat(suites.runByToken("b".repeat(43)).map(SuiteRunRow::id)).contains(second);
        assertThat(suites.runs(suite, 1)).extracting(SuiteRunRow::id).containsExactly(second);
    }

    @Test
    void sampleSuites_areMarkedOnce() {
        long suite = suites.insertSuite("S", "", T);
        assertThat(suites.sampleSeeded("x.suite.json")).isFalse();
        suites.markSampleSeeded("x.suite.json", suite, T);
        assertThat(suites.sampleSeeded("x.suite.json")).isTrue();
    }
}
