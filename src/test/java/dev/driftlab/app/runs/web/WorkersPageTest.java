package dev.driftlab.app.runs.web;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.get;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.status;

import dev.driftlab.app.Polling;
import dev.driftlab.app.WebSlice;
import dev.driftlab.app.runs.WorkEngine;
import dev.driftlab.app.runs.WorkerBoard;
import dev.driftlab.app.runs.persistence.RunRepository;
import dev.driftlab.app.scenarios.ScenarioStore;
import dev.driftlab.scenario.Scenarios;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.context.annotation.Import;
import org.springframework.jdbc.core.simple.JdbcClient;
import org.springframework.mock.web.MockHttpServletResponse;
import org.springframework.test.web.servlet.MockMvc;
import org.springframework.test.web.servlet.RequestBuilder;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;

/**
 * The workers page and {@code /api/workers} over rows written as remote processes write them, at
 * a fixed time: alive, stopped and lost by heartbeat, what each runs, the queue and throughput.
 */
@WebSlice
@Import(WorkRows.FixedClock.class)
class WorkersPageTest {

    @Autowired
    MockMvc mvc;

    @Autowired
    JdbcClient jdbc;

    @Autowired
    RunRepository runs;

    @Autowired
    ScenarioStore store;

    @Autowired
    WorkEngine engine;

    WorkRows rows;
    ScenarioStore.Created c;
    long run;

    @BeforeEach
    void rows() throws Exception {
        Polling.until(
                "the engine's first heartbeat",
                () -> jdbc.sql("SELECT COUNT(*) FROM work_process WHERE name = ?")
                                .param(engine.processName())
                                .query(Long.class)
                                .single()
                        == 1);
        rows = new WorkRows(jdbc, runs, store);
        rows.clear();
        c = store.create(Scenarios.corridor().withName("Dock aisle").json(), "Ana", "start");
        run = rows.runningRun(c, WorkRows.seeds(11, 8));
        rows.process("test-alive", "rack-a", "worker", 4, Duration.ofSeconds(1), false);
        // one beat short of the engine's limit is still alive; past it, lost
        rows.process("test-late", "rack-a", "worker", 2, WorkerBoard.LOST_AFTER, false);
        rows.process("test-lost", "rack-b", "worker", 4, Duration.ofSeconds(30), false);
        rows.process("test-stopped", "rack-c", "worker", 4, Duration.ofSeconds(5), true);
        rows.process("test-old", "rack-d", "worker", 4, Duration.ofHours(2), false);
        rows.unit(run, 0, 0, 2, "done", "test-alive", 1, 1);
        rows.unit(run, 1, 2, 2, "running", "test-alive", 1, 0.4);
        rows.unit(run, 2, 4, 2, "running", "test-lost", 2, 0.7);
        rows.unit(run, 3, 6, 2, "queued", null, 0, 0);
        // throughput: 2 trials in the last minute, 5 in the last ten, 7 in all
        rows.trial(run, 11, Duration.ofSeconds(30));
        rows.trial(run, 12, Duration.ofSeconds(59));
        rows.trial(run, 101, Duration.ofMinutes(3));
        rows.trial(run, 102, Duration.ofMinutes(5));
        rows.trial(run, 103, Duration.ofMinutes(9));
        rows.trial(run, 104, Duration.ofMinutes(11));
        rows.trial(run, 105, Duration.ofMinutes(20));
        rows.queued("a", false);
        rows.queued("b", false);
        rows.queued("c", false);
        rows.queued("d", true);
    }

    private MockHttpServletResponse answer(RequestBuilder r) throws Exception {
        MockHttpServletResponse res =
                mvc.perform(r).andExpect(status().isOk()).andReturn().getResponse();
        res.setCharacterEncoding("UTF-8");
        return res;
    }

    /** The table row of one process, from its name to the end of the row. */
    private static String rowOf(String html, String name) {
        Matcher m = Pattern.compile(
                        "<tr[^>]*>\\s*<th scope=\"row\"><code>" + Pattern.quote(name) + "</code>.*?</tr>",
                        Pattern.DOTALL)
                .matcher(html);
        assertThat(m.find()).as("row of " + name).isTrue();
        return m.group();
    }

    @Test
    void page_saysWhichProcessesAreAlive_stoppedOrLost_byHeartbeat() throws Exception {
        String html = answer(get("/workers")).getContentAsString();

        assertThat(rowOf(html, "test-alive"))
                .contains("rack-a")
                .contains(">alive<")
                .contains(">4<");
        assertThat(rowOf(html, "test-late")).contains(">alive<");
        assertThat(rowOf(html, "test-lost")).contains(">lost<").contains("30 s ago");
        assertThat(rowOf(html, "test-stopped")).contains(">stopped<");
        assertThat(html).doesNotContain("test-old").contains("<a href=\"/workers\">Workers</a>");
    }

    @Test
    void page_listsThisServersOwnProcess_fromItsRealHeartbeat() throws Exception {
        String html = answer(get("/workers")).getContentAsString();

        assertThat(rowOf(html, engine.processName())).contains(">server<").contains(">alive<");
    }

    @Test
    void page_showsWhatEachProcessRunsNow_withTheScenarioAndALinkThroughItsViewLink() throws Exception {
        String html = answer(get("/workers")).getContentAsString();

        assertThat(rowOf(html, "test-alive"))
                .contains("href=\"/s/" + c.viewToken() + "/runs/" + run + "\"")
                .contains("run #" + run)
                .contains("(Dock aisle)")
                .contains("unit 2, 40 % done");
        // a lost process's unit is about to be taken again: it is nobody's work now
        assertThat(rowOf(html, "test-lost")).doesNotContain("run #").contains("nothing");
        assertThat(rowOf(html, "test-stopped")).contains("nothing");
    }

    @Test
    void page_countsUnitsWaiting_andTrialsFinishedInTheLastMinuteAndTenMinutes() throws Exception {
        String html = answer(get("/workers")).getContentAsString();

        // the engine's queue holds three units not taken; the taken one is not waiting
        assertThat(html).containsPattern("Units waiting</dt><dd>3</dd>");
        assertThat(html).containsPattern("Trials finished in the last minute</dt><dd>2</dd>");
        assertThat(html).contains("5 (0.5 per minute)");
    }

    @Test
    void page_neverShowsAnEditTokenOrARunsOwnLink() throws Exception {
        String runToken = runs.find(run).orElseThrow().viewToken();

        String html = answer(get("/workers")).getContentAsString();
        String json = answer(get("/api/workers")).getContentAsString();

        assertThat(html).doesNotContain(c.editToken()).doesNotContain(runToken);
        assertThat(json).doesNotContain(c.editToken()).doesNotContain(runToken);
    }

    @Test
    void revokedViewLink_leavesTheRunNumberWithoutALink() throws Exception {
        jdbc.sql("UPDATE share_link SET revoked_at = ? WHERE scenario_id = ?")
                .params(WorkRows.NOW, c.scenarioId())
                .update();

        String row = rowOf(answer(get("/workers")).getContentAsString(), "test-alive");

        assertThat(row).contains("run #" + run).contains("(Dock aisle)").doesNotContain("href=");
    }

    @Test
    void htmxRequest_getsTheBoardFragmentThatPollsEvery2s_andBothAnswersVaryOnHxRequest() throws Exception {
        MockHttpServletResponse page = answer(get("/workers"));
        MockHttpServletResponse fragment = answer(get("/workers").header("HX-Request", "true"));

        assertThat(page.getContentAsString()).contains("<html").contains("Stop automatic updates");
        assertThat(fragment.getContentAsString())
                .startsWith("<div id=\"workers-board\"")
                .contains("hx-trigger=\"every 2s\"")
                .contains("test-alive")
                .doesNotContain("<html");
        assertThat(page.getHeaders("Vary")).anyMatch(v -> v.contains("HX-Request"));
        assertThat(fragment.getHeaders("Vary")).anyMatch(v -> v.contains("HX-Request"));
    }

    @Test
    void stoppedUpdates_leaveTheBoardStill_withAWayBack() throws Exception {
        String html = answer(get("/workers").param("live", "false")).getContentAsString();

        assertThat(html)
                .doesNotContain("hx-trigger")
                .contains("Update automatically")
                .contains("test-alive");
    }

    @Test
    void api_givesTheSameFigures() throws Exception {
        JsonNode body = JsonMapper.builder()
                .build()
                .readTree(answer(get("/api/workers")).getContentAsString());

        assertThat(body.get("unitsWaiting").asLong()).isEqualTo(3);
        assertThat(body.get("trialsLastMinute").asLong()).isEqualTo(2);
        assertThat(body.get("trialsLastTenMinutes").asLong()).isEqualTo(5);
        assertThat(body.get("trialsPerMinute").asDouble()).isCloseTo(0.5, within(1e-12));
        assertThat(body.get("lostAfterSeconds").asLong()).isEqualTo(8);
        assertThat(body.get("scenariosShown").asBoolean()).isTrue();
        JsonNode alive = worker(body, "test-alive").orElseThrow();
        assertThat(alive.get("state").asString()).isEqualTo("alive");
        assertThat(alive.get("host").asString()).isEqualTo("rack-a");
        assertThat(alive.get("threads").asInt()).isEqualTo(4);
        assertThat(alive.get("secondsSinceSeen").asLong()).isEqualTo(1);
        assertThat(alive.get("running")).hasSize(1);
        JsonNode unit = alive.get("running").get(0);
        assertThat(unit.get("run").asLong()).isEqualTo(run);
        assertThat(unit.get("unit").asInt()).isEqualTo(2);
        assertThat(unit.get("progress").asDouble()).isCloseTo(0.4, within(1e-12));
        assertThat(unit.get("scenario").asString()).isEqualTo("Dock aisle");
        assertThat(unit.get("runPath").asString()).isEqualTo("/s/" + c.viewToken() + "/runs/" + run);
        assertThat(worker(body, "test-lost").orElseThrow().get("state").asString())
                .isEqualTo("lost");
        assertThat(worker(body, "test-lost").orElseThrow().get("running")).isEmpty();
        assertThat(worker(body, "test-stopped").orElseThrow().get("state").asString())
                .isEqualTo("stopped");
        assertThat(worker(body, "test-old")).isEmpty();
        // alive: test-alive, test-late and this context's own engine
        assertThat(body.get("alive").asLong()).isEqualTo(3);
    }

    @Test
    void aHundredAndFiftyWorkers_eachWithItsUnit_areListedWithWhatTheyRun() throws Exception {
        long big = rows.runningRun(c, WorkRows.seeds(1000, 150));
        for (int i = 0; i < 150; i++) {
            String name = String.format("test-w%03d", i);
            rows.process(name, "rack-" + (i % 7), "worker", 2, Duration.ofSeconds(i % 5), false);
            rows.unit(big, i, i, 1, "running", name, 1, i / 150.0);
        }

        String html = answer(get("/workers")).getContentAsString();

        List<String> missing = new ArrayList<>();
        for (int i = 0; i < 150; i++) {
            String row = rowOf(html, String.format("test-w%03d", i));
            if (!row.contains("unit " + (i + 1) + ",") || !row.contains(">alive<")) {
                missing.add(String.format("test-w%03d", i));
            }
        }
        assertThat(missing).isEmpty();
    }

    @Test
    void overTheListLimit_theRestAreCounted_notListed() throws Exception {
        for (int i = 0; i < WorkerBoard.MAX_PROCESSES; i++) {
            rows.process(String.format("test-m%03d", i), "rack-m", "worker", 1, Duration.ofSeconds(2), false);
        }

        String html = answer(get("/workers")).getContentAsString();

        assertThat(Pattern.compile("<th scope=\"row\">").matcher(html).results().count())
                .isEqualTo(WorkerBoard.MAX_PROCESSES);
        assertThat(html).contains("More processes were seen in the last 1 hour(s) than the 200 listed");
        // alive ones come first, so the lost and stopped ones are the ones left off
        assertThat(html).doesNotContain("test-lost").doesNotContain("test-stopped");
    }

    private static Optional<JsonNode> worker(JsonNode body, String name) {
        for (JsonNode w : body.get("workers")) {
            if (w.get("name").asString().equals(name)) {
                return Optional.of(w);
            }
        }
        return Optional.empty();
    }
}
