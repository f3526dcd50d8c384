package dev.driftlab.app.player.web;

import dev.driftlab.app.player.PlayerRenders;
import dev.driftlab.app.player.SceneJson;
import dev.driftlab.app.runs.RunBoard;
import dev.driftlab.app.runs.RunScenario;
import dev.driftlab.app.runs.RunState;
import dev.driftlab.app.runs.persistence.RunRepository.RunRow;
import dev.driftlab.app.scenarios.ScenarioStore;
import dev.driftlab.app.sharing.Grant;
import dev.driftlab.app.sharing.ShareLinks;
import dev.driftlab.recording.FrameChunk;
import dev.driftlab.scenario.Scenario;
import io.swagger.v3.oas.annotations.Operation;
import io.swagger.v3.oas.annotations.media.Content;
import io.swagger.v3.oas.annotations.media.Schema;
import io.swagger.v3.oas.annotations.responses.ApiResponse;
import io.swagger.v3.oas.annotations.tags.Tag;
import java.util.List;
import java.util.Locale;
import java.util.Optional;
import org.springframework.beans.factory.annotation.Value;
import org.springframework.http.HttpStatus;
import org.springframework.http.MediaType;
import org.springframework.http.ProblemDetail;
import org.springframework.http.ResponseEntity;
import org.springframework.web.bind.annotation.ExceptionHandler;
import org.springframework.web.bind.annotation.GetMapping;
import org.springframework.web.bind.annotation.PathVariable;
import org.springframework.web.bind.annotation.RestController;
import tools.jackson.databind.node.ObjectNode;

/**
 * The player's data: a run's scene and its frames decoded from the stored chunks, through the
 * scenario's link or the run's own link. Each answer is sized before it is built and built under
 * {@link PlayerRenders}' bound; those of finished runs are kept.
 */
@RestController
@Tag(name = "Player", description = "A run's scene and decoded frames for the run player")
class PlayerApi {

    private final ShareLinks links;
    private final ScenarioStore store;
    private final RunBoard board;
    private final PlayerRenders renders;

    PlayerApi(
            ShareLinks links,
            ScenarioStore store,
            RunBoard board,
            @Value("${driftlab.player.concurrent-builds:4}") int concurrentBuilds,
            @Value("${driftlab.player.cache-bytes:67108864}") long cacheBytes,
            @Value("${driftlab.player.max-answer-bytes:33554432}") long maxAnswerBytes) {
        this.links = links;
        this.store = store;
        this.board = board;
        this.renders = new PlayerRenders(concurrentBuilds, cacheBytes, maxAnswerBytes);
    }

    /** The bounds of this controller's answers, so a test can occupy them. */
    PlayerRenders renders() {
        return renders;
    }

    @GetMapping("/api/s/{token}/runs/{id}/scene")
    @Operation(summary = "Site plan, map differences, beam angles, faults, episodes and series of a run")
    @ApiResponse(responseCode = "200", content = @Content(schema = @Schema(type = "object")))
    ResponseEntity<byte[]> scene(@PathVariable String token, @PathVariable long id) {
        Grant g = links.require(token);
        return sceneOf(board.of(g.scenarioId(), id));
    }

    @GetMapping("/api/s/{token}/runs/{id}/frames/{chunk}/json")
    @Operation(summary = "The frames of one stored chunk as JSON")
    @ApiResponse(responseCode = "200", content = @Content(schema = @Schema(type = "object")))
    ResponseEntity<byte[]> frames(@PathVariable String token, @PathVariable long id, @PathVariable int chunk) {
        Grant g = links.require(token);
        return framesOf(board.of(g.scenarioId(), id), chunk);
    }

    @GetMapping("/api/r/{runToken}/scene")
    @Operation(summary = "A run's scene through the run's own read-only link")
    @ApiResponse(responseCode = "200", content = @Content(schema = @Schema(type = "object")))
    ResponseEntity<byte[]> sharedScene(@PathVariable String runToken) {
        return sceneOf(board.byToken(runToken));
    }

    @GetMapping("/api/r/{runToken}/frames/{chunk}/json")
    @Operation(summary = "The frames of one chunk through the run's own read-only link")
    @ApiResponse(responseCode = "200", content = @Content(schema = @Schema(type = "object")))
    ResponseEntity<byte[]> sharedFrames(@PathVariable String runToken, @PathVariable int chunk) {
        return framesOf(board.byToken(runToken), chunk);
    }

    private ResponseEntity<byte[]> sceneOf(RunRow run) {
        return json(renders.scene(run.id(), RunState.settled(run.state()), () -> buildScene(run)));
    }

    private byte[] buildScene(RunRow run) {
        Scenario scenario = RunScenario.of(store, run);
        String result = board.result(run.id()).orElse("");
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
        renders.checkBudget(
                "The scene of this run",
                SceneJson.sceneBytes(scenario, result.length(), frames),
                String.join(
                        ", ",
                        count(scenario.site().rooms().size(), "room"),
                        count(scenario.site().doors().size(), "door"),
                        "a result document of " + count(result.length(), "character"),
                        count(frames, "frame")),
                "A site with fewer rooms, or fewer frames recorded, would fit.");
        ObjectNode o = SceneJson.scene(scenario, result, chunks);
        o.put("run", run.id());
        o.put("revision", run.revisionNumber());
        o.put("state", run.state());
        o.put("runVariant", run.variant());
        o.put("frameCount", frames);
        o.put("framesPerChunk", perChunk);
        if (!o.has("series") && frames > 0 && frames <= SceneJson.MAX_SERIES_FRAMES) {
            seriesFromFrames(run, chunks).ifPresent(s -> o.set("series", s));
        }
        return SceneJson.bytes(o);
    }

    /** Series for plots when the result has none, read a chunk at a time. */
    private Optional<ObjectNode> seriesFromFrames(RunRow run, List<Integer> chunks) {
        try {
            return Optional.of(SceneJson.series(
                    () -> chunks.stream().map(c -> board.chunk(run.id(), c)).iterator()));
        } catch (IllegalArgumentException e) {
            // a damaged chunk leaves the player without plots rather than without a scene
            return Optional.empty();
        }
    }

    private ResponseEntity<byte[]> framesOf(RunRow run, int chunk) {
        return json(renders.frames(run.id(), chunk, RunState.settled(run.state()), () -> buildFrames(run, chunk)));
    }

    private byte[] buildFrames(RunRow run, int chunk) {
        byte[] bytes = board.chunk(run.id(), chunk);
        SceneJson.ChunkSize size;
        ObjectNode o;
        try {
            size = SceneJson.chunkSize(bytes);
        } catch (IllegalArgumentException e) {
            throw new UnreadableChunk(chunk);
        }
        renders.checkBudget(
                "Frame chunk " + chunk + " of this run",
                size.bytes(),
                count(size.frames(), "frame") + " with " + count(size.particles(), "particle state") + " in all",
                "A run recorded with fewer particles would fit.");
        try {
            o = SceneJson.chunk(bytes);
        } catch (IllegalArgumentException e) {
            throw new UnreadableChunk(chunk);
        }
        return SceneJson.bytes(o);
    }

    /** A stored chunk that does not decode. */
    private static final class UnreadableChunk extends RuntimeException {
        UnreadableChunk(int chunk) {
            super("Frame chunk " + chunk + " of this run could not be read.");
        }
    }

    @ExceptionHandler(UnreadableChunk.class)
    ResponseEntity<ProblemDetail> unreadable(UnreadableChunk e) {
        return problem(e.getMessage());
    }

    /** An answer over the size budget: nothing was built, and asking again will not help. */
    @ExceptionHandler(PlayerRenders.TooLarge.class)
    ResponseEntity<ProblemDetail> tooLarge(PlayerRenders.TooLarge e) {
        return problem(e.getMessage());
    }

    private static ResponseEntity<ProblemDetail> problem(String message) {
        return ResponseEntity.status(HttpStatus.UNPROCESSABLE_CONTENT)
                .body(ProblemDetail.forStatusAndDetail(HttpStatus.UNPROCESSABLE_CONTENT, message));
    }

    private static String count(long n, String noun) {
        return String.format(Locale.ROOT, "%,d %s%s", n, noun, n == 1 ? "" : "s");
    }

    private static ResponseEntity<byte[]> json(byte[] body) {
        return ResponseEntity.ok().contentType(MediaType.APPLICATION_JSON).body(body);
    }
}
