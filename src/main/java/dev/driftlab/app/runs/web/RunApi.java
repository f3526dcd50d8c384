package dev.driftlab.app.runs.web;

import dev.driftlab.app.runs.LocalizerAllowList;
import dev.driftlab.app.runs.RunBoard;
import dev.driftlab.app.runs.RunQueue;
import dev.driftlab.app.runs.RunState;
import dev.driftlab.app.runs.TrialOptions;
import dev.driftlab.app.runs.persistence.RunRepository.RunRow;
import dev.driftlab.app.scenarios.ScenarioStore;
import dev.driftlab.app.sharing.Grant;
import dev.driftlab.app.sharing.ShareLinks;
import dev.driftlab.evaluation.Verdict;
import io.swagger.v3.oas.annotations.Operation;
import io.swagger.v3.oas.annotations.media.Schema;
import io.swagger.v3.oas.annotations.tags.Tag;
import java.time.Duration;
import java.time.OffsetDateTime;
import java.util.List;
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
 * Runs and batches through the JSON API, so a CI job can submit a batch, poll it and read its
 * results. View and edit tokens may both run; a run's own token only reads that run.
 */
@RestController
@Tag(name = "Runs", description = "Batches of runs: submit, status, cancel, results, frame chunks")
class RunApi {

    /**
     * A batch request: one run per variant over the same seeds.
     *
     * @param variants settings variant names; empty means ["base"]
     * @param seeds explicit seeds; when empty, {@code firstSeed} and {@code seedCount} are used
     * @param firstSeed first of consecutive seeds (default 1)
     * @param seedCount number of consecutive seeds (default 1)
     * @param recordFrames whether to store frames for the player
     * @param revision revision to run; the latest when absent
     * @param particleCounts a particle-count sweep: one run per count, of the single variant named
     * @param localizer an outside localizer by the name the server's administrator gave it (see
     *     {@code GET /api/localizers}); absent for the built-in one
     */
    record BatchRequest(
            List<String> variants,
            List<Long> seeds,
            Long firstSeed,
            Integer seedCount,
            Boolean recordFrames,
            Integer revision,
            List<Integer> particleCounts,

            @Schema(
                    description = "An outside localizer by the name the server's administrator gave it"
                            + " (GET /api/localizers); absent or blank for the built-in one. Never a"
                            + " command: a name no running process offers is refused with 422.",
                    nullable = true)
            String localizer) {}

    /**
     * A run's state.
     *
     * @param id run id within the scenario's links
     * @param batch batch key
     * @param revision scenario revision run
     * @param variant settings variant
     * @param seeds seeds
     * @param state queued, running, done, failed, cancelled or interrupted
     * @param finished whether the state is final
     * @param progress done share 0..1
     * @param progressMessage last progress text
     * @param queuedAt when accepted
     * @param startedAt when started, or null
     * @param finishedAt when it stopped, or null
     * @param seconds run time so far or in total, or null before it started
     * @param hasResult whether a result document can be fetched
     * @param failure reason when failed or interrupted, else empty
     * @param viewToken the run's own read-only link token
     * @param particles fixed particle count of a sweep run, or 0 when the variant's own is used
     * @param verdict the run's verdict as in its result document (pass, fail, ended-early,
     *     not-exercised, incomplete), or null while it has none (not done, or stored before verdicts)
     */
    record RunBody(
            long id,
            String batch,
            int revision,
            String variant,
            List<Long> seeds,
            String state,
            boolean finished,
            double progress,
            String progressMessage,
            OffsetDateTime queuedAt,
            OffsetDateTime startedAt,
            OffsetDateTime finishedAt,
            Double seconds,
            boolean hasResult,
            String failure,
            String viewToken,
            int particles,

            @Schema(description = "The outside localizer judged, by name; null for the built-in one", nullable = true)
            String localizer,

            @Schema(
                    description = "The run's verdict, as the result document's \"verdict\"; null while the"
                            + " run has no result, or for a run stored before verdicts were",
                    allowableValues = {"pass", "fail", "ended-early", "not-exercised", "incomplete"},
                    nullable = true)
            String verdict) {
        static RunBody of(RunRow r) {
            Double secs = r.startedAt()
                    .map(s -> Duration.between(s, r.finishedAt().orElse(OffsetDateTime.now()))
                                    .toMillis()
                            / 1000.0)
                    .orElse(null);
            return new RunBody(
                    r.id(),
                    r.batchKey(),
                    r.revisionNumber(),
                    r.variant(),
                    r.seedList(),
                    r.state(),
                    RunState.of(r.state()).map(RunState::finished).orElse(true),
                    r.progress(),
                    r.progressMessage(),
                    r.queuedAt(),
                    r.startedAt().orElse(null),
                    r.finishedAt().orElse(null),
                    secs,
                    r.hasResult(),
                    r.failure(),
                    r.viewToken(),
                    r.storedOptions().particles(),
                    r.storedOptions().localizer(),
                    r.verdict().map(Verdict::fileName).orElse(null));
        }
    }

    /**
     * A batch's runs.
     *
     * @param batch batch key
     * @param finished whether every run is over
     * @param runs the runs
     */
    record BatchBody(String batch, boolean finished, List<RunBody> runs) {}

    private final ShareLinks links;
    private final ScenarioStore store;
    private final RunQueue queue;
    private final RunBoard board;

    RunApi(ShareLinks links, ScenarioStore store, RunQueue queue, RunBoard board) {
        this.links = links;
        this.store = store;
        this.queue = queue;
        this.board = board;
    }

    @PostMapping("/api/s/{token}/batches")
    @Operation(
            summary = "Queue one run per variant over the same seeds, or a particle-count sweep of one variant",
            description = "All or none: 503 with Retry-After when the queue has no room for every run,"
                    + " 422 naming the field for an unknown variant or a bad seed list.")
    ResponseEntity<BatchBody> submit(@PathVariable String token, @RequestBody BatchRequest request) {
        Grant g = links.require(token);
        long revisionId = request.revision() == null
                ? store.view(g.scenarioId()).latest().id()
                : store.revision(g.scenarioId(), request.revision()).id();
        List<String> variants =
                request.variants() == null || request.variants().isEmpty() ? List.of("base") : request.variants();
        boolean frames = Boolean.TRUE.equals(request.recordFrames());
        RunQueue.Submitted s;
        if (request.particleCounts() != null) {
            s = queue.submitSweep(
                    g.scenarioId(),
                    revisionId,
                    variants,
                    request.particleCounts(),
                    seedsOf(request),
                    frames,
                    LocalizerAllowList.requestedName(request.localizer()));
        } else {
            s = queue.submit(
                    g.scenarioId(),
                    revisionId,
                    variants,
                    seedsOf(request),
                    new TrialOptions(frames, 0, LocalizerAllowList.requestedName(request.localizer())));
        }
        return ResponseEntity.status(HttpStatus.ACCEPTED).body(batchBody(g, s.batchKey()));
    }

    @GetMapping("/api/s/{token}/batches/{batch}")
    @Operation(summary = "A batch's runs and whether all are over")
    BatchBody batch(@PathVariable String token, @PathVariable String batch) {
        return batchBody(links.require(token), batch);
    }

    @GetMapping("/api/s/{token}/runs")
    @Operation(summary = "The latest 100 runs of the scenario, newest first")
    List<RunBody> runs(@PathVariable String token) {
        Grant g = links.require(token);
        return board.recent(g.scenarioId(), 100).stream().map(RunBody::of).toList();
    }

    @GetMapping("/api/s/{token}/runs/{id}")
    @Operation(summary = "A run's state, progress and timings")
    RunBody run(@PathVariable String token, @PathVariable long id) {
        Grant g = links.require(token);
        return RunBody.of(board.of(g.scenarioId(), id));
    }

    @PostMapping("/api/s/{token}/runs/{id}/cancel")
    @Operation(summary = "Cancel a queued or running run (edit link only); a finished run stays as it is")
    RunBody cancel(@PathVariable String token, @PathVariable long id) {
        // a view link is handed around widely; stopping someone's run needs the edit link
        Grant g = links.requireEdit(token);
        queue.cancel(board.of(g.scenarioId(), id).id());
        return RunBody.of(board.of(g.scenarioId(), id));
    }

    @PostMapping("/api/s/{token}/runs/{id}/rerun")
    @Operation(summary = "Queue a new run with the same revision, variant, seeds and options")
    ResponseEntity<RunBody> rerun(@PathVariable String token, @PathVariable long id) {
        Grant g = links.require(token);
        RunQueue.Submitted s = queue.rerun(board.of(g.scenarioId(), id).id());
        return ResponseEntity.status(HttpStatus.ACCEPTED)
                .body(RunBody.of(board.of(g.scenarioId(), s.runIds().get(0))));
    }

    @PostMapping("/api/s/{token}/runs/{id}/replay")
    @Operation(
            summary = "Queue one seed of a run again, alone and with frames for the player; the trial is"
                    + " the same one, since a trial is a pure function of revision, variant and seed")
    ResponseEntity<RunBody> replay(
            @PathVariable String token, @PathVariable long id, @RequestParam(required = false) String seed) {
        Grant g = links.require(token);
        RunQueue.Submitted s = queue.replaySeed(board.of(g.scenarioId(), id).id(), RunForm.seedOf(seed));
        return ResponseEntity.status(HttpStatus.ACCEPTED)
                .body(RunBody.of(board.of(g.scenarioId(), s.runIds().get(0))));
    }

    @GetMapping(value = "/api/s/{token}/runs/{id}/result", produces = MediaType.APPLICATION_JSON_VALUE)
    @Operation(summary = "The result document of a finished run; 404 until there is one")
    ResponseEntity<String> result(@PathVariable String token, @PathVariable long id) {
        Grant g = links.require(token);
        return resultOf(board.of(g.scenarioId(), id));
    }

    @GetMapping("/api/s/{token}/runs/{id}/frames")
    @Operation(summary = "Indexes of the stored frame chunks")
    List<Integer> chunks(@PathVariable String token, @PathVariable long id) {
        Grant g = links.require(token);
        return board.chunks(board.of(g.scenarioId(), id).id());
    }

    @GetMapping(value = "/api/s/{token}/runs/{id}/frames/{chunk}", produces = MediaType.APPLICATION_OCTET_STREAM_VALUE)
    @Operation(summary = "One frame chunk, as the recorder wrote it")
    byte[] chunk(@PathVariable String token, @PathVariable long id, @PathVariable int chunk) {
        Grant g = links.require(token);
        return board.chunk(board.of(g.scenarioId(), id).id(), chunk);
    }

    @GetMapping("/api/r/{runToken}")
    @Operation(summary = "A run through its own read-only link")
    RunBody sharedRun(@PathVariable String runToken) {
        return RunBody.of(board.byToken(runToken));
    }

    @GetMapping(value = "/api/r/{runToken}/result", produces = MediaType.APPLICATION_JSON_VALUE)
    @Operation(summary = "A run's result through its own read-only link")
    ResponseEntity<String> sharedResult(@PathVariable String runToken) {
        return resultOf(board.byToken(runToken));
    }

    @GetMapping(value = "/api/r/{runToken}/frames/{chunk}", produces = MediaType.APPLICATION_OCTET_STREAM_VALUE)
    @Operation(summary = "One frame chunk through the run's own read-only link")
    byte[] sharedChunk(@PathVariable String runToken, @PathVariable int chunk) {
        return board.chunk(board.byToken(runToken).id(), chunk);
    }

    private ResponseEntity<String> resultOf(RunRow r) {
        return board.result(r.id())
                .map(json -> ResponseEntity.ok()
                        .contentType(MediaType.APPLICATION_JSON)
                        .body(json))
                .orElseThrow(dev.driftlab.app.runs.RunNotFound::new);
    }

    private BatchBody batchBody(Grant g, String batch) {
        List<RunBody> runs =
                board.batch(g.scenarioId(), batch).stream().map(RunBody::of).toList();
        return new BatchBody(batch, runs.stream().allMatch(RunBody::finished), runs);
    }

    private static List<Long> seedsOf(BatchRequest r) {
        if (r.seeds() != null && !r.seeds().isEmpty()) {
            return r.seeds();
        }
        return RunQueue.consecutiveSeeds(
                r.firstSeed() == null ? 1 : r.firstSeed(), r.seedCount() == null ? 1 : r.seedCount());
    }
}
