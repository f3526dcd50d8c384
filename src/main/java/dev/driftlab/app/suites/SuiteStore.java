package dev.driftlab.app.suites;

import dev.driftlab.app.runs.RunQueue;
import dev.driftlab.app.runs.RunRefused;
import dev.driftlab.app.scenarios.RevisionConflict;
import dev.driftlab.app.scenarios.ScenarioNotFound;
import dev.driftlab.app.scenarios.ScenarioStore;
import dev.driftlab.app.scenarios.persistence.ScenarioRepository.RevisionRow;
import dev.driftlab.app.sharing.Access;
import dev.driftlab.app.sharing.Grant;
import dev.driftlab.app.sharing.LinkNotFound;
import dev.driftlab.app.sharing.OwnerLinks;
import dev.driftlab.app.sharing.ShareLinks;
import dev.driftlab.app.suites.persistence.SuiteRepository;
import dev.driftlab.app.suites.persistence.SuiteRepository.SuiteRow;
import dev.driftlab.scenario.Problem;
import dev.driftlab.scenario.Profile;
import dev.driftlab.scenario.Scenario;
import dev.driftlab.scenario.ScenarioException;
import dev.driftlab.trial.SuitePlan;
import java.time.Clock;
import java.time.OffsetDateTime;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.springframework.dao.DuplicateKeyException;
import org.springframework.stereotype.Service;
import org.springframework.transaction.annotation.Transactional;

/**
 * Stores suites as revisions and shares them by view and edit links, with the same link rules
 * and queries as scenarios ({@link OwnerLinks} over the {@code suite_link} table). Every save checks the whole suite first (each scenario link
 * resolves, pinned revisions exist, profiles read and name only fields that exist) and stores
 * nothing when anything is wrong.
 */
@Service
public class SuiteStore {

    /** Most scenarios in one suite. */
    public static final int MAX_ENTRIES = 40;
    /** Most profiles in one suite. */
    public static final int MAX_PROFILES = 6;
    /** Most seeds per scenario in a suite. */
    public static final int MAX_SEEDS = 1000;
    /** Longest suite name. */
    public static final int MAX_NAME = 200;
    /** Longest description. */
    public static final int MAX_DESCRIPTION = 2000;

    private static final Pattern TOKEN_IN_URL = Pattern.compile("/s/([A-Za-z0-9_-]{43})(?:[/?#].*)?$");

    /**
     * A suite at one revision.
     *
     * @param head the suite's head row
     * @param revision the revision shown
     * @param document its document
     */
    public record SuiteView(SuiteRow head, SuiteRepository.RevisionRow revision, SuiteDocument document) {}

    /** A new suite's links. */
    public record Created(long suiteId, String editToken, String viewToken) {}

    /**
     * One entry resolved to the exact revision a run uses.
     *
     * @param scenarioId the scenario
     * @param revisionId the revision
     * @param revisionNumber its number
     * @param pinned whether the suite pins it
     * @param entry the core's entry (name, source, scenario, seeds)
     */
    public record Resolved(
            long scenarioId, long revisionId, int revisionNumber, boolean pinned, SuitePlan.Entry entry) {}

    /**
     * A suite resolved for a run: its entries at their revisions, its profiles and the plan.
     *
     * @param entries one per scenario
     * @param profiles the profiles
     * @param plan what a run will run (cells a profile makes invalid carry the problems)
     */
    public record Checked(List<Resolved> entries, List<Profile> profiles, SuitePlan plan) {
        /** The cells a profile makes invalid, as "scenario under profile: path: message". */
        public List<String> invalidCells() {
            List<String> out = new ArrayList<>();
            for (SuitePlan.Row r : plan.rows()) {
                for (SuitePlan.Cell c : r.cells()) {
                    if (c.invalid()) {
                        String first = c.problems().isEmpty()
                                ? "invalid"
                                : c.problems().get(0).path() + ": "
                                        + c.problems().get(0).message();
                        out.add("\"" + r.entry().name() + "\" under profile \"" + c.name()
                                + "\" is invalid and will not run (" + first + ")");
                    }
                }
            }
            return out;
        }
    }

    private final SuiteRepository suites;
    private final ScenarioStore scenarios;
    private final ShareLinks links;
    private final OwnerLinks suiteLinks;
    private final Clock clock;

    public SuiteStore(SuiteRepository suites, ScenarioStore scenarios, ShareLinks links, Optional<Clock> clock) {
        this.suites = suites;
        this.scenarios = scenarios;
        this.links = links;
        this.clock = clock.orElse(Clock.systemUTC());
        this.suiteLinks = new OwnerLinks(suites.links(), this.clock);
    }

    /**
     * Stores a new suite with revision 1 and fresh view and edit links.
     *
     * @throws SuiteRefused with every problem when the suite cannot be stored
     */
    @Transactional
    public Created create(SuiteDocument document, String author, String message) {
        SuiteDocument d = normalised(document);
        OffsetDateTime now = OffsetDateTime.now(clock);
        long id = suites.insertSuite(d.name(), d.description(), now);
        suites.insertRevision(id, 1, clip(author, 200), clip(message, 2000), now, d.toJson());
        OwnerLinks.Issued issued = suiteLinks.issueBoth(id);
        return new Created(id, issued.edit(), issued.view());
    }

    /** Stores a packaged suite once; later calls for the same file do nothing. */
    @Transactional
    public Optional<Created> seedSample(String file, SuiteDocument document) {
        if (suites.sampleSeeded(file)) {
            return Optional.empty();
        }
        Created c = create(document, "Driftlab", "Loaded from the packaged suite " + file);
        suites.markSampleSeeded(file, c.suiteId(), OffsetDateTime.now(clock));
        return Optional.of(c);
    }

    /**
     * Saves a new revision on top of {@code base}.
     *
     * @return the new revision number
     * @throws SuiteRefused when the suite cannot be stored
     * @throws RevisionConflict when {@code base} is no longer the latest
     */
    @Transactional
    public int save(long suiteId, int base, SuiteDocument document, String author, String message) {
        SuiteDocument d = normalised(document);
        SuiteRow head = suites.find(suiteId).orElseThrow(LinkNotFound::new);
        if (!suites.advanceHead(suiteId, base, d.name(), d.description(), OffsetDateTime.now(clock))) {
            throw new RevisionConflict(base, head.latestRevision(), "someone else");
        }
        try {
            suites.insertRevision(
                    suiteId, base + 1, clip(author, 200), clip(message, 2000), OffsetDateTime.now(clock), d.toJson());
        } catch (DuplicateKeyException e) {
            throw new RevisionConflict(base, base + 1, "someone else");
        }
        return base + 1;
    }

    /** What a token opens, or {@link LinkNotFound}. */
    @Transactional(readOnly = true)
    public SuiteGrant require(String token) {
        OwnerLinks.Opened o = suiteLinks.require(token);
        return new SuiteGrant(o.ownerId(), o.access(), o.token());
    }

    /** The active view and edit tokens of a suite. */
    @Transactional(readOnly = true)
    public Map<Access, String> links(long suiteId) {
        return suiteLinks.current(suiteId);
    }

    /** Revokes the current link of one kind and issues a new one. */
    @Transactional
    public String reissue(long suiteId, Access access) {
        return suiteLinks.reissue(suiteId, access);
    }

    /** Revokes the current link of one kind; the old token then answers 404 everywhere. */
    @Transactional
    public void revoke(long suiteId, Access access) {
        suiteLinks.revoke(suiteId, access);
    }

    /** The suite at its latest revision. */
    @Transactional(readOnly = true)
    public SuiteView view(long suiteId) {
        SuiteRow head = suites.find(suiteId).orElseThrow(LinkNotFound::new);
        return at(head, head.latestRevision());
    }

    /** The suite at one revision. */
    @Transactional(readOnly = true)
    public SuiteView view(long suiteId, int number) {
        SuiteRow head = suites.find(suiteId).orElseThrow(LinkNotFound::new);
        return at(head, number);
    }

    /** Every revision, newest first. */
    @Transactional(readOnly = true)
    public List<SuiteRepository.RevisionRow> history(long suiteId) {
        return suites.revisions(suiteId);
    }

    /** Suites, newest change first. */
    @Transactional(readOnly = true)
    public List<SuiteRow> recent(int limit) {
        return suites.recent(limit);
    }

    /** Active view tokens of the given suites (a listing shows view links only). */
    @Transactional(readOnly = true)
    public Map<Long, String> viewTokens(java.util.Collection<Long> suiteIds) {
        return suiteLinks.viewTokens(suiteIds);
    }

    private SuiteView at(SuiteRow head, int number) {
        SuiteRepository.RevisionRow r =
                suites.revision(head.id(), number).orElseThrow(() -> new ScenarioNotFound("Suite revision " + number));
        return new SuiteView(head, r, SuiteDocument.read(r.document()));
    }

    /**
     * Checks a suite and resolves every scenario to the revision a run would use now.
     *
     * @throws SuiteRefused with every problem found, each at its path
     */
    @Transactional(readOnly = true)
    public Checked check(SuiteDocument d) {
        List<Problem> problems = new ArrayList<>();
        if (d.name() == null || d.name().isBlank()) {
            problems.add(Problem.error("name", "is required: give the suite a name"));
        } else if (d.name().strip().length() > MAX_NAME) {
            problems.add(Problem.error("name", "is longer than " + MAX_NAME + " characters"));
        }
        if (d.description() != null && d.description().length() > MAX_DESCRIPTION) {
            problems.add(Problem.error("description", "is longer than " + MAX_DESCRIPTION + " characters"));
        }
        if (d.seeds() != null && (d.seeds() < 1 || d.seeds() > MAX_SEEDS)) {
            problems.add(Problem.error("seeds", d.seeds() + " is outside 1 to " + MAX_SEEDS));
        }
        if (d.scenarios().isEmpty()) {
            problems.add(Problem.error("scenarios", "is empty: a suite needs at least one scenario"));
        }
        if (d.scenarios().size() > MAX_ENTRIES) {
            problems.add(Problem.error(
                    "scenarios", d.scenarios().size() + " scenarios given; at most " + MAX_ENTRIES + " in one suite"));
        }
        if (d.profiles().size() > MAX_PROFILES) {
            problems.add(Problem.error(
                    "profiles", d.profiles().size() + " profiles given; at most " + MAX_PROFILES + " in one suite"));
        }
        if (!problems.isEmpty()) {
            throw new SuiteRefused(problems);
        }
        List<Resolved> entries = new ArrayList<>();
        Set<String> names = new HashSet<>();
        for (int i = 0; i < d.scenarios().size(); i++) {
            resolve(d, i, names, problems).ifPresent(entries::add);
        }
        List<Profile> profiles = new ArrayList<>();
        for (int j = 0; j < d.profiles().size(); j++) {
            try {
                profiles.add(Profile.read(String.valueOf(d.profiles().get(j))));
            } catch (ScenarioException e) {
                for (Problem p : e.problems()) {
                    if (p.isError()) {
                        problems.add(Problem.error("profiles[" + j + "]." + p.path(), p.message()));
                    }
                }
            }
        }
        if (!problems.isEmpty()) {
            throw new SuiteRefused(problems);
        }
        try {
            SuitePlan plan = SuitePlan.of(entries.stream().map(Resolved::entry).toList(), profiles);
            return new Checked(entries, profiles, plan);
        } catch (ScenarioException e) {
            throw new SuiteRefused(e.problems());
        }
    }

    private Optional<Resolved> resolve(SuiteDocument d, int i, Set<String> names, List<Problem> problems) {
        SuiteDocument.Entry e = d.scenarios().get(i);
        String path = "scenarios[" + i + "]";
        if (e == null || e.link() == null || e.link().isBlank()) {
            problems.add(Problem.error(path + ".link", "is required: paste the scenario's view or edit link"));
            return Optional.empty();
        }
        Optional<Grant> g = links.resolve(token(e.link()));
        if (g.isEmpty()) {
            problems.add(Problem.error(
                    path + ".link",
                    "opens no scenario: the link was revoked, the scenario deleted, or the link mistyped;"
                            + " remove this scenario or give its current link"));
            return Optional.empty();
        }
        int seeds = d.seedsOf(e);
        if (seeds < 1 || seeds > MAX_SEEDS) {
            problems.add(Problem.error(path + ".seeds", seeds + " is outside 1 to " + MAX_SEEDS));
            return Optional.empty();
        }
        List<Long> seedList;
        try {
            seedList = RunQueue.consecutiveSeeds(d.first(), seeds);
        } catch (RunRefused r) {
            problems.add(Problem.error("firstSeed", r.getMessage()));
            return Optional.empty();
        }
        long scenarioId = g.get().scenarioId();
        RevisionRow rev;
        try {
            rev = e.revision() == null
                    ? scenarios.view(scenarioId).latest()
                    : scenarios.revision(scenarioId, e.revision());
        } catch (ScenarioNotFound missing) {
            int latest = scenarios.view(scenarioId).latest().number();
            problems.add(Problem.error(
                    path + ".revision",
                    "the scenario has no revision " + e.revision() + " (revisions 1 to " + latest + ")"));
            return Optional.empty();
        }
        Optional<Scenario> s = scenarios.rendering(rev.id()).checked().scenario();
        if (s.isEmpty()) {
            problems.add(Problem.error(path + ".revision", "revision " + rev.number() + " cannot be read"));
            return Optional.empty();
        }
        String name = s.get().name();
        if (!names.add(name)) {
            name = name + " (entry " + (i + 1) + ")";
            names.add(name);
        }
        long[] seedArray = seedList.stream().mapToLong(Long::longValue).toArray();
        String source = "revision " + rev.number() + (e.revision() == null ? " (latest)" : " (pinned)");
        return Optional.of(new Resolved(
                scenarioId,
                rev.id(),
                rev.number(),
                e.revision() != null,
                new SuitePlan.Entry(name, source, s.get(), seedArray)));
    }

    /**
     * The document as stored: checked, every link replaced by the scenario's view token (an edit
     * token is never stored, so a suite's view link cannot lead to editing a scenario).
     */
    private SuiteDocument normalised(SuiteDocument d) {
        check(d);
        List<SuiteDocument.Entry> entries = new ArrayList<>();
        for (int i = 0; i < d.scenarios().size(); i++) {
            SuiteDocument.Entry e = d.scenarios().get(i);
            Grant g = links.resolve(token(e.link())).orElseThrow();
            Optional<String> view = links.current(g.scenarioId()).view();
            if (view.isEmpty()) {
                throw SuiteRefused.of(
                        "scenarios[" + i + "].link",
                        "this scenario has no view link (it was revoked); issue one on the scenario page first");
            }
            entries.add(new SuiteDocument.Entry(view.get(), e.revision(), e.seeds()));
        }
        return new SuiteDocument(
                d.name().strip(),
                d.description() == null ? "" : d.description(),
                d.seeds(),
                d.firstSeed(),
                entries,
                d.profiles());
    }

    /** The token in a pasted link: the token itself, or the part after /s/ in a URL. */
    static String token(String link) {
        String s = link.strip();
        Matcher m = TOKEN_IN_URL.matcher(s);
        return m.find() ? m.group(1) : s;
    }

    private static String clip(String s, int max) {
        String t = s == null ? "" : s;
        return t.length() <= max ? t : t.substring(0, max);
    }
}
