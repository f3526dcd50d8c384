package dev.driftlab.app.runs;

import dev.driftlab.app.runs.persistence.RunRepository;
import dev.driftlab.app.runs.persistence.RunRepository.RunRow;
import dev.driftlab.app.sharing.ShareLinks;
import dev.driftlab.recording.Frame;
import dev.driftlab.recording.FrameChunk;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.springframework.stereotype.Service;
import org.springframework.transaction.annotation.Transactional;

/** Reads runs for pages and the API, always within the scenario (or run link) they belong to. */
@Service
@Transactional(readOnly = true)
public class RunBoard {

    private static final Pattern RUN_LINK = Pattern.compile("/r/([^/?#\\s]+)");

    private final RunRepository runs;
    private final ShareLinks links;

    public RunBoard(RunRepository runs, ShareLinks links) {
        this.runs = runs;
        this.links = links;
    }

    /** Whether a run's own link still opens it: closed when its scenario's view link was revoked after it was queued. */
    private boolean linkOpen(RunRow r) {
        return links.runLinksClosedBefore(r.scenarioId())
                .map(closed -> r.queuedAt().isAfter(closed))
                .orElse(true);
    }

    /** The latest runs of a scenario, newest first. */
    public List<RunRow> recent(long scenarioId, int limit) {
        return runs.forScenario(scenarioId, limit);
    }

    /** A run of this scenario, or {@link RunNotFound}. */
    public RunRow of(long scenarioId, long runId) {
        return runs.find(runId).filter(r -> r.scenarioId() == scenarioId).orElseThrow(RunNotFound::new);
    }

    /** The runs of one submission of this scenario. */
    public List<RunRow> batch(long scenarioId, String batchKey) {
        List<RunRow> rows = runs.forBatch(batchKey).stream()
                .filter(r -> r.scenarioId() == scenarioId)
                .toList();
        if (rows.isEmpty()) {
            throw new RunNotFound();
        }
        return rows;
    }

    /** A run by its own view-link token, or {@link RunNotFound}. */
    public RunRow byToken(String token) {
        if (!dev.driftlab.app.sharing.Tokens.wellFormed(token)) {
            throw new RunNotFound();
        }
        return runs.findByViewToken(token).filter(this::linkOpen).orElseThrow(RunNotFound::new);
    }

    /**
     * The run behind a pasted run link ({@code .../r/TOKEN...}) or a bare token, if there is one.
     * Holding a run's link is what gives access to it, so any such run may be shown beside another.
     */
    public Optional<RunRow> byLink(String link) {
        if (link == null) {
            return Optional.empty();
        }
        Matcher m = RUN_LINK.matcher(link.strip());
        String token = m.find() ? m.group(1) : link.strip();
        if (!dev.driftlab.app.sharing.Tokens.wellFormed(token)) {
            return Optional.empty();
        }
        return runs.findByViewToken(token).filter(this::linkOpen);
    }

    /** The result document of a finished run. */
    public Optional<String> result(long runId) {
        return runs.result(runId);
    }

    /** Indexes of the stored frame chunks. */
    public List<Integer> chunks(long runId) {
        return runs.chunkIndexes(runId);
    }

    /**
     * All recorded frames of a run, in order (empty when it recorded none).
     *
     * @throws IllegalArgumentException when a stored chunk does not read
     */
    public List<Frame> frames(long runId) {
        List<Frame> frames = new ArrayList<>();
        for (int c : chunks(runId)) {
            byte[] bytes = chunk(runId, c);
            int n = FrameChunk.frameCount(bytes);
            for (int i = 0; i < n; i++) {
                frames.add(FrameChunk.frame(bytes, i));
            }
        }
        return frames;
    }

    /** One frame chunk, or {@link RunNotFound}. */
    public byte[] chunk(long runId, int index) {
        return runs.chunk(runId, index).orElseThrow(RunNotFound::new);
    }
}
