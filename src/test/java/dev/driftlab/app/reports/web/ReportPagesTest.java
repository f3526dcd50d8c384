package dev.driftlab.app.reports.web;

import static org.assertj.core.api.Assertions.assertThat;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.get;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.header;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.status;

import dev.driftlab.app.Polling;
import dev.driftlab.app.WebSlice;
import dev.driftlab.app.runs.RunBoard;
import dev.driftlab.app.runs.RunQueue;
import dev.driftlab.app.runs.ScriptedTrialExecutor;
import dev.driftlab.app.runs.TrialOptions;
import dev.driftlab.app.runs.persistence.RunRepository.RunRow;
import dev.driftlab.app.scenarios.ScenarioStore;
import dev.driftlab.scenario.Scenarios;
import java.util.List;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.test.context.TestPropertySource;
import org.springframework.test.web.servlet.MockMvc;

@WebSlice
@TestPropertySource(properties = {"driftlab.reports.concurrent-pdfs=2"})
class ReportPagesTest {

    @Autowired
    MockMvc mvc;

    @Autowired
    ScenarioStore store;

    @Autowired
    RunQueue queue;

    @Autowired
    RunBoard board;

    @Autowired
    ScriptedTrialExecutor executor;

    @Autowired
    ReportPages pages;

    private RunRow finishedRun() throws Exception {
        executor.reset();
        ScenarioStore.Created c = store.create(Scenarios.corridor().json(), "Ana", "start");
        long id = queue.submit(
                        c.scenarioId(),
                        store.view(c.scenarioId()).latest().id(),
                        List.of("base"),
                        List.of(1L),
                        TrialOptions.resultsOnly())
                .runIds()
                .get(0);
        Polling.until(
                "run " + id + " done",
                () -> board.of(c.scenarioId(), id).state().equals("done"));
        return board.of(c.scenarioId(), id);
    }

    @Test
    void pdf_whileAsManyAsAllowedAreBeingMade_answersBusyAtOnce() throws Exception {
        RunRow run = finishedRun();
        // the first problem page compiles its template; the timing below is of the refusal alone
        mvc.perform(get("/r/AAAAAAAAAAAAAAAAAAAAAA/report.pdf")).andExpect(status().isNotFound());
        CountDownLatch inside = new CountDownLatch(2);
        CountDownLatch release = new CountDownLatch(1);
        List<Thread> holders = List.of(1, 2).stream()
                .map(i -> new Thread(() -> pages.renders().pdf("hold" + i, List.of(run), () -> {
                    inside.countDown();
                    try {
                        release.await(20, TimeUnit.SECONDS);
                    } catch (InterruptedException e) {
                        Thread.currentThread().interrupt();
                    }
                    return new byte[0];
                })))
                .toList();
        holders.forEach(Thread::start);
        try {
            assertThat(inside.await(10, TimeUnit.SECONDS)).isTrue();
            long t0 = System.nanoTime();

            String body = mvc.perform(get("/r/" + run.viewToken() + "/report.pdf"))
                    .andExpect(status().isServiceUnavailable())
                    .andExpect(header().exists("Retry-After"))
                    .andReturn()
                    .getResponse()
                    .getContentAsString();

            assertThat(TimeUnit.NANOSECONDS.toMillis(System.nanoTime() - t0)).isLessThan(2_000);
            assertThat(body).contains("try again");
        } finally {
            release.countDown();
            for (Thread t : holders) {
                t.join();
            }
        }
        mvc.perform(get("/r/" + run.viewToken() + "/report.pdf")).andExpect(status().isOk());
    }
}
