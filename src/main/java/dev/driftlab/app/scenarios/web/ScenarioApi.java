package dev.driftlab.app.scenarios.web;

import dev.driftlab.app.scenarios.RevisionDiff;
import dev.driftlab.app.scenarios.SampleLibrary;
import dev.driftlab.app.scenarios.ScenarioNotFound;
import dev.driftlab.app.scenarios.ScenarioStore;
import dev.driftlab.app.scenarios.persistence.ScenarioRepository.RevisionRow;
import dev.driftlab.app.sharing.Grant;
import dev.driftlab.app.sharing.ShareLinks;
import dev.driftlab.scenario.Problem;
import io.swagger.v3.oas.annotations.Operation;
import io.swagger.v3.oas.annotations.tags.Tag;
import java.time.OffsetDateTime;
import java.util.List;
import org.springframework.beans.factory.annotation.Value;
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
 * Scenarios through the JSON API: import, export, revisions, compare, duplicate. Scenario documents
 * travel as the request or response body itself, so a CI job can send a file unchanged.
 */
@RestController
@Tag(name = "Scenarios", description = "Scenarios, revisions, import and export")
class ScenarioApi {

    /**
     * A validation finding.
     *
     * @param severity error or warning
     * @param path field path in the file
     * @param message plain explanation
     */
    record ProblemBody(String severity, String path, String message) {
        static ProblemBody of(Problem p) {
            return new ProblemBody(p.isError() ? "error" : "warning", p.path(), p.message());
        }
    }

    /**
     * A newly stored scenario.
     *
     * @param editToken token of the edit link
     * @param viewToken token of the view link
     * @param editPage page address of the edit link
     * @param viewPage page address of the view link
     */
    record CreatedBody(String editToken, String viewToken, String editPage, String viewPage) {
        static CreatedBody of(ScenarioStore.Created c) {
            return new CreatedBody(c.editToken(), c.viewToken(), "/s/" + c.editToken(), "/s/" + c.viewToken());
        }
    }

    /**
     * A scenario at its latest revision.
     *
     * @param name scenario name
     * @param description what it tests
     * @param latestRevision latest revision number
     * @param updatedAt when it was saved
     * @param access what the token used allows: view or edit
     * @param valid whether the latest revision has no errors
     * @param problems validation findings of the latest revision
     * @param variants settings variant names that runs may use
     */
    record ScenarioBody(
            String name,
            String description,
            int latestRevision,
            OffsetDateTime updatedAt,
            String access,
            boolean valid,
            List<ProblemBody> problems,
            List<String> variants) {}

    /**
     * One revision.
     *
     * @param number revision number
     * @param author free-text author
     * @param message change message
     * @param createdAt when saved
     */
    record RevisionBody(int number, String author, String message, OffsetDateTime createdAt) {
        static RevisionBody of(RevisionRow r) {
            return new RevisionBody(r.number(), r.author(), r.message(), r.createdAt());
        }
    }

    /**
     * A scenario in the listing.
     *
     * @param name scenario name
     * @param latestRevision latest revision number
     * @param viewToken token of its view link, null when revoked (a listing never shows edit links)
     * @param viewPage page address of the view link, null when revoked
     */
    record ListedBody(String name, int latestRevision, String viewToken, String viewPage) {}

    /**
     * A packaged sample.
     *
     * @param file file name
     * @param name scenario name
     * @param description what it tests
     */
    record SampleBody(String file, String name, String description) {}

    private final ScenarioStore store;
    private final ShareLinks links;
    private final SampleLibrary samples;
    private final boolean listScenarios;

    ScenarioApi(
            ScenarioStore store,
            ShareLinks links,
            SampleLibrary samples,
            @Value("${driftlab.home.list-scenarios:true}") boolean listScenarios) {
        this.store = store;
        this.links = links;
        this.samples = samples;
        this.listScenarios = listScenarios;
    }

    @GetMapping("/api/scenarios")
    @Operation(summary = "Scenarios matching a search text (only where the home page lists scenarios)")
    List<ListedBody> list(@RequestParam(defaultValue = "") String q) {
        if (!listScenarios) {
            throw new ScenarioNotFound("The scenario listing");
        }
        var tokens = links.viewTokens();
        return store.search(q, HomeController.LIST_LIMIT).stream()
                .map(v -> {
                    String t = tokens.get(v.head().id());
                    return new ListedBody(v.head().name(), v.head().latestRevision(), t, t == null ? null : "/s/" + t);
                })
                .toList();
    }

    @PostMapping(value = "/api/scenarios", consumes = MediaType.APPLICATION_JSON_VALUE)
    @Operation(summary = "Import a scenario document (the body is the file); refused with every problem when invalid")
    ResponseEntity<CreatedBody> importDocument(
            @RequestBody String document,
            @RequestParam(defaultValue = Forms.NO_AUTHOR) String author,
            @RequestParam(defaultValue = "Imported through the API") String message) {
        return ResponseEntity.status(HttpStatus.CREATED).body(CreatedBody.of(store.create(document, author, message)));
    }

    @GetMapping("/api/samples")
    @Operation(summary = "The packaged samples")
    List<SampleBody> samples() {
        return samples.all().stream()
                .map(s -> new SampleBody(s.file(), s.name(), s.description()))
                .toList();
    }

    @PostMapping("/api/samples/{file}/copy")
    @Operation(summary = "A new scenario from a packaged sample")
    ResponseEntity<CreatedBody> fromSample(
            @PathVariable String file, @RequestParam(defaultValue = Forms.NO_AUTHOR) String author) {
        SampleLibrary.Sample s = samples.byFile(file).orElseThrow(() -> new ScenarioNotFound("The sample"));
        return ResponseEntity.status(HttpStatus.CREATED)
                .body(CreatedBody.of(store.create(s.json(), author, "New from the sample " + s.file())));
    }

    @GetMapping("/api/s/{token}")
    @Operation(summary = "The scenario at its latest revision, with its validation findings")
    ScenarioBody scenario(@PathVariable String token) {
        Grant g = links.require(token);
        ScenarioStore.ScenarioView v = store.view(g.scenarioId());
        var checked = v.rendering().checked();
        return new ScenarioBody(
                v.head().name(),
                v.head().description(),
                v.head().latestRevision(),
                v.head().updatedAt(),
                g.access().word(),
                checked.ok(),
                checked.report().problems().stream().map(ProblemBody::of).toList(),
                v.rendering().variantNames());
    }

    @GetMapping(value = "/api/s/{token}/export", produces = MediaType.APPLICATION_JSON_VALUE)
    @Operation(summary = "The latest revision's document")
    ResponseEntity<String> export(@PathVariable String token) {
        Grant g = links.require(token);
        return document(g, store.view(g.scenarioId()).latest().number());
    }

    @GetMapping("/api/s/{token}/revisions")
    @Operation(summary = "Every revision, newest first")
    List<RevisionBody> revisions(@PathVariable String token) {
        Grant g = links.require(token);
        return store.history(g.scenarioId()).stream().map(RevisionBody::of).toList();
    }

    @GetMapping("/api/s/{token}/revisions/{number}")
    @Operation(summary = "One revision's details")
    RevisionBody revision(@PathVariable String token, @PathVariable int number) {
        Grant g = links.require(token);
        return RevisionBody.of(store.revision(g.scenarioId(), number));
    }

    @GetMapping(value = "/api/s/{token}/revisions/{number}/document", produces = MediaType.APPLICATION_JSON_VALUE)
    @Operation(summary = "One revision's document")
    ResponseEntity<String> revisionDocument(@PathVariable String token, @PathVariable int number) {
        return document(links.require(token), number);
    }

    @PostMapping(value = "/api/s/{token}/revisions", consumes = MediaType.APPLICATION_JSON_VALUE)
    @Operation(
            summary = "Save a new revision on top of revision 'base' (edit token required)",
            description = "The body is the whole scenario document. 409 when 'base' is no longer the latest"
                    + " revision, 422 with every problem when the document is invalid; nothing is stored then.")
    ResponseEntity<RevisionBody> save(
            @PathVariable String token,
            @RequestParam int base,
            @RequestParam(defaultValue = Forms.NO_AUTHOR) String author,
            @RequestParam(defaultValue = "") String message,
            @RequestBody String document) {
        Grant g = links.requireEdit(token);
        int n = store.save(g.scenarioId(), base, document, author, message);
        return ResponseEntity.status(HttpStatus.CREATED).body(RevisionBody.of(store.revision(g.scenarioId(), n)));
    }

    @GetMapping("/api/s/{token}/compare")
    @Operation(summary = "What changed between two revisions, by section")
    RevisionDiff compare(@PathVariable String token, @RequestParam int from, @RequestParam int to) {
        Grant g = links.require(token);
        return store.compare(g.scenarioId(), from, to);
    }

    @PostMapping("/api/s/{token}/duplicate")
    @Operation(summary = "A new scenario holding a copy of the latest revision (edit token required)")
    ResponseEntity<CreatedBody> duplicate(
            @PathVariable String token, @RequestParam(defaultValue = Forms.NO_AUTHOR) String author) {
        Grant g = links.requireEdit(token);
        return ResponseEntity.status(HttpStatus.CREATED).body(CreatedBody.of(store.duplicate(g.scenarioId(), author)));
    }

    private ResponseEntity<String> document(Grant g, int number) {
        return ResponseEntity.ok()
                .contentType(MediaType.APPLICATION_JSON)
                .header(
                        "Content-Disposition",
                        "attachment; filename=\"scenario-" + g.scenarioId() + "-rev" + number + ".json\"")
                .body(store.document(g.scenarioId(), number));
    }
}
