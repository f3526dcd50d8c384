package dev.driftlab.cli;

import static org.assertj.core.api.Assertions.assertThat;

import dev.driftlab.app.DriftlabApplication;
import dev.driftlab.app.Polling;
import dev.driftlab.app.reports.ReportRenders;
import dev.driftlab.app.runs.RunBoard;
import dev.driftlab.scenario.Scenarios;
import dev.driftlab.scenario.Waypoint;
import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.test.web.server.LocalServerPort;
import org.springframework.test.context.TestPropertySource;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;
import tools.jackson.databind.node.ObjectNode;

/**
 * The {@code submit} command against the whole app on a real port, with the real trial engine: the
 * files it writes against those of a local {@code batch} of the same file and seeds, its exit
 * statuses, and the messages of refusals, bad files, unreachable servers and timeouts.
 */
@SpringBootTest(classes = DriftlabApplication.class, webEnvironment = SpringBootTest.WebEnvironment.RANDOM_PORT)
// one report at a time, so a test can hold the bound that the batch files share with the pages
@TestPropertySource(properties = "driftlab.reports.concurrent-pages=1")
class SubmitCliTest {

    // Exit statuses as documented for users (README, "Running batches on a server from CI"): 0 every
    // gate holds, 1 a gate fails, 2 bad input or refused by the server, 3 no answer in time.
    // Literal, so a changed constant in Cli fails here.
    private static final int EXIT_OK = 0;
    private static final int EXIT_FAILED = 1;
    private static final int EXIT_BAD_INPUT = 2;
    private static final int EXIT_NO_ANSWER = 3;

    private static final JsonMapper JSON = JsonMapper.builder().build();

    @LocalServerPort
    int port;

    @Autowired
    ReportRenders renders;

    @Autowired
    RunBoard board;

    private ByteArrayOutputStream out = new ByteArrayOutputStream();
    private ByteArrayOutputStream err = new ByteArrayOutputStream();

    private String server() {
        return "http://localhost:" + port;
    }

    private int cli(String... args) {
        out = new ByteArrayOutputStream();
        err = new ByteArrayOutputStream();
        return Cli.run(
                args,
                new PrintStream(out, true, StandardCharsets.UTF_8),
                new PrintStream(err, true, StandardCharsets.UTF_8));
    }

    private String out() {
        return out.toString(StandardCharsets.UTF_8);
    }

    private String err() {
        return err.toString(StandardCharsets.UTF_8);
    }

    private static JsonNode json(Path p) throws Exception {
        return JSON.readTree(Files.readString(p));
    }

    /** A result document without what differs between two makings of the same trials. */
    private static JsonNode comparable(JsonNode doc) {
        ObjectNode copy = (ObjectNode) doc.deepCopy();
        // when it was made, how long it took, and what it was made from (a file here, a revision there)
        copy.remove(List.of("generatedAt", "seconds", "source"));
        // and how fast the localizer answered on the machine that ran each trial
        ObjectNode localizer = (ObjectNode) copy.get("localizer");
        localizer.remove(List.of("answerTimeP50", "answerTimeWorstP99", "trialsOverScanPeriod"));
        copy.set("trials", untimed(copy.get("trials")));
        return copy;
    }

    /** Trials without their answer times (measurements of the machine, not of the trial). */
    private static JsonNode untimed(JsonNode trials) {
        JsonNode copy = trials.deepCopy();
        for (JsonNode t : copy) {
            ((ObjectNode) t).remove(List.of("answerTimeP50", "answerTimeP99"));
        }
        return copy;
    }

    private HttpResponse<String> http(HttpRequest.Builder b) throws Exception {
        return HttpClient.newHttpClient().send(b.build(), HttpResponse.BodyHandlers.ofString());
    }

    @Test
    void submitOfAFile_writesWhatALocalBatchWrites_andExitsAlike(@TempDir Path dir) throws Exception {
        Path file = dir.resolve("corridor.json");
        Files.writeString(
                file, Scenarios.corridor().withName("Submitted corridor").json());
        Path variants = dir.resolve("variants.json");
        Files.writeString(variants, """
                {"format": "driftlab-variants/1",
                 "variants": [{"name": "200 particles", "localizer": {"particles": {"count": 200}}}]}""");

        int local = cli(
                "batch",
                file.toString(),
                "--seeds",
                "2",
                "--threads",
                "1",
                "--variants",
                variants.toString(),
                "--out",
                dir + "/local",
                "--quiet");
        String localOut = out();
        int remote = cli(
                "submit",
                file.toString(),
                "--server",
                server(),
                "--seeds",
                "2",
                "--variants",
                variants.toString(),
                "--out",
                dir + "/remote");

        assertThat(remote).as(err()).isEqualTo(local).isEqualTo(EXIT_OK);
        JsonNode a = json(dir.resolve("local/result.json"));
        JsonNode b = json(dir.resolve("remote/result.json"));
        assertThat(b.get("kind").asString()).isEqualTo("batch");
        // both variants on both seeds, paired
        assertThat(b.get("trials").size()).isEqualTo(4);
        assertThat(b.get("variants").get(1).get("name").asString()).isEqualTo("200 particles");
        assertThat(b.get("comparisons").get(0).get("pairs").asInt()).isEqualTo(2);
        assertThat(untimed(b.get("trials"))).isEqualTo(untimed(a.get("trials")));
        comparable(a)
                .properties()
                .forEach(e ->
                        assertThat(comparable(b).get(e.getKey())).as(e.getKey()).isEqualTo(e.getValue()));
        assertThat(comparable(b)).isEqualTo(comparable(a));
        assertThat(Files.readAllLines(dir.resolve("remote/trials.jsonl"))).hasSize(4);
        assertThat(untimed(JSON.createArrayNode()
                        .add(JSON.readTree(Files.readAllLines(dir.resolve("remote/trials.jsonl"))
                                .get(0)))))
                .isEqualTo(untimed(JSON.createArrayNode().add(a.get("trials").get(0))));
        assertThat(junitComparable(dir.resolve("remote/junit.xml")))
                .isEqualTo(junitComparable(dir.resolve("local/junit.xml")));
        assertThat(htmlComparable(dir.resolve("remote/report.html")))
                .isEqualTo(htmlComparable(dir.resolve("local/report.html")));
        assertThat(Files.readString(dir.resolve("remote/report.html")))
                .contains("Simulation results do not certify safety")
                .contains("Verdict: pass")
                .doesNotContain("<script")
                .doesNotContain("report-tools");
        // the same first line of the summary as the local job prints
        assertThat(out().lines().findFirst()).isEqualTo(localOut.lines().findFirst());
        assertThat(err()).contains("submit: batch 4/4 trials, 100 %");
    }

    /** The JUnit file without its time, timestamp and source, which name when and from what it was made. */
    private static String junitComparable(Path p) throws Exception {
        return Files.readString(p)
                .replaceAll(" time=\"[0-9.]+\" timestamp=\"[^\"]*\"", "")
                .replaceAll("<property name=\"source\" value=\"[^\"]*\"/>", "");
    }

    /** The report page without the facts that name when, how fast and from what it was made. */
    private static String htmlComparable(Path p) throws Exception {
        return Files.readString(p)
                .replaceAll(
                        "<dt>(Scenario source|Generated|Time taken|Answer time per scan)</dt><dd>[^<]*</dd>",
                        "<dt>$1</dt>")
                .replaceAll("<td>[0-9.]+ / [0-9.]+ ms</td>", "<td>(answer time)</td>");
    }

    @Test
    void failingGate_exitsOne_withTheVerdictFirst(@TempDir Path dir) throws Exception {
        // the side room's door spans x = 2.55 to 3.45 on the corridor's north wall; x = 4.2 is wall,
        // so every trial stops at a contact and the default whole-route gate fails
        Path file = dir.resolve("missed-door.json");
        Files.writeString(
                file,
                Scenarios.corridor()
                        .withName("Door missed, submitted")
                        .withoutWaypoints()
                        .withWaypoints(new Waypoint(4.2, 1, 0.5, 0), new Waypoint(4.2, 4, 0.5, 0))
                        .json());

        int status = cli("submit", file.toString(), "--server", server(), "--seeds", "2", "--out", dir.toString());

        assertThat(status).as(err()).isEqualTo(EXIT_FAILED);
        assertThat(out()).startsWith("ENDED EARLY: Door missed, submitted (2 of 2 trials)");
        assertThat(out()).contains("FAIL route-completed (default) [base]");
        assertThat(json(dir.resolve("result.json")).get("verdict").asString()).isEqualTo("ended-early");
        assertThat(Files.readString(dir.resolve("junit.xml"))).contains("<failure");
    }

    @Test
    void link_runsTheScenarioOfAnExistingToken(@TempDir Path dir) throws Exception {
        HttpResponse<String> created = http(HttpRequest.newBuilder(URI.create(server() + "/api/scenarios"))
                .header("Content-Type", "application/json")
                .POST(HttpRequest.BodyPublishers.ofString(
                        Scenarios.corridor().withName("Linked corridor").json())));
        String view = JSON.readTree(created.body()).get("viewToken").asString();

        int status = cli(
                "submit",
                "--link",
                server() + "/s/" + view,
                "--server",
                server(),
                "--seeds",
                "1",
                "--first-seed",
                "5",
                "--out",
                dir.toString(),
                "--quiet");

        assertThat(status).as(err()).isEqualTo(EXIT_OK);
        JsonNode result = json(dir.resolve("result.json"));
        assertThat(result.get("scenario").asString()).isEqualTo("Linked corridor");
        assertThat(result.get("kind").asString()).isEqualTo("batch");
        assertThat(result.get("seeds").get(0).asLong()).isEqualTo(5);
        assertThat(result.get("trials").size()).isEqualTo(1);
        assertThat(err()).isEmpty();
    }

    @Test
    void onATerminal_progressRewritesOneLine(@TempDir Path dir) throws Exception {
        Path file = dir.resolve("corridor.json");
        Files.writeString(
                file, Scenarios.corridor().withName("Terminal corridor").json());
        ByteArrayOutputStream progress = new ByteArrayOutputStream();

        int status = new Submit(
                        new PrintStream(new ByteArrayOutputStream(), true, StandardCharsets.UTF_8),
                        new PrintStream(progress, true, StandardCharsets.UTF_8),
                        true)
                .run(new String[] {file.toString(), "--server", server(), "--seeds", "1", "--out", dir.toString()});

        String text = progress.toString(StandardCharsets.UTF_8);
        assertThat(status).as(text).isEqualTo(EXIT_OK);
        assertThat(text).contains("\rsubmit: batch 0/1 trials, 0 %").contains("\rsubmit: batch 1/1 trials, 100 %");
        assertThat(text).contains("  scenario: " + server() + "/s/");
        // the progress line is rewritten in place, never one line per poll
        assertThat(java.util.Arrays.stream(text.split("\n")).filter(l -> l.contains("trials,")))
                .hasSize(1);
    }

    @Test
    void unknownLink_isBadInput_namingTheOption(@TempDir Path dir) {
        int status = cli("submit", "--link", "A".repeat(43), "--server", server(), "--out", dir.toString(), "--quiet");

        assertThat(status).isEqualTo(EXIT_BAD_INPUT);
        assertThat(err().strip()).startsWith("driftlab submit: --link: This link does not open anything");
    }

    @Test
    void serverRefusal_isBadInput_withTheServersMessageNamingTheField(@TempDir Path dir) throws Exception {
        Path file = dir.resolve("corridor.json");
        Files.writeString(file, Scenarios.corridor().withName("Too many seeds").json());

        // the command line allows 100,000 seeds; a server takes at most 10,000 per run
        int status = cli("submit", file.toString(), "--server", server(), "--seeds", "20000", "--out", dir.toString());

        assertThat(status).isEqualTo(EXIT_BAD_INPUT);
        assertThat(err())
                .contains("driftlab submit: the server refused the batch: seedCount: 20000 seeds asked for; at most"
                        + " 10000 per run");
        assertThat(dir.resolve("result.json")).doesNotExist();
    }

    @Test
    void badFiles_areBadInput_beforeAnythingIsSent(@TempDir Path dir) throws Exception {
        assertThat(cli("submit", "nowhere.json", "--server", server(), "--out", dir.toString()))
                .isEqualTo(EXIT_BAD_INPUT);
        assertThat(err().strip()).isEqualTo("driftlab submit: nowhere.json: cannot read: no such file");

        Path bad = dir.resolve("bad.json");
        Files.writeString(
                bad,
                Files.readString(Path.of("sample-projects/office-carpet-stall.json"))
                        .replace("\"count\": 2000", "\"count\": 0"));
        assertThat(cli("submit", bad.toString(), "--server", server(), "--out", dir.toString()))
                .isEqualTo(EXIT_BAD_INPUT);
        assertThat(err()).contains("bad.json: refused (1 error)").contains("localizer.particles.count");

        assertThat(cli(
                        "submit",
                        "sample-projects/office-carpet-stall.json",
                        "--server",
                        "ftp://x",
                        "--out",
                        dir.toString()))
                .isEqualTo(EXIT_BAD_INPUT);
        assertThat(err()).contains("--server must be an http:// or https:// address");

        assertThat(cli("submit", "sample-projects/office-carpet-stall.json", "--out", dir.toString()))
                .isEqualTo(EXIT_BAD_INPUT);
        assertThat(err().strip()).isEqualTo("driftlab submit: submit needs --server");
    }

    @Test
    void unreachableServer_exitsThree_sayingSo(@TempDir Path dir) {
        // port 1 on the loopback address: nothing listens there
        int status = cli(
                "submit",
                "sample-projects/office-carpet-stall.json",
                "--server",
                "http://127.0.0.1:1",
                "--out",
                dir.toString());

        assertThat(status).isEqualTo(EXIT_NO_ANSWER);
        assertThat(err()).contains("driftlab submit: cannot reach the server at http://127.0.0.1:1");
    }

    @Test
    void timeout_exitsThree_andCancelsTheRunsItStarted(@TempDir Path dir) throws Exception {
        // a kidnap scenario of about three minutes of robot time per trial, far longer than 3 s allows
        int status = cli(
                "submit",
                "sample-projects/storage-hall-kidnap.json",
                "--server",
                server(),
                "--seeds",
                "6",
                "--timeout",
                "0.05",
                "--out",
                dir.toString());

        assertThat(status).as(err()).isEqualTo(EXIT_NO_ANSWER);
        assertThat(err())
                .contains("driftlab submit: the batch did not finish within 0.05 minutes (--timeout); cancelled its")
                .contains("unfinished run");
        assertThat(dir.resolve("result.json")).doesNotExist();
    }

    @Test
    void batchFiles_ofAnUnknownRunLink_areNotFoundProblems() throws Exception {
        for (String file : List.of("batch-result", "batch-junit.xml", "batch-report.html")) {
            HttpResponse<String> r =
                    http(HttpRequest.newBuilder(URI.create(server() + "/api/r/" + "B".repeat(43) + "/" + file)));
            assertThat(r.statusCode()).as(file).isEqualTo(404);
            assertThat(r.body()).as(file).contains("\"detail\"");
        }
    }

    @Test
    void busyReports_answer503_andSubmitWaitsForRoom(@TempDir Path dir) throws Exception {
        JsonNode created = JSON.readTree(http(HttpRequest.newBuilder(URI.create(server() + "/api/scenarios"))
                        .header("Content-Type", "application/json")
                        .POST(HttpRequest.BodyPublishers.ofString(
                                Scenarios.corridor().withName("Busy corridor").json())))
                .body());
        String edit = created.get("editToken").asString();
        JsonNode batch = JSON.readTree(http(HttpRequest.newBuilder(URI.create(server() + "/api/s/" + edit + "/batches"))
                        .header("Content-Type", "application/json")
                        .POST(HttpRequest.BodyPublishers.ofString("{\"seedCount\": 1}")))
                .body());
        String batchUrl =
                server() + "/api/s/" + edit + "/batches/" + batch.get("batch").asString();
        Polling.until(
                "the batch finishing",
                () -> JSON.readTree(http(HttpRequest.newBuilder(URI.create(batchUrl)))
                                .body())
                        .get("finished")
                        .asBoolean());
        String runToken = batch.get("runs").get(0).get("viewToken").asString();
        var run = board.byToken(runToken);
        CountDownLatch holding = new CountDownLatch(1);
        CountDownLatch release = new CountDownLatch(1);
        Thread holder = new Thread(() -> renders.page("hold", List.of(run), () -> {
            holding.countDown();
            try {
                release.await(60, TimeUnit.SECONDS);
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
            }
            return "";
        }));
        holder.start();
        try {
            assertThat(holding.await(10, TimeUnit.SECONDS)).isTrue();

            HttpResponse<String> busy =
                    http(HttpRequest.newBuilder(URI.create(server() + "/api/r/" + runToken + "/batch-result")));
            assertThat(busy.statusCode()).isEqualTo(503);
            assertThat(busy.headers().firstValue("Retry-After")).hasValue("5");
            assertThat(busy.body()).contains("Busy");

            // the download meets the full bound, says so, and tries again once there is room
            ByteArrayOutputStream waitErr = new ByteArrayOutputStream();
            PrintStream waitStream = new PrintStream(waitErr, true, StandardCharsets.UTF_8);
            Thread freer = new Thread(() -> {
                try {
                    Polling.until(
                            "the busy notice",
                            () -> waitErr.toString(StandardCharsets.UTF_8).contains("trying again"));
                } catch (Exception e) {
                    // the assertions below report what was printed
                }
                release.countDown();
            });
            freer.start();
            int status = Cli.run(
                    new String[] {
                        "submit",
                        "--link",
                        edit,
                        "--server",
                        server(),
                        "--seeds",
                        "1",
                        "--out",
                        dir + "/second",
                        "--quiet"
                    },
                    new PrintStream(new ByteArrayOutputStream(), true, StandardCharsets.UTF_8),
                    waitStream);
            freer.join();

            assertThat(status).as(waitErr.toString(StandardCharsets.UTF_8)).isEqualTo(EXIT_OK);
            assertThat(waitErr.toString(StandardCharsets.UTF_8))
                    .contains("submit: the server is making other reports; trying again in 5 s");
            assertThat(dir.resolve("second/result.json")).exists();
        } finally {
            release.countDown();
            holder.join();
        }
    }
}
