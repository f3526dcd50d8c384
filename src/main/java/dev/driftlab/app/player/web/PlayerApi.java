package dev.driftlab.app.player.web;

import dev.driftlab.app.player.SceneJson;
import dev.driftlab.app.runs.RunBoard;
import dev.driftlab.app.runs.RunScenario;
import dev.driftlab.app.runs.persistence.RunRepository.RunRow;
import dev.driftlab.app.scenarios.ScenarioStore;
import dev.driftlab.app.sharing.Grant;
import dev.driftlab.app.sharing.ShareLinks;
import dev.driftlab.recording.Frame;
import dev.driftlab.recording.FrameChunk;
import io.swagger.v3.oas.annotations.Operation;
import io.swagger.v3.oas.annotations.tags.Tag;
import java.util.List;
import java.util.Optional;
import org.springframework.http.HttpStatus;
import org.springframework.http.ProblemDetail;
import org.springframework.http.ResponseEntity;
import org.springframework.web.bind.annotation.GetMapping;
import org.springframework.web.bind.annotation.PathVariable;
import org.springframework.web.bind.annotation.RestController;
import tools.jackson.databind.node.ObjectNode;

/**
 * The player's data: a run's scene and its frames decoded from the stored chunks, through the
 * scenario's link or the run's own link.
 */
@RestController
@Tag(name = "Player", description = "A run's scene and decoded frames for the run player")
class PlayerApi {

    private final ShareLinks links;
    private final ScenarioStore store;
    private final RunBoard board;

    PlayerApi(ShareLinks links, ScenarioStore store, RunBoard board) {
        this.links = links;
        this.store = store;
        this.board = board;
    }

    @GetMapping("/api/s/{token}/runs/{id}/scene")
    @Operation(summary = "Site plan, map differences, beam angles, faults, episodes and series of a run")
    ObjectNode scene(@PathVariable String token, @PathVariable long id) {
        Grant g = links.require(token);
        return sceneOf(board.of(g.scenarioId(), id));
    }

    @GetMapping("/api/s/{token}/runs/{id}/frames/{chunk}/json")
    @Operation(summary = "The frames of one stored chunk as JSON")
    ResponseEntity<Object> frames(@PathVariable String token, @PathVariable long id, @PathVariable int chunk) {
        Grant g = links.require(token);
        return framesOf(board.of(g.scenarioId(), id), chunk);
    }

    @GetMapping("/api/r/{runToken}/scene")
    @Operation(summary = "A run's scene through the run's own read-only link")
    ObjectNode sharedScene(@PathVariable String runToken) {
        return sceneOf(board.byToken(runToken));
    }

    @GetMapping("/api/r/{runToken}/frames/{chunk}/json")
    @Operation(summary = "The frames of one chunk through the run's own read-only link")
    ResponseEntity<Object> sharedFrames(@PathVariable String runToken, @PathVariable int chunk) {
        return framesOf(board.byToken(runToken), chunk);
    }

    private ObjectNode sceneOf(RunRow run) {
        ObjectNode o = SceneJson.scene(
                RunScenario.of(store, run), board.result(run.id()).orElse(""), board.chunks(run.id()));
        o.put("run", run.id());
        o.put("revision", run.revisionNumber());
        o.put("state", run.state());
        o.put("runVariant", run.variant());
        List<Integer> chunks = board.chunks(run.id());
        int frames = 0;
        int perChunk = 0;
        try {
            if (!chunks.isEmpty()) {
                byte[] first = board.chunk(run.id(), chunks.get(0));
                byte[] last = board.chunk(run.id(), chunks.get(chunks.size() - 1));
                perChunk = FrameChunk.frameCount(first);
                frames = FrameChunk.firstFrame(last) + FrameChunk.frameCount(last);
            }
        } catch (IllegalArgumentException e) {
            // unreadable chunks: the scene still shows the site, with no frames to play
            frames = 0;
        }
        o.put("frameCount", frames);
        o.put("framesPerChunk", perChunk);
        if (!o.has("series") && frames > 0 && frames <= MAX_SERIES_FRAMES) {
            seriesFromFrames(run, chunks).ifPresent(s -> o.set("series", s));
        }
        return o;
    }

    /** Frames decoded for plots when the result has no series: about 10 minutes at 10 Hz. */
    private static final int MAX_SERIES_FRAMES = 6000;

    private Optional<ObjectNode> seriesFromFrames(RunRow run, List<Integer> chunks) {
        List<Frame> all;
        try {
            all = board.frames(run.id());
        } catch (IllegalArgumentException e) {
            // a damaged chunk leaves the player without plots rather than without a scene
            return Optional.empty();
        }
        return Optional.of(SceneJson.series(all));
    }

    private ResponseEntity<Object> framesOf(RunRow run, int chunk) {
        byte[] bytes = board.chunk(run.id(), chunk);
        try {
            return ResponseEntity.ok(SceneJson.chunk(bytes));
        } catch (IllegalArgumentException e) {
            return ResponseEntity.status(HttpStatus.UNPROCESSABLE_CONTENT)
                    .body(ProblemDetail.forStatusAndDetail(
                            HttpStatus.UNPROCESSABLE_CONTENT,
                            "Frame chunk " + chunk + " of this run could not be read."));
        }
    }
}
