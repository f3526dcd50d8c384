package dev.driftlab.app.runs;

import static org.assertj.core.api.Assertions.assertThat;

import dev.driftlab.app.Polling;
import dev.driftlab.cli.Cli;
import dev.driftlab.report.ResultDocs;
import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.time.OffsetDateTime;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.test.web.server.LocalServerPort;
import org.springframework.jdbc.core.simple.JdbcClient;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;
import tools.jackson.databind.node.ObjectNode;

/**
 * An outside localizer on a shared server: the administrator lists it by name in the properties,
 * this process advertises it, a batch names it and is judged exactly as the command line judges
 * the same program; names not listed, and anything that looks like a command, are refused with
 * nothing stored; and a unit of a localizer only another process offers is left to that process.
 */
@SpringBootTest(
        webEnvironment = SpringBootTest.WebEnvironment.RANDOM_PORT,
        properties = {
            "driftlab.runs.workers=2",
            "driftlab.localizers.dead-reckoning.command='" + OutsideLocalizerServerTest.JAVA_PLACEHOLDER
                    + "' sample-projects/localizers/DeadReckoning.java",
            "driftlab.localizers.dead-reckoning.answer-limit=5s",
            "driftlab.localizers.dead-reckoning.description=odometry only"
        })
class OutsideLocalizerServerTest {

    /** Resolved by {@code java.home} in the properties: the JVM running the tests. */
    static final String JAVA_PLACEHOLDER = "${java.home}/bin/java";

    private static final JsonMapper JSON = JsonMapper.builder().build();
    private static final HttpClient HTTP =
            HttpClient.newBuilder().connectTimeout(Duration.ofSeconds(5)).build();

    @LocalServerPort
    int port;

    @Autowired
    JdbcClient jdbc;

    private String base() {
        return "http://localhost:" + port;
    }

    private HttpResponse<String> send(String method, String path, String body) throws Exception {
        HttpRequest.Builder b =
                HttpRequest.newBuilder(URI.create(base() + path)).header("Content-Type", "application/json");
        b = body == null
                ? b.method(method, HttpRequest.BodyPublishers.noBody())
                : b.method(method, HttpRequest.BodyPublishers.ofString(body));
        return HTTP.send(b.build(), HttpResponse.BodyHandlers.ofString());
    }

    private JsonNode ok(String method, String path, String body) throws Exception {
        HttpResponse<String> r = send(method, path, body);
        assertThat(r.statusCode()).as(path + " answered " + r.body()).isBetween(200, 299);
        return JSON.readTree(r.body());
    }

    private String copyOfKidnapSample() throws Exception {
        return ok("POST", "/api/samples/storage-hall-kidnap.json/copy", "")
                .get("editToken")
                .asString();
    }

    private JsonNode waitForBatch(String edit, String batch) throws Exception {
        JsonNode[] last = new JsonNode[1];
        Polling.until("the batch to finish", Duration.ofMinutes(5), () -> {
            last[0] = ok("GET", "/api/s/" + edit + "/batches/" + batch, null);
            return last[0].get("finished").asBoolean();
        });
        return last[0];
    }

    private long runCount() {
        return jdbc.sql("SELECT COUNT(*) FROM run").query(Long.class).single();
    }

    @Test
    void thisProcess_advertisesItsListedLocalizers_byNameOnly() throws Exception {
        JsonNode offered = ok("GET", "/api/localizers", null);
        assertThat(offered.get("builtIn").asString()).isEqualTo("built-in");
        assertThat(offered.get("offered").toString()).isEqualTo("[\"dead-reckoning\"]");
        JsonNode workers = ok("GET", "/api/workers", null);
        assertThat(workers.get("workers").get(0).get("localizers").toString()).isEqualTo("[\"dead-reckoning\"]");
        // the command stays on the server: neither answer names the program
        assertThat(offered.toString() + workers).doesNotContain("DeadReckoning.java");
    }

    @Test
    void batchNamingTheListedLocalizer_isJudgedAsTheCommandLineJudgesTheSameProgram(@TempDir Path dir)
            throws Exception {
        String edit = copyOfKidnapSample();
        JsonNode submitted = ok(
                "POST",
                "/api/s/" + edit + "/batches",
                "{\"variants\":[\"base\",\"no injection\"],\"seeds\":[1,2],\"localizer\":\"dead-reckoning\"}");
        JsonNode batch = waitForBatch(edit, submitted.get("batch").asString());
        for (JsonNode r : batch.get("runs")) {
            assertThat(r.get("state").asString()).as(r.toString()).isEqualTo("done");
            assertThat(r.get("localizer").asString()).isEqualTo("dead-reckoning");
        }
        JsonNode run = batch.get("runs").get(0);
        String runToken = run.get("viewToken").asString();
        JsonNode server = ok("GET", "/api/r/" + runToken + "/batch-result", null);

        // the same program, scenario, variants and seeds from the command line
        ByteArrayOutputStream err = new ByteArrayOutputStream();
        Path sample = Files.writeString(
                dir.resolve("kidnap.json"),
                send("GET", "/api/s/" + edit + "/export", null).body());
        int status = Cli.run(
                new String[] {
                    "batch",
                    sample.toString(),
                    "--seeds",
                    "2",
                    "--quiet",
                    "--out",
                    dir.resolve("out").toString(),
                    "--localizer",
                    "'" + Path.of(System.getProperty("java.home"), "bin", "java")
                            + "' sample-projects/localizers/DeadReckoning.java"
                },
                new PrintStream(new ByteArrayOutputStream(), true, StandardCharsets.UTF_8),
                new PrintStream(err, true, StandardCharsets.UTF_8));
        assertThat(status).as(err.toString(StandardCharsets.UTF_8)).isEqualTo(Cli.FAILED);
        JsonNode local = JSON.readTree(dir.resolve("out/result.json").toFile());

        // dead reckoning cannot notice a kidnap: both fail the recovery gate, on the same trials
        assertThat(server.get("verdict").asString()).isEqualTo("fail");
        assertThat(comparable(server)).isEqualTo(comparable(local));
        assertThat(server.get("localizer").get("name").asString()).isEqualTo("dead-reckoning");
        assertThat(server.get("localizer").get("timedTrials").asInt()).isEqualTo(4);
    }

    /** The trials and gates of a result document, without timings and the names of source and localizer. */
    private static List<JsonNode> comparable(JsonNode doc) {
        JsonNode plain = ResultDocs.withoutTimings(doc);
        List<JsonNode> out = new ArrayList<>();
        for (JsonNode t : plain.get("trials")) {
            out.add(t);
        }
        for (JsonNode g : plain.get("gates")) {
            out.add(g);
        }
        ObjectNode l = (ObjectNode) plain.get("localizer").deepCopy();
        l.remove("name");
        out.add(l);
        return out;
    }

    @Test
    void suiteRunNamingTheListedLocalizer_judgesItInEveryCell_andUnlistedNamesAreRefused() throws Exception {
        String edit = copyOfKidnapSample();
        JsonNode suite = ok(
                "POST",
                "/api/suites",
                "{\"name\": \"Outside\", \"seeds\": 1, \"scenarios\": [{\"link\": \"" + edit + "\"}]}");
        String link = suite.get("viewLink").asString();
        long suiteRunsBefore =
                jdbc.sql("SELECT COUNT(*) FROM suite_run").query(Long.class).single();
        HttpResponse<String> refused = send("POST", "/api/suites/" + link + "/runs", "{\"localizer\": \"nope\"}");
        assertThat(refused.statusCode()).isEqualTo(422);
        assertThat(refused.body()).contains("localizer").contains("dead-reckoning");
        assertThat(jdbc.sql("SELECT COUNT(*) FROM suite_run").query(Long.class).single())
                .isEqualTo(suiteRunsBefore);

        JsonNode started = ok("POST", "/api/suites/" + link + "/runs", "{\"localizer\": \"dead-reckoning\"}");
        assertThat(started.get("localizer").asString()).isEqualTo("dead-reckoning");
        String runLink = started.get("link").asString();
        Polling.until(
                "the suite run to finish",
                Duration.ofMinutes(5),
                () -> ok("GET", "/api/suite-runs/" + runLink, null)
                        .get("state")
                        .asString()
                        .equals("finished"));
        JsonNode result = JSON.readTree(
                send("GET", "/suite-runs/" + runLink + "/result.json", null).body());
        assertThat(result.get("localizer").asString()).isEqualTo("dead-reckoning");
        // dead reckoning cannot notice the kidnap
        assertThat(result.get("verdict").asString()).isEqualTo("fail");
        // every cell ran as an ordinary run of that localizer
        for (JsonNode cell : ok("GET", "/api/suite-runs/" + runLink, null).get("cells")) {
            JsonNode run = ok("GET", "/api/r/" + cell.get("runLink").asString(), null);
            assertThat(run.get("localizer").asString()).isEqualTo("dead-reckoning");
        }
    }

    private int cli(ByteArrayOutputStream err, String... args) {
        return Cli.run(
                args,
                new PrintStream(new ByteArrayOutputStream(), true, StandardCharsets.UTF_8),
                new PrintStream(err, true, StandardCharsets.UTF_8));
    }

    @Test
    void fromCi_submitAndSuiteNameTheServersLocalizer_andAnUnlistedNameIsBadInput(@TempDir Path dir) throws Exception {
        Path sample = Path.of("sample-projects/storage-hall-kidnap.json");
        ByteArrayOutputStream err = new ByteArrayOutputStream();
        int status = cli(
                err,
                "submit",
                sample.toString(),
                "--server",
                base(),
                "--seeds",
                "1",
                "--quiet",
                "--out",
                dir.resolve("batch").toString(),
                "--server-localizer",
                "dead-reckoning");
        // dead reckoning fails the kidnap case: exit 1, judged by the listed localizer
        assertThat(status).as(err.toString(StandardCharsets.UTF_8)).isEqualTo(Cli.FAILED);
        JsonNode batch = JSON.readTree(dir.resolve("batch/result.json").toFile());
        assertThat(batch.get("localizer").get("name").asString()).isEqualTo("dead-reckoning");

        Path suiteFile = Files.writeString(
                dir.resolve("kidnap.suite.json"),
                "{\"format\": \"driftlab-suite/1\", \"name\": \"Kidnap only\", \"seeds\": 1, \"scenarios\": [{\"file\": \""
                        + sample.toAbsolutePath().toString().replace("\\", "/") + "\"}]}");
        err.reset();
        status = cli(
                err,
                "suite",
                suiteFile.toString(),
                "--server",
                base(),
                "--quiet",
                "--out",
                dir.resolve("suite").toString(),
                "--server-localizer",
                "dead-reckoning");
        assertThat(status).as(err.toString(StandardCharsets.UTF_8)).isEqualTo(Cli.FAILED);
        JsonNode suite = JSON.readTree(dir.resolve("suite/result.json").toFile());
        assertThat(suite.get("localizer").asString()).isEqualTo("dead-reckoning");

        long before = runCount();
        err.reset();
        status = cli(
                err,
                "submit",
                sample.toString(),
                "--server",
                base(),
                "--seeds",
                "1",
                "--quiet",
                "--out",
                dir.resolve("refused").toString(),
                "--server-localizer",
                "not-listed");
        assertThat(status).isEqualTo(Cli.BAD_INPUT);
        assertThat(err.toString(StandardCharsets.UTF_8)).contains("localizer").contains("dead-reckoning");
        assertThat(runCount()).isEqualTo(before);
        err.reset();
        assertThat(cli(
                        err,
                        "submit",
                        sample.toString(),
                        "--server",
                        base(),
                        "--out",
                        dir.toString(),
                        "--server-localizer",
                        "java Evil.java"))
                .isEqualTo(Cli.BAD_INPUT);
        assertThat(err.toString(StandardCharsets.UTF_8)).contains("--server-localizer");
    }

    @Test
    void namesNotListed_andCommands_areRefusedNamingTheField_withNothingStored() throws Exception {
        String edit = copyOfKidnapSample();
        long before = runCount();
        for (String bad : List.of("not-listed", "rm -rf /", "java Evil.java", "DEAD-RECKONING", "x".repeat(41))) {
            HttpResponse<String> r = send(
                    "POST",
                    "/api/s/" + edit + "/batches",
                    "{\"seeds\":[1],\"localizer\":" + JSON.writeValueAsString(bad) + "}");
            assertThat(r.statusCode()).as(bad + ": " + r.body()).isEqualTo(422);
            assertThat(r.body()).contains("localizer");
        }
        HttpResponse<String> unlisted =
                send("POST", "/api/s/" + edit + "/batches", "{\"seeds\":[1],\"localizer\":\"not-listed\"}");
        assertThat(unlisted.body()).contains("dead-reckoning");
        // a sweep goes through the same check
        HttpResponse<String> sweep = send(
                "POST",
                "/api/s/" + edit + "/batches",
                "{\"seeds\":[1],\"particleCounts\":[100],\"localizer\":\"not-listed\"}");
        assertThat(sweep.statusCode()).isEqualTo(422);
        assertThat(runCount()).isEqualTo(before);
    }

    @Test
    void aUnitOfALocalizerOnlyAnotherProcessOffers_isLeftToThatProcess() throws Exception {
        String edit = copyOfKidnapSample();
        // another worker, alive, that offers a localizer this process does not have
        String other = "elsewhere/1/test";
        jdbc.sql("INSERT INTO work_process (name, host, role, threads, localizers, started_at, last_seen,"
                        + " units_done, trials_done) VALUES (?, 'elsewhere', 'worker', 1, 'far-away', ?, ?, 0, 0)")
                .params(other, OffsetDateTime.now(), OffsetDateTime.now())
                .update();
        try {
            assertThat(ok("GET", "/api/localizers", null).get("offered").toString())
                    .isEqualTo("[\"dead-reckoning\",\"far-away\"]");
            JsonNode submitted =
                    ok("POST", "/api/s/" + edit + "/batches", "{\"seeds\":[1],\"localizer\":\"far-away\"}");
            long id = submitted.get("runs").get(0).get("id").asLong();
            // this process polls every second: give it several chances to take the unit
            Thread.sleep(3_500);
            assertThat(jdbc.sql("SELECT state FROM run_unit WHERE run_id = ?")
                            .param(id)
                            .query(String.class)
                            .list())
                    .containsExactly("queued");
            assertThat(jdbc.sql("SELECT task_name FROM scheduled_tasks WHERE task_instance = ? AND picked = ?")
                            .params("run-" + id + "-0", false)
                            .query(String.class)
                            .list())
                    .containsExactly("driftlab-run-unit@far-away");
            ok("POST", "/api/s/" + edit + "/runs/" + id + "/cancel", null);
            assertThat(jdbc.sql("SELECT COUNT(*) FROM scheduled_tasks WHERE task_instance LIKE ?")
                            .param("run-" + id + "-%")
                            .query(Long.class)
                            .single())
                    .isZero();
        } finally {
            jdbc.sql("DELETE FROM work_process WHERE name = ?").param(other).update();
        }
    }
}
