package dev.driftlab.app.runs.web;

import dev.driftlab.app.runs.WorkerBoard;
import io.swagger.v3.oas.annotations.Operation;
import io.swagger.v3.oas.annotations.media.Schema;
import io.swagger.v3.oas.annotations.tags.Tag;
import java.time.OffsetDateTime;
import java.util.List;
import org.springframework.http.MediaType;
import org.springframework.web.bind.annotation.GetMapping;
import org.springframework.web.bind.annotation.RestController;

/** The workers page's figures as JSON, for monitoring scripts. */
@RestController
@Tag(name = "Workers", description = "The processes that run work units, what each runs, the queue and throughput")
class WorkersApi {

    /**
     * A unit a process runs now.
     *
     * @param run the run's number
     * @param unit the unit's number within the run, from 1
     * @param progress done share of the unit's seeds, 0..1
     * @param scenario the run's scenario name, or null where the server does not list scenarios
     * @param runPath path of the run's page through the scenario's view link, or null where the
     *     server does not list scenarios or the scenario has no view link
     */
    record UnitBody(long run, int unit, double progress, String scenario, String runPath) {}

    /**
     * One process.
     *
     * @param name its engine name
     * @param host host name
     * @param role server or worker
     * @param threads unit threads
     * @param startedAt when it started
     * @param lastSeen its last heartbeat
     * @param secondsSinceSeen whole seconds since its last heartbeat
     * @param state alive, stopped or lost
     * @param unitsDone units it finished
     * @param trialsDone trials it finished
     * @param running units it runs now
     * @param localizers outside localizers it offers, by name
     */
    record WorkerBody(
            String name,
            String host,
            String role,
            int threads,
            OffsetDateTime startedAt,
            OffsetDateTime lastSeen,
            long secondsSinceSeen,

            @Schema(allowableValues = {"alive", "stopped", "lost"})
            String state,

            long unitsDone,
            long trialsDone,
            List<UnitBody> running,
            List<String> localizers) {}

    /**
     * The whole picture.
     *
     * @param at when it was taken
     * @param alive processes alive
     * @param aliveThreads unit threads of the processes alive
     * @param unitsRunning units running on processes alive
     * @param unitsWaiting units waiting for a process
     * @param trialsLastMinute trials finished in the last minute
     * @param trialsLastTenMinutes trials finished in the last ten minutes
     * @param trialsPerMinute trials per minute over the last ten minutes
     * @param lostAfterSeconds silence after which a process counts as lost
     * @param scenariosShown whether scenario names and run paths are given
     * @param moreWorkers whether more processes were seen in the last hour than are listed
     * @param workers processes seen in the last hour, alive first
     */
    record WorkersBody(
            OffsetDateTime at,
            long alive,
            long aliveThreads,
            long unitsRunning,
            long unitsWaiting,
            long trialsLastMinute,
            long trialsLastTenMinutes,
            double trialsPerMinute,
            long lostAfterSeconds,
            boolean scenariosShown,
            boolean moreWorkers,
            List<WorkerBody> workers) {}

    private final WorkerBoard board;

    WorkersApi(WorkerBoard board) {
        this.board = board;
    }

    @GetMapping(value = "/api/workers", produces = MediaType.APPLICATION_JSON_VALUE)
    @Operation(summary = "The processes that run units, what each runs now, units waiting and trials per minute")
    WorkersBody workers() {
        WorkerBoard.Snapshot s = board.snapshot();
        List<WorkerBody> workers = s.workers().stream()
                .map(w -> new WorkerBody(
                        w.name(),
                        w.host(),
                        w.role(),
                        w.threads(),
                        w.startedAt(),
                        w.lastSeen(),
                        w.secondsSinceSeen(),
                        w.state().word(),
                        w.unitsDone(),
                        w.trialsDone(),
                        w.running().stream()
                                .map(u -> new UnitBody(
                                        u.runId(),
                                        u.unit(),
                                        u.progress(),
                                        u.scenarioName().orElse(null),
                                        u.runPath().orElse(null)))
                                .toList(),
                        w.localizers()))
                .toList();
        return new WorkersBody(
                s.at(),
                s.alive(),
                s.aliveThreads(),
                s.unitsRunning(),
                s.unitsWaiting(),
                s.trialsLastMinute(),
                s.trialsLastTenMinutes(),
                s.trialsPerMinute(),
                WorkerBoard.LOST_AFTER.toSeconds(),
                s.scenariosShown(),
                s.moreWorkers(),
                workers);
    }

    /**
     * What a run may name as its localizer.
     *
     * @param builtIn the built-in localizer's name in results ("built-in"); a run that names no
     *     localizer judges it
     * @param offered outside localizers some process alive now offers, by name
     */
    record LocalizersBody(String builtIn, List<String> offered) {}

    @GetMapping(value = "/api/localizers", produces = MediaType.APPLICATION_JSON_VALUE)
    @Operation(
            summary = "The outside localizers a run may name",
            description = "Names from the allow-lists (driftlab.localizers) of the processes alive now. A batch"
                    + " request's \"localizer\" must be one of them; a command is never accepted.")
    LocalizersBody localizers() {
        return new LocalizersBody(dev.driftlab.report.Report.BUILT_IN, board.offeredLocalizers());
    }
}
