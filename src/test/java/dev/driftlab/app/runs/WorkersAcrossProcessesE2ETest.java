package dev.driftlab.app.runs;

import static org.assertj.core.api.Assertions.assertThat;

import dev.driftlab.app.JarProcesses;
import java.io.IOException;
import java.net.http.HttpResponse;
import java.nio.file.Files;
import java.nio.file.Path;
import java.sql.Connection;
import java.sql.ResultSet;
import java.sql.SQLException;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.stream.LongStream;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;

/**
 * Runs spread over processes, as a team deploys them: one server that runs no units itself and two
 * worker processes started from the built jar, all on one PostgreSQL database. One worker is killed
 * with SIGKILL while it holds a unit; the other takes that unit over once the engine's heartbeat
 * timeout passes, every trial is stored exactly once, and the result equals the same batch run in
 * one process (apart from when it ran and how long it took).
 */
@Tag("e2e")
class WorkersAcrossProcessesE2ETest {

    private static final JsonMapper JSON = JsonMapper.builder().build();
    private static final String SAMPLE = "storage-hall-kidnap";

    private JarProcesses jar;
    private List<Process> processes = List.of();
    private Path logs;

    @AfterEach
    void stopAll() throws InterruptedException {
        if (jar != null) {
            jar.close();
        }
    }

    @Test
    void aWorkerKilledMidUnit_losesNothing_andTheResultIsTheOneProcessResult() throws Exception {
        // three processes run units: the server and two workers
        startServerAndTwoWorkers(true);
        Process first = processes.get(1);

        String document = Files.readString(Path.of("sample-projects/" + SAMPLE + ".json"));
        JsonNode created = JSON.readTree(post("/api/scenarios", document).body());
        String token = created.get("editToken").asString();
        List<Long> seeds = LongStream.rangeClosed(1, 10).boxed().toList();
        HttpResponse<String> submitted =
                post("/api/s/" + token + "/batches", "{\"variants\":[\"base\"],\"firstSeed\":1,\"seedCount\":10}");
        assertThat(submitted.statusCode()).as(submitted.body()).isEqualTo(202);
        long runId =
                JSON.readTree(submitted.body()).get("runs").get(0).get("id").asLong();

        // kill the first worker while it holds a unit whose trial it has not stored
        long firstPid = first.pid();
        int[] held = waitForUnitRunningOn(runId, firstPid);
        first.destroyForcibly();
        first.waitFor();
        long killedAt = System.nanoTime();

        JsonNode run = waitUntilFinished(token, runId, Duration.ofMinutes(4));
        assertThat(run.get("state").asString()).as(run.toString()).isEqualTo("done");
        double waitedSeconds = (System.nanoTime() - killedAt) / 1e9;

        try (Connection c = connect()) {
            // every seed stored once (the key is (run, seed)), none missing
            assertThat(longs(c, "SELECT seed FROM run_trial WHERE run_id = " + runId + " ORDER BY seed"))
                    .isEqualTo(seeds);
            // the unit the killed worker held was taken again, by a process that lived
            List<Long> attempts =
                    longs(c, "SELECT attempts FROM run_unit WHERE run_id = " + runId + " AND unit_no = " + held[0]);
            assertThat(attempts).containsExactly(2L);
            assertThat(strings(c, "SELECT worker FROM run_unit WHERE run_id = " + runId + " AND unit_no = " + held[0]))
                    .singleElement()
                    .asString()
                    .doesNotContain("/" + firstPid + "/");
            assertThat(longs(c, "SELECT COUNT(*) FROM scheduled_tasks")).containsExactly(0L);
        }
        assertThat(waitedSeconds).as("the batch finished after the kill").isLessThan(240);

        JsonNode served = JSON.readTree(
                get("/api/s/" + token + "/runs/" + runId + "/result").body());
        EngineTrialExecutor engine = new EngineTrialExecutor();
        EngineTrialExecutorTest.Recording ctx = new EngineTrialExecutorTest.Recording(2);
        TrialRequest request = new TrialRequest(document, "base", seeds, new TrialOptions(false));
        engine.runSeeds(request, seeds, ctx);
        String alone = engine.assemble(
                        request, seeds.stream().map(ctx.trials::get).toList())
                .resultJson();
        assertThat(withoutTimings(served)).isEqualTo(withoutTimings(JSON.readTree(alone)));
    }

    @Test
    void aCancelMadeOnTheServer_stopsUnitsRunningOnTheWorkers_withinTwoSeconds() throws Exception {
        // the server runs no units, so every unit that stops was stopped by a cancel it did not run
        startServerAndTwoWorkers(false);
        String document = Files.readString(Path.of("sample-projects/" + SAMPLE + ".json"));
        String token = JSON.readTree(post("/api/scenarios", document).body())
                .get("editToken")
                .asString();
        HttpResponse<String> submitted =
                post("/api/s/" + token + "/batches", "{\"variants\":[\"base\"],\"firstSeed\":1,\"seedCount\":40}");
        assertThat(submitted.statusCode()).as(submitted.body()).isEqualTo(202);
        long runId =
                JSON.readTree(submitted.body()).get("runs").get(0).get("id").asLong();
        waitForUnitRunningOn(runId, processes.get(1).pid());
        waitForUnitRunningOn(runId, processes.get(2).pid());

        HttpResponse<String> cancelled = post("/api/s/" + token + "/runs/" + runId + "/cancel", "");
        assertThat(cancelled.statusCode()).as(cancelled.body()).isLessThan(300);
        long at = System.nanoTime();
        try (Connection c = connect()) {
            String running = "SELECT COUNT(*) FROM run_unit WHERE run_id = " + runId + " AND state = 'running'";
            while (longs(c, running).get(0) > 0) {
                assertThat((System.nanoTime() - at) / 1e9)
                        .as("seconds until the workers stopped their units; logs in " + logs)
                        .isLessThan(2.0);
                Thread.sleep(50);
            }
            long trials = longs(c, "SELECT COUNT(*) FROM run_trial WHERE run_id = " + runId)
                    .get(0);
            assertThat(trials).isLessThan(40);
            assertThat(longs(
                            c,
                            "SELECT COUNT(*) FROM run_unit WHERE run_id = " + runId
                                    + " AND state NOT IN ('done', 'stopped')"))
                    .containsExactly(0L);
            Thread.sleep(3000);
            assertThat(longs(c, "SELECT COUNT(*) FROM run_trial WHERE run_id = " + runId))
                    .as("no trial stored after the cancel reached the workers")
                    .containsExactly(trials);
            assertThat(longs(c, "SELECT COUNT(*) FROM scheduled_tasks")).containsExactly(0L);
        }
        assertThat(JSON.readTree(get("/api/s/" + token + "/runs/" + runId).body())
                        .get("state")
                        .asString())
                .isEqualTo("cancelled");
    }

    @Test
    void aRunOfAnOutsideLocalizer_runsOnlyOnTheWorkerThatOffersIt_evenWhenTheServerHasNone() throws Exception {
        // the server and worker 2 run built-in units; only worker 1 lists the localizer
        String java = Path.of(System.getProperty("java.home"), "bin", "java").toString();
        startServerAndTwoWorkers(true, new String[] {
            "--driftlab.localizers.dead-reckoning.command='" + java + "' "
                    + Path.of("sample-projects/localizers/DeadReckoning.java").toAbsolutePath()
        });
        long offering = processes.get(1).pid();
        JsonNode offered = null;
        for (int i = 0; i < 100; i++) {
            offered = JSON.readTree(get("/api/localizers").body()).get("offered");
            if (offered.size() > 0) {
                break;
            }
            Thread.sleep(300);
        }
        assertThat(offered.toString())
                .as("advertised by worker 1; logs in " + logs)
                .isEqualTo("[\"dead-reckoning\"]");

        String document = Files.readString(Path.of("sample-projects/" + SAMPLE + ".json"));
        String token = JSON.readTree(post("/api/scenarios", document).body())
                .get("editToken")
                .asString();
        HttpResponse<String> submitted = post(
                "/api/s/" + token + "/batches",
                "{\"variants\":[\"base\"],\"firstSeed\":1,\"seedCount\":4,\"localizer\":\"dead-reckoning\"}");
        assertThat(submitted.statusCode()).as(submitted.body()).isEqualTo(202);
        long runId =
                JSON.readTree(submitted.body()).get("runs").get(0).get("id").asLong();
        // a built-in batch alongside, which any process may take
        HttpResponse<String> builtIn =
                post("/api/s/" + token + "/batches", "{\"variants\":[\"base\"],\"firstSeed\":1,\"seedCount\":4}");
        long builtInId =
                JSON.readTree(builtIn.body()).get("runs").get(0).get("id").asLong();

        JsonNode run = waitUntilFinished(token, runId, Duration.ofMinutes(4));
        assertThat(run.get("state").asString()).as(run + "; logs in " + logs).isEqualTo("done");
        assertThat(run.get("localizer").asString()).isEqualTo("dead-reckoning");
        waitUntilFinished(token, builtInId, Duration.ofMinutes(4));
        try (Connection c = connect()) {
            List<String> ranOn = strings(c, "SELECT worker FROM run_unit WHERE run_id = " + runId);
            assertThat(ranOn).hasSize(4).allSatisfy(w -> assertThat(w).contains("/" + offering + "/"));
            assertThat(longs(c, "SELECT COUNT(*) FROM run_trial WHERE run_id = " + runId))
                    .containsExactly(4L);
            assertThat(longs(c, "SELECT COUNT(*) FROM scheduled_tasks")).containsExactly(0L);
        }
        JsonNode result = JSON.readTree(
                get("/api/s/" + token + "/runs/" + runId + "/result").body());
        assertThat(result.get("localizer").get("name").asString()).isEqualTo("dead-reckoning");
    }

    /** One server (running units itself or not) and two single-threaded workers on a fresh database. */
    private void startServerAndTwoWorkers(boolean serverRunsUnits, String[]... workerArgs) throws Exception {
        jar = JarProcesses.onPostgres("workers");
        logs = jar.logs();
        // one-seed units, so every unit is a second or so of work
        jar.startServer(
                "--driftlab.runs.execute=" + serverRunsUnits,
                "--driftlab.runs.workers=1",
                "--driftlab.runs.unit-work=1");
        for (int i = 1; i <= 2; i++) {
            List<String> args = new ArrayList<>(List.of("--threads", "1"));
            if (workerArgs.length >= i) {
                args.addAll(List.of(workerArgs[i - 1]));
            }
            jar.startWorker("worker-" + i, args.toArray(String[]::new));
        }
        processes = jar.processes();
    }

    /** The number of a unit running on the process with this pid, its trial not yet stored. */
    private int[] waitForUnitRunningOn(long runId, long pid) throws Exception {
        long deadline = System.nanoTime() + Duration.ofMinutes(3).toNanos();
        try (Connection c = connect()) {
            while (System.nanoTime() < deadline) {
                try (var s = c.prepareStatement("SELECT u.unit_no FROM run_unit u WHERE u.run_id = ?"
                        + " AND u.state = 'running' AND u.worker LIKE ?"
                        // seeds are 1..n, so the unit's one seed is its position + 1
                        + " AND NOT EXISTS (SELECT 1 FROM run_trial t WHERE t.run_id = u.run_id"
                        + " AND t.seed = u.first_index + 1)")) {
                    s.setLong(1, runId);
                    s.setString(2, "%/" + pid + "/%");
                    try (ResultSet rs = s.executeQuery()) {
                        if (rs.next()) {
                            return new int[] {rs.getInt(1)};
                        }
                    }
                }
                Thread.sleep(50);
            }
        }
        throw new AssertionError("no unit ran on the first worker within 3 minutes; logs in " + logs);
    }

    private JsonNode waitUntilFinished(String token, long runId, Duration limit) throws Exception {
        long deadline = System.nanoTime() + limit.toNanos();
        while (true) {
            JsonNode run =
                    JSON.readTree(get("/api/s/" + token + "/runs/" + runId).body());
            if (run.get("finished").asBoolean()) {
                return run;
            }
            assertThat(System.nanoTime())
                    .as("run finished; last state " + run + ", logs in " + logs)
                    .isLessThan(deadline);
            Thread.sleep(500);
        }
    }

    private Connection connect() throws SQLException {
        return jar.connect();
    }

    private static List<Long> longs(Connection c, String sql) throws SQLException {
        return JarProcesses.longs(c, sql);
    }

    private static List<String> strings(Connection c, String sql) throws SQLException {
        return JarProcesses.strings(c, sql);
    }

    /** The result without when it ran, how long it took and the machine's answer times. */
    private static JsonNode withoutTimings(JsonNode result) {
        return dev.driftlab.report.ResultDocs.withoutTimings(result);
    }

    private HttpResponse<String> get(String path) throws IOException, InterruptedException {
        return jar.get(path);
    }

    private HttpResponse<String> post(String path, String body) throws IOException, InterruptedException {
        return jar.post(path, body);
    }
}
