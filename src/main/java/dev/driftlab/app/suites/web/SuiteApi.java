package dev.driftlab.app.suites.web;

import dev.driftlab.app.runs.LocalizerAllowList;
import dev.driftlab.app.runs.persistence.RunRepository.RunRow;
import dev.driftlab.app.sharing.Access;
import dev.driftlab.app.suites.SuiteDocument;
import dev.driftlab.app.suites.SuiteGrant;
import dev.driftlab.app.suites.SuiteRuns;
import dev.driftlab.app.suites.SuiteStore;
import dev.driftlab.app.suites.persistence.SuiteRepository.SuiteRunRow;
import io.swagger.v3.oas.annotations.Operation;
import io.swagger.v3.oas.annotations.tags.Tag;
import java.util.List;
import java.util.Map;
import org.springframework.http.HttpStatus;
import org.springframework.http.MediaType;
import org.springframework.http.ResponseEntity;
import org.springframework.web.bind.annotation.GetMapping;
import org.springframework.web.bind.annotation.PathVariable;
import org.springframework.web.bind.annotation.PostMapping;
import org.springframework.web.bind.annotation.RequestBody;
import org.springframework.web.bind.annotation.RequestParam;
import org.springframework.web.bind.annotation.RestController;

/**
 * Suites through the JSON API: create, read, save a revision, run, poll a run and read its result.
 * A suite's view link may read and run it; only its edit link may change it or see its edit link.
 */
@RestController
@Tag(name = "Suites", description = "Suites of scenarios and profiles: create, revise, run, results")
class SuiteApi {

    /** A new suite's links. */
    record CreatedBody(String viewLink, String editLink, int revision) {}

    /** A saved revision. */
    record SavedBody(int revision) {}

    /**
     * A suite at its latest revision.
     *
     * @param name name
     * @param revision latest revision number
     * @param canEdit whether the token presented is the edit link
     * @param document the suite document (scenarios by view link)
     * @param links the active links: the view link always, the edit link only to its holder
     * @param runs the latest runs, newest first
     */
    record SuiteBody(
            String name,
            int revision,
            boolean canEdit,
            SuiteDocument document,
            Map<String, String> links,
            List<RunBody> runs) {}

    /**
     * A suite run.
     *
     * @param id the run's number within its suite, for cancelling it through the suite's edit link
     * @param link the run's permalink token
     * @param state running or finished
     * @param percent share of trials done
     * @param verdict the verdict's file name once finished
     * @param passing gates that held, once finished
     * @param gates gates planned, once finished
     * @param cells one per scenario and column: the run's token, or the problems of an invalid cell
     * @param localizer the outside localizer every cell judged, by its listed name; null for the
     *     built-in one
     */
    record RunBody(
            long id,
            String link,
            String state,
            Integer percent,
            String verdict,
            int passing,
            int gates,
            List<CellBody> cells,
            String localizer) {}

    /**
     * How to run a suite.
     *
     * @param localizer an outside localizer by the name the server's administrator gave it (see
     *     {@code GET /api/localizers}); absent or blank for the built-in one
     */
    record RunRequest(String localizer) {}

    /** One cell of a suite run. */
    record CellBody(String scenario, String column, String runLink, String runState, List<String> problems) {}

    private final SuiteStore store;
    private final SuiteRuns runs;

    SuiteApi(SuiteStore store, SuiteRuns runs) {
        this.store = store;
        this.runs = runs;
    }

    @PostMapping(value = "/api/suites", consumes = MediaType.APPLICATION_JSON_VALUE)
    @Operation(
            summary = "Create a suite (scenarios by their links, profiles as profile documents)",
            description = "422 with every problem at its path (scenarios[2].link, profiles[0].rangefinder.x) when"
                    + " a link opens nothing, a pinned revision does not exist, the suite is empty or a profile"
                    + " names a field that does not exist; nothing is stored then.")
    ResponseEntity<CreatedBody> create(
            @RequestBody SuiteDocument document, @RequestParam(defaultValue = "") String author) {
        SuiteStore.Created c = store.create(document, author, "Created");
        return ResponseEntity.status(HttpStatus.CREATED).body(new CreatedBody(c.viewToken(), c.editToken(), 1));
    }

    @GetMapping("/api/suites/{token}")
    @Operation(summary = "The suite at its latest revision, its links (the edit link only to its holder) and runs")
    SuiteBody get(@PathVariable String token) {
        SuiteGrant g = store.require(token);
        SuiteStore.SuiteView v = store.view(g.suiteId());
        Map<Access, String> links = store.links(g.suiteId());
        Map<String, String> shown = new java.util.LinkedHashMap<>();
        if (links.containsKey(Access.VIEW)) {
            shown.put("view", links.get(Access.VIEW));
        }
        if (g.canEdit() && links.containsKey(Access.EDIT)) {
            shown.put("edit", links.get(Access.EDIT));
        }
        List<RunBody> recent =
                runs.recent(g.suiteId(), 20).stream().map(r -> body(r, false)).toList();
        return new SuiteBody(v.head().name(), v.revision().number(), g.canEdit(), v.document(), shown, recent);
    }

    @PostMapping(value = "/api/suites/{token}/revisions", consumes = MediaType.APPLICATION_JSON_VALUE)
    @Operation(
            summary = "Save a new revision on top of revision `base` (edit link required)",
            description = "403 for a view link, 409 when `base` is not the latest, 422 as for create.")
    SavedBody save(
            @PathVariable String token,
            @RequestParam int base,
            @RequestBody SuiteDocument document,
            @RequestParam(defaultValue = "") String author,
            @RequestParam(defaultValue = "") String message) {
        SuiteGrant g = store.require(token).requireEdit();
        return new SavedBody(store.save(g.suiteId(), base, document, author, message));
    }

    @PostMapping("/api/suites/{token}/runs")
    @Operation(
            summary = "Run the suite at its latest revision: every scenario as it is and under each profile",
            description = "Each cell is an ordinary run with work units. All or none: 503 with Retry-After"
                    + " when the queue has no room, 422 over the budget, when a scenario no longer opens or for"
                    + " a localizer no live process offers. An optional body {\"localizer\": NAME} judges an"
                    + " outside localizer from the server's list (GET /api/localizers) in every cell.")
    ResponseEntity<RunBody> run(
            @PathVariable String token,
            @org.springframework.web.bind.annotation.RequestBody(required = false) RunRequest request) {
        SuiteGrant g = store.require(token);
        String localizer = request == null ? null : LocalizerAllowList.requestedName(request.localizer());
        SuiteRunRow r = runs.submit(g.suiteId(), localizer);
        return ResponseEntity.status(HttpStatus.ACCEPTED).body(body(r, true));
    }

    @PostMapping("/api/suites/{token}/runs/{id}/cancel")
    @Operation(summary = "Cancel every cell of a suite run that has not ended (edit link required)")
    RunBody cancel(@PathVariable String token, @PathVariable long id) {
        SuiteGrant g = store.require(token).requireEdit();
        SuiteRunRow r = runs.of(g.suiteId(), id);
        runs.cancel(r);
        return body(runs.of(g.suiteId(), id), true);
    }

    @PostMapping("/api/suites/{token}/links/{access}/reissue")
    @Operation(summary = "Revoke the suite's current view or edit link and issue a new one (edit link required)")
    Map<String, String> reissue(@PathVariable String token, @PathVariable String access) {
        SuiteGrant g = store.require(token).requireEdit();
        Access a = Access.inPath(access);
        return Map.of(a.word(), store.reissue(g.suiteId(), a));
    }

    @PostMapping("/api/suites/{token}/links/{access}/revoke")
    @Operation(summary = "Revoke the suite's current view or edit link; it then answers 404 (edit link required)")
    ResponseEntity<Void> revoke(@PathVariable String token, @PathVariable String access) {
        SuiteGrant g = store.require(token).requireEdit();
        Access a = Access.inPath(access);
        store.revoke(g.suiteId(), a);
        return ResponseEntity.noContent().build();
    }

    @GetMapping("/api/suite-runs/{runToken}")
    @Operation(summary = "A suite run: progress, verdict and each cell's run link")
    RunBody status(@PathVariable String runToken) {
        return body(runs.byToken(runToken), true);
    }

    @GetMapping(value = "/api/suite-runs/{runToken}/result", produces = MediaType.APPLICATION_JSON_VALUE)
    @Operation(summary = "The finished suite run's result document (driftlab-suite-result/1)")
    ResponseEntity<String> result(@PathVariable String runToken) {
        SuiteRunRow r = runs.settle(runs.byToken(runToken).id());
        return runs.result(r)
                .map(ResponseEntity::ok)
                .orElseGet(() -> ResponseEntity.status(HttpStatus.NOT_FOUND).build());
    }

    private RunBody body(SuiteRunRow r, boolean withCells) {
        SuiteRuns.Progress p = runs.progress(r);
        List<CellBody> cells = !withCells
                ? List.of()
                : p.rows().stream()
                        .flatMap(row -> row.cells().stream()
                                .map(c -> new CellBody(
                                        row.name(),
                                        c.column(),
                                        c.run().map(RunRow::viewToken).orElse(null),
                                        c.run().map(RunRow::state).orElse("invalid"),
                                        c.problems())))
                        .toList();
        SuiteRunRow now = p.run();
        return new RunBody(
                now.id(),
                now.viewToken(),
                now.state(),
                p.percent(),
                now.verdict().map(v -> v.fileName()).orElse(null),
                now.passing(),
                now.gates(),
                cells,
                now.localizer().orElse(null));
    }
}
