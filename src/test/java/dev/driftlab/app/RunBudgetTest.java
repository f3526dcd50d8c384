package dev.driftlab.app;

import static org.assertj.core.api.Assertions.assertThat;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.post;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.jsonPath;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.status;

import dev.driftlab.app.runs.RunQueue;
import dev.driftlab.app.runs.ScriptedTrialExecutor;
import dev.driftlab.scenario.LocalizerSettings;
import dev.driftlab.scenario.Rangefinder;
import dev.driftlab.scenario.Scenarios;
import dev.driftlab.trial.TrialCost;
import org.hamcrest.Matchers;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.http.MediaType;
import org.springframework.test.context.TestPropertySource;
import org.springframework.test.web.servlet.MockMvc;
import tools.jackson.databind.json.JsonMapper;

/**
 * A submission's cost is estimated before anything is queued, and refused over the server's
 * budget with the estimate and the limit; one scenario cannot take every place at once.
 */
@WebSlice
@TestPropertySource(
        properties = {
            "driftlab.runs.workers=1",
            "driftlab.runs.queue-capacity=6",
            "driftlab.runs.max-particle-beams=1e10",
            "driftlab.runs.max-recorded-particles=1e5",
            "driftlab.runs.max-active-per-scenario=2"
        })
class RunBudgetTest {

    @Autowired
    MockMvc mvc;

    @Autowired
    ScriptedTrialExecutor executor;

    @Autowired
    RunQueue queue;

    String view;

    @BeforeEach
    void importOne() throws Exception {
        executor.reset();
        Polling.until("the run queue emptying", () -> queue.freePlaces() == queue.places());
        String body = mvc.perform(post("/api/scenarios")
                        .contentType(MediaType.APPLICATION_JSON)
                        .content(Scenarios.corridor().withName("Budget").json()))
                .andExpect(status().is(201))
                .andReturn()
                .getResponse()
                .getContentAsString();
        view = JsonMapper.builder().build().readTree(body).get("viewToken").stringValue();
    }

    @Test
    void trialCost_countsScansParticlesAndBeams() {
        var s = Scenarios.corridor().build();
        TrialCost c = TrialCost.of(s, s.localizer(), 0);
        LocalizerSettings.Particles p = s.localizer().particles();

        assertThat(c.particles()).isEqualTo(p.adaptive() ? p.maxCount() : p.count());
        Rangefinder rf = s.rangefinder();
        int step = s.localizer().rangeModel().beamStep();
        assertThat(c.beams()).isEqualTo((rf.beams() + step - 1) / step);
        // the corridor route is 17 m at 0.5 m/s: at least 34 s of scans at the rangefinder's rate
        assertThat(c.scans()).isGreaterThanOrEqualTo((long) (34 * rf.rate()));
        assertThat(c.particleBeams()).isEqualTo((double) c.scans() * c.particles() * c.beams());
        assertThat(TrialCost.of(s, s.localizer(), 300).particles()).isEqualTo(300);
    }

    @Test
    void overTheWorkBudget_isRefusedWithTheEstimateAndTheLimit_andNothingQueued() throws Exception {
        int free = queue.freePlaces();
        mvc.perform(post("/api/s/" + view + "/batches")
                        .contentType(MediaType.APPLICATION_JSON)
                        .content("{\"seedCount\":5000}"))
                .andExpect(status().isUnprocessableContent())
                .andExpect(jsonPath("$.field").value("seeds"))
                .andExpect(jsonPath("$.detail").value(Matchers.containsString("particle-beam updates")))
                .andExpect(jsonPath("$.detail").value(Matchers.containsString("at most 1.0e+10")));
        assertThat(queue.freePlaces()).isEqualTo(free);
    }

    @Test
    void overTheRecordingBudget_isRefused() throws Exception {
        mvc.perform(post("/api/s/" + view + "/batches")
                        .contentType(MediaType.APPLICATION_JSON)
                        .content("{\"seedCount\":1,\"recordFrames\":true}"))
                .andExpect(status().isUnprocessableContent())
                .andExpect(jsonPath("$.field").value("recordFrames"));
    }

    @Test
    void oneScenario_cannotHoldMoreThanItsShareOfPlaces() throws Exception {
        executor.holdRuns();
        for (int i = 0; i < 2; i++) {
            mvc.perform(post("/api/s/" + view + "/batches")
                            .contentType(MediaType.APPLICATION_JSON)
                            .content("{\"seedCount\":1}"))
                    .andExpect(status().isAccepted());
        }
        mvc.perform(post("/api/s/" + view + "/batches")
                        .contentType(MediaType.APPLICATION_JSON)
                        .content("{\"seedCount\":1}"))
                .andExpect(status().isUnprocessableContent())
                .andExpect(jsonPath("$.detail").value(Matchers.containsString("2 run(s) queued or running")));
        executor.release();
    }
}
