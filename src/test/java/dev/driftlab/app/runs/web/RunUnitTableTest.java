package dev.driftlab.app.runs.web;

import static org.assertj.core.api.Assertions.assertThat;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.get;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.status;

import dev.driftlab.app.WebSlice;
import dev.driftlab.app.runs.RunState;
import dev.driftlab.app.runs.WorkerBoard;
import dev.driftlab.app.runs.persistence.RunRepository;
import dev.driftlab.app.scenarios.ScenarioStore;
import dev.driftlab.scenario.Scenarios;
import java.time.Duration;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.context.annotation.Import;
import org.springframework.jdbc.core.simple.JdbcClient;
import org.springframework.test.web.servlet.MockMvc;
import org.springframework.test.web.servlet.RequestBuilder;

/** The run page's table of work units: seeds, state in words, process, attempts and progress. */
@WebSlice
@Import(WorkRows.FixedClock.class)
class RunUnitTableTest {

    @Autowired
    MockMvc mvc;

    @Autowired
    JdbcClient jdbc;

    @Autowired
    RunRepository runs;

    @Autowired
    ScenarioStore store;

    WorkRows rows;
    ScenarioStore.Created c;

    @BeforeEach
    void rows() {
        rows = new WorkRows(jdbc, runs, store);
        rows.clear();
        c = store.create(Scenarios.corridor().json(), "Ana", "start");
        rows.process("test-alive", "rack-a", "worker", 4, Duration.ofSeconds(1), false);
        rows.process("test-lost", "rack-b", "worker", 4, Duration.ofSeconds(30), false);
        rows.process("test-stopped", "rack-c", "worker", 4, Duration.ofSeconds(3), true);
    }

    private String body(RequestBuilder r) throws Exception {
        return mvc.perform(r)
                .andExpect(status().isOk())
                .andReturn()
                .getResponse()
                .getContentAsString();
    }

    /** The unit table's row of one unit. */
    private static String unitRow(String html, int unit) {
        Matcher m = Pattern.compile("<tr>\\s*<th scope=\"row\">" + unit + "</th>.*?</tr>", Pattern.DOTALL)
                .matcher(html);
        assertThat(m.find()).as("row of unit " + unit).isTrue();
        return m.group();
    }

    private long fourUnitRun() {
        long run = rows.runningRun(c, WorkRows.seeds(11, 7));
        rows.unit(run, 0, 0, 2, "done", "test-alive", 1, 1);
        rows.unit(run, 1, 2, 2, "running", "test-alive", 1, 0.456);
        rows.unit(run, 2, 4, 2, "running", "test-lost", 2, 0.7);
        rows.unit(run, 3, 6, 1, "queued", null, 0, 0);
        return run;
    }

    @Test
    void multiUnitRun_showsEachUnitsSeedsStateProcessAttemptsAndProgress() throws Exception {
        long run = fourUnitRun();

        String html = body(get("/s/" + c.viewToken() + "/runs/" + run));

        assertThat(html).contains("Work units").contains("4 units: 1 done, 2 running, 1 waiting.");
        assertThat(unitRow(html, 1))
                .contains("<td>11 to 12</td>")
                .contains("<td>done</td>")
                .contains("test-alive")
                .contains("value=\"100\"");
        assertThat(unitRow(html, 2))
                .contains("<td>13 to 14</td>")
                .contains("<td>running</td>")
                .contains("<td>1</td>")
                .contains("<progress max=\"100\" value=\"45\" aria-label=\"Unit 2 progress\">45 %</progress>");
        // its process stopped beating: the engine will hand the unit to another
        assertThat(unitRow(html, 3))
                .contains("waiting to run again: its process was lost")
                .contains("test-lost")
                .contains("<td>2</td>");
        assertThat(unitRow(html, 4))
                .contains("<td>17</td>")
                .contains("<td>waiting</td>")
                .contains("none yet");
    }

    @Test
    void unitOfAStoppedProcess_isWaitingToRunAgain() throws Exception {
        long run = rows.runningRun(c, WorkRows.seeds(1, 2));
        rows.unit(run, 0, 0, 1, "running", "test-stopped", 1, 0.2);
        rows.unit(run, 1, 1, 1, "queued", null, 0, 0);

        assertThat(unitRow(body(get("/s/" + c.viewToken() + "/runs/" + run)), 1))
                .contains("waiting to run again: its process stopped");
    }

    @Test
    void progressPolling_carriesTheTable_onTheRunsOwnLinkToo() throws Exception {
        long run = fourUnitRun();
        String runToken = runs.find(run).orElseThrow().viewToken();

        String fragment = body(get("/r/" + runToken).header("HX-Request", "true"));

        assertThat(fragment)
                .startsWith("<div id=\"run-progress\"")
                .contains("hx-trigger=\"every 1s\"")
                .contains("aria-label=\"Unit 3 progress\"");
    }

    @Test
    void oneUnitRun_hasNoTable() throws Exception {
        long run = rows.runningRun(c, WorkRows.seeds(1, 1));
        rows.unit(run, 0, 0, 1, "running", "test-alive", 1, 0.5);

        assertThat(body(get("/s/" + c.viewToken() + "/runs/" + run))).doesNotContain("Work units");
    }

    @Test
    void cancelledRun_saysItsUnfinishedUnitsEndedWithTheRun() throws Exception {
        long run = fourUnitRun();
        runs.finish(run, RunState.CANCELLED.word(), WorkRows.NOW, "");

        String html = body(get("/s/" + c.viewToken() + "/runs/" + run));

        assertThat(unitRow(html, 1)).contains("<td>done</td>");
        assertThat(unitRow(html, 2)).contains("stopped: the run ended");
        assertThat(unitRow(html, 4)).contains("not started: the run ended");
    }

    @Test
    void runOfManyUnits_showsTheFirst200_andSaysSo() throws Exception {
        int units = WorkerBoard.MAX_UNIT_ROWS + 50;
        long run = rows.runningRun(c, WorkRows.seeds(1, units));
        for (int i = 0; i < units; i++) {
            rows.unit(run, i, i, 1, i < 10 ? "done" : "queued", i < 10 ? "test-alive" : null, i < 10 ? 1 : 0, 0);
        }

        String html = body(get("/s/" + c.viewToken() + "/runs/" + run));

        assertThat(Pattern.compile("<progress max=\"100\" value=\"\\d+\" aria-label=\"Unit ")
                        .matcher(html)
                        .results()
                        .count())
                .isEqualTo(WorkerBoard.MAX_UNIT_ROWS);
        assertThat(html)
                .contains("250 units: 10 done, 0 running, 240 waiting.")
                .contains("The table shows the first 200 of 250 units.")
                .contains("aria-label=\"Unit 200 progress\"")
                .doesNotContain("aria-label=\"Unit 201 progress\"");
    }
}
