package dev.driftlab.app.runs;

import dev.driftlab.app.runs.persistence.RunRepository;
import dev.driftlab.app.runs.persistence.RunRepository.RunRow;
import dev.driftlab.app.runs.persistence.UnitRepository;
import dev.driftlab.app.sharing.ShareLinks;
import dev.driftlab.evaluation.TrialOutcome;
import dev.driftlab.recording.Frame;
import dev.driftlab.recording.FrameChunk;
import dev.driftlab.trial.TrialRecords;
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
    private final UnitRepository units;

    public RunBoard(RunRepository runs, ShareLinks links, UnitRepository units) {
        this.runs = runs;
        this.links = links;
        this.units = units;
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

    /**
     * Every trial of a run exactly as it ended, in the order of the run's seeds, read from the
     * lossless trial records its units stored ({@link TrialRecords}); empty when the run has not
     * stored all of them in that form (still going, queued by a version before units, or run by
     * an executor that stores its own records). The result document rounds its figures, so
     * summaries made again from these equal the ones made where the trials ran.
     */
    public Optional<List<TrialOutcome>> exactTrials(RunRow run) {
        List<Long> seeds = run.seedList();
        List<UnitRepository.TrialRow> rows = units.trials(run.id());
        if (rows.size() != seeds.size()) {
            return Optional.empty();
        }
        java.util.Map<Long, TrialOutcome> bySeed = new java.util.HashMap<>();
        try {
            for (UnitRepository.TrialRow t : rows) {
                bySeed.put(t.seed(), TrialRecords.readOutcome(t.outcome()));
            }
        } catch (IllegalArgumentException notARecord) {
            return Optional.empty();
        }
        List<TrialOutcome> ordered = new ArrayList<>(seeds.size());
        for (long seed : seeds) {
            TrialOutcome t = bySeed.get(seed);
            if (t == null) {
                return Optional.empty();
            }
            ordered.add(t);
        }
        return Optional.of(ordered);
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
