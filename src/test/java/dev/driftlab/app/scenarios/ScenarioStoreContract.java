package dev.driftlab.app.scenarios;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import dev.driftlab.app.scenarios.persistence.ScenarioRepository;
import dev.driftlab.app.sharing.Access;
import dev.driftlab.app.sharing.ShareLinks;
import dev.driftlab.app.sharing.persistence.ShareLinkRepository;
import dev.driftlab.scenario.Door;
import dev.driftlab.scenario.DoorState;
import dev.driftlab.scenario.Scenario;
import dev.driftlab.scenario.ScenarioJson;
import dev.driftlab.scenario.Scenarios;
import dev.driftlab.scenario.SitePlan;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.Callable;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.context.annotation.Import;
import org.springframework.transaction.annotation.Propagation;
import org.springframework.transaction.annotation.Transactional;

/**
 * What the scenario store must do on every supported database: revisions, conflicts, refusals,
 * links, samples, duplicates and comparison. Run on H2 and on PostgreSQL by the subclasses.
 */
@Import({ScenarioStore.class, ScenarioRepository.class, ShareLinks.class, ShareLinkRepository.class})
@Transactional(propagation = Propagation.NOT_SUPPORTED)
abstract class ScenarioStoreContract {

    @Autowired
    ScenarioStore store;

    @Autowired
    ShareLinks links;

    @Autowired
    ScenarioRepository repository;

    static String doc(String name) {
        return Scenarios.corridor().withName(name).json();
    }

    @Test
    void create_storesRevisionOne_andIssuesViewAndEditLinks() {
        ScenarioStore.Created c = store.create(doc("First"), "Ana", "start");

        ScenarioStore.ScenarioView v = store.view(c.scenarioId());
        assertThat(v.head().name()).isEqualTo("First");
        assertThat(v.latest().number()).isEqualTo(1);
        assertThat(v.latest().author()).isEqualTo("Ana");
        assertThat(links.require(c.editToken()).access()).isEqualTo(Access.EDIT);
        assertThat(links.require(c.viewToken()).access()).isEqualTo(Access.VIEW);
        assertThat(c.editToken()).hasSize(43).matches("[A-Za-z0-9_-]+");
    }

    @Test
    void save_onLatestRevision_addsTheNextRevision_andKeepsTheOldOne() {
        ScenarioStore.Created c = store.create(doc("Before"), "Ana", "start");

        int n = store.save(c.scenarioId(), 1, doc("After"), "Ben", "renamed");

        assertThat(n).isEqualTo(2);
        assertThat(store.view(c.scenarioId()).head().name()).isEqualTo("After");
        assertThat(store.history(c.scenarioId())).extracting(r -> r.number()).containsExactly(2, 1);
        assertThat(store.document(c.scenarioId(), 1)).contains("\"Before\"");
    }

    @Test
    void save_onStaleRevision_isRefusedWithConflict_andStoresNothing() {
        ScenarioStore.Created c = store.create(doc("Base"), "Ana", "start");
        store.save(c.scenarioId(), 1, doc("Ana's change"), "Ana", "first");

        assertThatThrownBy(() -> store.save(c.scenarioId(), 1, doc("Ben's change"), "Ben", "late"))
                .isInstanceOf(RevisionConflict.class)
                .hasMessageContaining("revision 1")
                .hasMessageContaining("revision 2 (by Ana)");
        assertThat(store.history(c.scenarioId())).hasSize(2);
        assertThat(store.view(c.scenarioId()).head().name()).isEqualTo("Ana's change");
    }

    @Test
    void twoConcurrentSaves_onTheSameRevision_giveExactlyOneWinner() throws Exception {
        for (int round = 0; round < 5; round++) {
            ScenarioStore.Created c = store.create(doc("Race " + round), "Ana", "start");
            CountDownLatch go = new CountDownLatch(1);
            ExecutorService pool = Executors.newFixedThreadPool(2);
            try {
                List<Future<String>> outcomes = new ArrayList<>();
                for (String who : List.of("Ana", "Ben")) {
                    Callable<String> save = () -> {
                        go.await();
                        try {
                            store.save(c.scenarioId(), 1, doc(who + " wins"), who, "race");
                            return "saved";
                        } catch (RevisionConflict e) {
                            return "conflict";
                        }
                    };
                    outcomes.add(pool.submit(save));
                }
                go.countDown();
                List<String> results = new ArrayList<>();
                for (Future<String> f : outcomes) {
                    results.add(f.get(30, TimeUnit.SECONDS));
                }
                assertThat(results).containsExactlyInAnyOrder("saved", "conflict");
                assertThat(store.history(c.scenarioId())).hasSize(2);
            } finally {
                pool.shutdownNow();
            }
        }
    }

    @Test
    void create_withInvalidDocument_isRefusedWithEveryProblem_andStoresNothing() {
        long before = repository.count();

        assertThatThrownBy(() -> store.create("{\"format\": \"driftlab-scenario/1\", \"name\": 3}", "Ana", ""))
                .isInstanceOfSatisfying(
                        ScenarioRefused.class,
                        e -> assertThat(e.problems())
                                .isNotEmpty()
                                .allSatisfy(p -> assertThat(p.path()).isNotBlank()));
        assertThatThrownBy(() -> store.create("not json at all", "Ana", "")).isInstanceOf(ScenarioRefused.class);
        assertThat(repository.count()).isEqualTo(before);
    }

    @Test
    void seedSample_loadsEachFileOnce() {
        String file = "test-sample-" + System.nanoTime() + ".json";

        assertThat(store.seedSample(file, doc("Seeded"))).isPresent();
        assertThat(store.seedSample(file, doc("Seeded"))).isEmpty();
    }

    @Test
    void duplicate_copiesTheLatestRevision_intoANewScenarioWithItsOwnLinks() {
        ScenarioStore.Created c = store.create(doc("Original"), "Ana", "start");

        ScenarioStore.Created copy = store.duplicate(c.scenarioId(), "Ben");

        assertThat(copy.scenarioId()).isNotEqualTo(c.scenarioId());
        assertThat(store.view(copy.scenarioId()).head().name()).isEqualTo("Copy of Original");
        assertThat(copy.editToken()).isNotEqualTo(c.editToken());
    }

    @Test
    void reissue_retiresTheOldToken_andRevoke_closesTheLink() {
        ScenarioStore.Created c = store.create(doc("Shared"), "Ana", "start");

        String fresh = links.reissue(c.scenarioId(), Access.VIEW);
        links.revoke(c.scenarioId(), Access.EDIT);

        assertThat(links.resolve(c.viewToken())).isEmpty();
        assertThat(links.resolve(fresh)).isPresent();
        assertThat(links.resolve(c.editToken())).isEmpty();
        assertThat(links.current(c.scenarioId()).edit()).isEmpty();
    }

    @Test
    void compare_reportsChangesBySection() {
        Scenario a = Scenarios.corridor().withName("Compare me").build();
        List<Door> doors = new ArrayList<>();
        for (Door d : a.site().doors()) {
            doors.add(new Door(d.id(), d.room(), d.wall(), d.along(), d.width(), d.mapped(), DoorState.CLOSED));
        }
        Scenario b = new Scenario(
                "Compare me, door shut",
                a.description(),
                new SitePlan(
                        a.site().rooms(),
                        doors,
                        a.site().fixtures(),
                        a.site().floorZones(),
                        a.site().clutter()),
                a.robot(),
                a.rangefinder(),
                a.route(),
                a.faults(),
                a.localizer(),
                a.variants(),
                a.gates());
        ScenarioStore.Created c = store.create(ScenarioJson.write(a), "Ana", "start");
        store.save(c.scenarioId(), 1, ScenarioJson.write(b), "Ana", "door shut");

        RevisionDiff diff = store.compare(c.scenarioId(), 1, 2);

        assertThat(diff.changedSections())
                .extracting(RevisionDiff.Section::title)
                .containsExactly("Name and description", "Doors");
        RevisionDiff.Change door = diff.changedSections().get(1).changes().get(0);
        assertThat(door.kind()).isEqualTo(RevisionDiff.Kind.CHANGED);
        assertThat(door.path()).isEqualTo("site.doors[\"side-door\"].actual");
        assertThat(store.compare(c.scenarioId(), 1, 1).identical()).isTrue();
    }
}
