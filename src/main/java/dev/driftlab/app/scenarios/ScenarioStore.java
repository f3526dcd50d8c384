package dev.driftlab.app.scenarios;

import dev.driftlab.app.scenarios.persistence.ScenarioRepository;
import dev.driftlab.app.scenarios.persistence.ScenarioRepository.RevisionRow;
import dev.driftlab.app.scenarios.persistence.ScenarioRepository.ScenarioRow;
import dev.driftlab.app.sharing.ShareLinks;
import dev.driftlab.scenario.Scenario;
import dev.driftlab.scenario.ScenarioFiles;
import dev.driftlab.scenario.ScenarioJson;
import java.time.Clock;
import java.time.OffsetDateTime;
import java.util.List;
import java.util.Optional;
import org.springframework.dao.DuplicateKeyException;
import org.springframework.stereotype.Service;
import org.springframework.transaction.annotation.Transactional;

/**
 * Scenarios as immutable revisions: create, import, duplicate, save on a base revision (refused
 * when stale), history and comparison.
 */
@Service
public class ScenarioStore {

    /** Longest author name and change message kept. */
    public static final int MAX_AUTHOR = 200;

    public static final int MAX_MESSAGE = 2000;

    /**
     * A scenario at its latest revision.
     *
     * @param head the scenario row
     * @param latest the latest revision
     * @param rendering its parsed, validated and drawn form
     */
    public record ScenarioView(ScenarioRow head, RevisionRow latest, Rendering rendering) {}

    /**
     * A newly stored scenario with its links.
     *
     * @param scenarioId key
     * @param editToken edit link token
     * @param viewToken view link token
     */
    public record Created(long scenarioId, String editToken, String viewToken) {}

    private final ScenarioRepository scenarios;
    private final ShareLinks links;
    private final Clock clock;
    private final Rendering.Cache renderings = new Rendering.Cache(RENDERING_CACHE_BYTES);

    /** Memory the parsed and drawn revisions may hold together. */
    static final long RENDERING_CACHE_BYTES = 48L * 1024 * 1024;

    public ScenarioStore(ScenarioRepository scenarios, ShareLinks links, Optional<Clock> clock) {
        this.scenarios = scenarios;
        this.links = links;
        this.clock = clock.orElse(Clock.systemUTC());
    }

    /**
     * Stores a new scenario from a document, with revision 1 and fresh links.
     *
     * @throws ScenarioRefused when the document is unreadable or has errors
     */
    @Transactional
    public Created create(String document, String author, String message) {
        Scenario s = usable(document);
        OffsetDateTime now = OffsetDateTime.now(clock);
        long id = scenarios.insertScenario(shortName(s.name()), s.description(), now);
        scenarios.insertRevision(id, 1, clip(author, MAX_AUTHOR), clip(message, MAX_MESSAGE), now, document);
        ShareLinks.Links l = links.issueBoth(id);
        return new Created(id, l.edit().orElseThrow(), l.view().orElseThrow());
    }

    /** Stores a packaged sample once; later calls for the same file do nothing. */
    @Transactional
    public Optional<Created> seedSample(String file, String document) {
        if (scenarios.sampleSeeded(file)) {
            return Optional.empty();
        }
        Created c = create(document, "Driftlab", "Loaded from the packaged sample " + file);
        scenarios.markSampleSeeded(file, c.scenarioId(), OffsetDateTime.now(clock));
        return Optional.of(c);
    }

    /** The scenario each loaded sample became, by sample file name (for picking samples into a suite). */
    @Transactional(readOnly = true)
    public java.util.Map<String, Long> sampleScenarios() {
        return scenarios.sampleScenarios();
    }

    /** A new scenario holding a copy of another's latest revision, named "Copy of ...". */
    @Transactional
    public Created duplicate(long scenarioId, String author) {
        ScenarioView v = view(scenarioId);
        Scenario s = v.rendering().checked().scenario().orElseThrow(() -> new ScenarioNotFound("The scenario"));
        Scenario copy = new Scenario(
                "Copy of " + s.name(),
                s.description(),
                s.site(),
                s.robot(),
                s.rangefinder(),
                s.route(),
                s.faults(),
                s.localizer(),
                s.variants(),
                s.gates());
        return create(
                ScenarioJson.write(copy),
                author,
                "Copied from \"" + s.name() + "\" revision " + v.latest().number());
    }

    /**
     * Saves a new revision on top of {@code baseRevision}.
     *
     * @return the new revision number
     * @throws ScenarioRefused when the document is unreadable or has errors
     * @throws RevisionConflict when {@code baseRevision} is no longer the latest
     */
    @Transactional
    public int save(long scenarioId, int baseRevision, String document, String author, String message) {
        Scenario s = usable(document);
        ScenarioRow head = scenarios.find(scenarioId).orElseThrow(() -> new ScenarioNotFound("The scenario"));
        OffsetDateTime now = OffsetDateTime.now(clock);
        if (!scenarios.advanceHead(scenarioId, baseRevision, shortName(s.name()), s.description(), now)) {
            int latest =
                    scenarios.find(scenarioId).map(ScenarioRow::latestRevision).orElse(head.latestRevision());
            throw conflict(scenarioId, baseRevision, latest);
        }
        try {
            scenarios.insertRevision(
                    scenarioId, baseRevision + 1, clip(author, MAX_AUTHOR), clip(message, MAX_MESSAGE), now, document);
        } catch (DuplicateKeyException e) {
            // the unique (scenario, number) key is the second guard should a database let two
            // compare-and-set updates through; no further query, as PostgreSQL has aborted the transaction
            throw new RevisionConflict(baseRevision, baseRevision + 1, "someone else");
        }
        return baseRevision + 1;
    }

    /** The scenario at its latest revision. */
    @Transactional(readOnly = true)
    public ScenarioView view(long scenarioId) {
        ScenarioRow head = scenarios.find(scenarioId).orElseThrow(() -> new ScenarioNotFound("The scenario"));
        RevisionRow latest = scenarios
                .revision(scenarioId, head.latestRevision())
                .orElseThrow(() -> new ScenarioNotFound("The latest revision"));
        return new ScenarioView(head, latest, rendering(latest.id()));
    }

    /** Scenarios matching a search text (empty text: all), newest change first, at most {@code limit}. */
    @Transactional(readOnly = true)
    public List<ScenarioView> search(String text, int limit) {
        return search(text, 0, limit);
    }

    /** One page of {@link #search(String, int)}: skips {@code offset} matches. */
    @Transactional(readOnly = true)
    public List<ScenarioView> search(String text, int offset, int limit) {
        return scenarios.search(text.strip(), offset, limit).stream()
                .map(h -> scenarios
                        .revision(h.id(), h.latestRevision())
                        .map(r -> new ScenarioView(h, r, rendering(r.id()))))
                .flatMap(Optional::stream)
                .toList();
    }

    /** All revisions, newest first. */
    @Transactional(readOnly = true)
    public List<RevisionRow> history(long scenarioId) {
        return scenarios.revisions(scenarioId);
    }

    /** One revision. */
    @Transactional(readOnly = true)
    public RevisionRow revision(long scenarioId, int number) {
        return scenarios.revision(scenarioId, number).orElseThrow(() -> new ScenarioNotFound("Revision " + number));
    }

    /** The document of one revision. */
    @Transactional(readOnly = true)
    public String document(long scenarioId, int number) {
        RevisionRow r = revision(scenarioId, number);
        return scenarios.document(r.id()).orElseThrow(() -> new ScenarioNotFound("Revision " + number));
    }

    /** The document of a revision by its key, for runs. */
    @Transactional(readOnly = true)
    public Optional<String> documentOfRevision(long revisionId) {
        return scenarios.document(revisionId);
    }

    /** What changed between two revisions, section by section. */
    @Transactional(readOnly = true)
    public RevisionDiff compare(long scenarioId, int from, int to) {
        Scenario a = parsed(scenarioId, from);
        Scenario b = parsed(scenarioId, to);
        return RevisionDiff.between(from, a, to, b);
    }

    /** The parsed, validated and drawn form of a revision. */
    public Rendering rendering(long revisionId) {
        Optional<Rendering> cached = renderings.get(revisionId);
        if (cached.isPresent()) {
            return cached.get();
        }
        Rendering r = Rendering.of(scenarios.document(revisionId).orElse(""));
        renderings.put(revisionId, r);
        return r;
    }

    private Scenario parsed(long scenarioId, int number) {
        return rendering(revision(scenarioId, number).id())
                .checked()
                .scenario()
                .orElseThrow(() -> new ScenarioNotFound("A readable revision " + number));
    }

    private RevisionConflict conflict(long scenarioId, int base, int latest) {
        String by =
                scenarios.revision(scenarioId, latest).map(RevisionRow::author).orElse("someone else");
        return new RevisionConflict(base, latest, by);
    }

    private static Scenario usable(String document) {
        ScenarioFiles.Checked checked = ScenarioFiles.check(document);
        if (!checked.ok()) {
            throw new ScenarioRefused(checked.report().problems());
        }
        return checked.scenario().orElseThrow();
    }

    private static String shortName(String name) {
        return clip(name, 500);
    }

    private static String clip(String s, int max) {
        String t = s.strip();
        return t.length() <= max ? t : t.substring(0, max);
    }
}
