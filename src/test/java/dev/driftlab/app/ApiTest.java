package dev.driftlab.app;

import static org.assertj.core.api.Assertions.assertThat;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.get;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.post;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.header;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.jsonPath;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.status;

import dev.driftlab.app.runs.RunQueue;
import dev.driftlab.app.runs.ScriptedTrialExecutor;
import dev.driftlab.scenario.Scenarios;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.http.MediaType;
import org.springframework.test.context.TestPropertySource;
import org.springframework.test.web.servlet.MockMvc;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;

/** The JSON API end to end over the web slice: what a CI job does, and what it is refused. */
@WebSlice
@TestPropertySource(properties = {"driftlab.runs.workers=1", "driftlab.runs.queue-capacity=1"})
class ApiTest {

    @Autowired
    MockMvc mvc;

    @Autowired
    ScriptedTrialExecutor executor;

    @Autowired
    RunQueue queue;

    final JsonMapper json = JsonMapper.builder().build();
    String edit;
    String view;

    @BeforeEach
    void importOne() throws Exception {
        executor.reset();
        Polling.until("the run queue emptying", () -> queue.freePlaces() == queue.places());
        JsonNode created = call(
                post("/api/scenarios")
                        .param("author", "ci")
                        .contentType(MediaType.APPLICATION_JSON)
                        .content(Scenarios.corridor().withName("API one").json()),
                201);
        edit = created.get("editToken").stringValue();
        view = created.get("viewToken").stringValue();
    }

    private JsonNode call(org.springframework.test.web.servlet.RequestBuilder r, int status) throws Exception {
        String body = mvc.perform(r)
                .andExpect(status().is(status))
                .andReturn()
                .getResponse()
                .getContentAsString();
        return body.isEmpty() ? json.nullNode() : json.readTree(body);
    }

    @Test
    void import_invalidDocument_is422_withEveryProblemAndItsPath() throws Exception {
        JsonNode p = call(
                post("/api/scenarios")
                        .contentType(MediaType.APPLICATION_JSON)
                        .content("{\"format\": \"driftlab-scenario/1\"}"),
                422);

        assertThat(p.get("problems").size()).isGreaterThan(1);
        assertThat(p.get("problems").get(0).get("path").stringValue()).isNotBlank();
    }

    @Test
    void scenario_revisions_save_conflict_compare_export() throws Exception {
        assertThat(call(get("/api/s/" + view), 200).get("access").stringValue()).isEqualTo("view");
        assertThat(call(get("/api/s/" + edit), 200).get("variants").get(0).stringValue())
                .isEqualTo("base");

        JsonNode saved = call(
                post("/api/s/" + edit + "/revisions")
                        .param("base", "1")
                        .param("author", "ci")
                        .param("message", "renamed")
                        .contentType(MediaType.APPLICATION_JSON)
                        .content(Scenarios.corridor().withName("API two").json()),
                201);
        assertThat(saved.get("number").asInt()).isEqualTo(2);

        JsonNode conflict = call(
                post("/api/s/" + edit + "/revisions")
                        .param("base", "1")
                        .contentType(MediaType.APPLICATION_JSON)
                        .content(Scenarios.corridor().withName("late").json()),
                409);
        assertThat(conflict.get("latestRevision").asInt()).isEqualTo(2);
        assertThat(conflict.get("detail").stringValue()).contains("Not saved");

        assertThat(call(get("/api/s/" + view + "/revisions"), 200).size()).isEqualTo(2);
        assertThat(call(get("/api/s/" + view + "/revisions/1"), 200)
                        .get("author")
                        .stringValue())
                .isEqualTo("ci");
        JsonNode diff =
                call(get("/api/s/" + view + "/compare").param("from", "1").param("to", "2"), 200);
        assertThat(diff.toString()).contains("Name and description").contains("API two");
        mvc.perform(get("/api/s/" + view + "/export"))
                .andExpect(jsonPath("$.name").value("API two"));
        mvc.perform(get("/api/s/" + view + "/revisions/1/document"))
                .andExpect(jsonPath("$.name").value("API one"));
        mvc.perform(get("/api/s/" + view + "/compare").param("from", "x").param("to", "2"))
                .andExpect(status().isBadRequest())
                .andExpect(jsonPath("$.detail").value("from: not a valid value"));
    }

    @Test
    void links_duplicate_samples_listing() throws Exception {
        assertThat(call(get("/api/s/" + edit + "/links"), 200).get("view").stringValue())
                .isEqualTo(view);
        String fresh = call(post("/api/s/" + edit + "/links/view/reissue"), 200)
                .get("token")
                .stringValue();
        mvc.perform(get("/api/s/" + view)).andExpect(status().isNotFound());
        mvc.perform(get("/api/s/" + fresh)).andExpect(status().isOk());
        assertThat(call(post("/api/s/" + edit + "/links/view/revoke"), 200)
                        .get("view")
                        .isNull())
                .isTrue();

        JsonNode copy = call(post("/api/s/" + edit + "/duplicate"), 201);
        assertThat(call(get("/api/s/" + copy.get("viewToken").stringValue()), 200)
                        .get("name")
                        .stringValue())
                .isEqualTo("Copy of API one");

        assertThat(call(get("/api/samples"), 200).size()).isGreaterThanOrEqualTo(4);
        call(post("/api/samples/storage-hall-kidnap.json/copy"), 201);
        mvc.perform(post("/api/samples/none.json/copy")).andExpect(status().isNotFound());
        assertThat(call(get("/api/scenarios").param("q", "API one"), 200).size())
                .isGreaterThanOrEqualTo(1);
    }

    @Test
    void batch_submit_poll_result_frames_runLink_cancel_busy() throws Exception {
        JsonNode batch = call(
                post("/api/s/" + view + "/batches")
                        .contentType(MediaType.APPLICATION_JSON)
                        .content("{\"variants\":[\"base\"],\"firstSeed\":5,\"seedCount\":3,\"recordFrames\":true}"),
                202);
        String key = batch.get("batch").stringValue();
        JsonNode status = batch;
        for (int i = 0; i < 2000 && !status.get("finished").asBoolean(); i++) {
            Thread.sleep(10);
            status = call(get("/api/s/" + view + "/batches/" + key), 200);
        }
        JsonNode run = status.get("runs").get(0);
        assertThat(run.get("state").stringValue()).isEqualTo("done");
        assertThat(run.get("seeds").toString()).isEqualTo("[5,6,7]");
        long id = run.get("id").asLong();
        assertThat(call(get("/api/s/" + view + "/runs/" + id + "/result"), 200)
                        .get("trials")
                        .asInt())
                .isEqualTo(3);
        assertThat(call(get("/api/s/" + view + "/runs/" + id + "/frames"), 200).toString())
                .isEqualTo("[0,1,2]");
        assertThat(mvc.perform(get("/api/s/" + view + "/runs/" + id + "/frames/2"))
                        .andReturn()
                        .getResponse()
                        .getContentAsString())
                .isEqualTo("frames of seed 7");
        String runToken = run.get("viewToken").stringValue();
        assertThat(call(get("/api/r/" + runToken), 200).get("id").asLong()).isEqualTo(id);
        assertThat(call(get("/api/r/" + runToken + "/result"), 200)
                        .get("trials")
                        .asInt())
                .isEqualTo(3);
        assertThat(call(get("/api/s/" + view + "/runs"), 200).size()).isEqualTo(1);

        mvc.perform(post("/api/s/" + view + "/runs/" + id + "/replay").param("seed", "9"))
                .andExpect(status().isUnprocessableContent())
                .andExpect(jsonPath("$.field").value("seed"));
        long replay = call(post("/api/s/" + view + "/runs/" + id + "/replay").param("seed", "6"), 202)
                .get("id")
                .asLong();
        JsonNode replayed = call(get("/api/s/" + view + "/runs/" + replay), 200);
        for (int i = 0; i < 2000 && !replayed.get("state").stringValue().equals("done"); i++) {
            Thread.sleep(10);
            replayed = call(get("/api/s/" + view + "/runs/" + replay), 200);
        }
        assertThat(replayed.get("seeds").toString()).isEqualTo("[6]");
        assertThat(call(get("/api/s/" + view + "/runs/" + replay + "/frames"), 200)
                        .toString())
                .isEqualTo("[0]");

        executor.holdRuns();
        long held = call(post("/api/s/" + view + "/runs/" + id + "/rerun"), 202)
                .get("id")
                .asLong();
        call(
                post("/api/s/" + view + "/batches")
                        .contentType(MediaType.APPLICATION_JSON)
                        .content("{}"),
                202);
        mvc.perform(post("/api/s/" + view + "/batches")
                        .contentType(MediaType.APPLICATION_JSON)
                        .content("{}"))
                .andExpect(status().isServiceUnavailable())
                .andExpect(header().string("Retry-After", "10"))
                .andExpect(jsonPath("$.detail").value(org.hamcrest.Matchers.containsString("try again")));
        mvc.perform(post("/api/s/" + view + "/batches")
                        .contentType(MediaType.APPLICATION_JSON)
                        .content("{\"variants\":[\"nope\"]}"))
                .andExpect(status().isUnprocessableContent())
                .andExpect(jsonPath("$.field").value("variants"));
        mvc.perform(post("/api/s/" + view + "/batches")
                        .contentType(MediaType.APPLICATION_JSON)
                        .content("{\"seeds\":[1,1,1,1]}"))
                .andExpect(status().isUnprocessableContent())
                .andExpect(jsonPath("$.field").value("seeds"))
                .andExpect(jsonPath("$.detail").value(org.hamcrest.Matchers.containsString("seed 1 is given 4 times")));
        mvc.perform(post("/api/s/" + view + "/batches")
                        .contentType(MediaType.APPLICATION_JSON)
                        .content("{\"firstSeed\":9223372036854775806,\"seedCount\":5}"))
                .andExpect(status().isUnprocessableContent())
                .andExpect(jsonPath("$.field").value("firstSeed"));

        mvc.perform(post("/api/s/" + view + "/runs/" + held + "/cancel"))
                .andExpect(status().isForbidden())
                .andExpect(jsonPath("$.detail").value(org.hamcrest.Matchers.containsString("view link")));
        assertThat(call(get("/api/s/" + view + "/runs/" + held), 200)
                        .get("state")
                        .stringValue())
                .isNotEqualTo("cancelled");
        call(post("/api/s/" + edit + "/runs/" + held + "/cancel"), 200);
        String state = "";
        for (int i = 0; i < 2000 && !state.equals("cancelled"); i++) {
            Thread.sleep(10);
            state = call(get("/api/s/" + view + "/runs/" + held), 200)
                    .get("state")
                    .stringValue();
        }
        assertThat(state).isEqualTo("cancelled");
        executor.release();
    }
}
