package dev.driftlab.app.editor.web;

import static org.assertj.core.api.Assertions.assertThat;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.csrf;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.get;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.multipart;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.post;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.redirectedUrlPattern;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.status;

import dev.driftlab.app.WebSlice;
import dev.driftlab.app.scenarios.ScenarioStore;
import dev.driftlab.geometry.Segment;
import dev.driftlab.scenario.DoorState;
import dev.driftlab.scenario.Scenarios;
import dev.driftlab.site.WallPieces;
import java.awt.image.BufferedImage;
import java.io.ByteArrayOutputStream;
import java.util.List;
import javax.imageio.ImageIO;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.http.MediaType;
import org.springframework.mock.web.MockMultipartFile;
import org.springframework.test.web.servlet.MockMvc;
import org.springframework.test.web.servlet.RequestBuilder;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;
import tools.jackson.databind.node.ObjectNode;

@WebSlice
class EditorPagesTest {

    private static final JsonMapper JSON = JsonMapper.builder().build();

    @Autowired
    MockMvc mvc;

    @Autowired
    ScenarioStore store;

    ScenarioStore.Created c;
    String document;

    @BeforeEach
    void scenario() {
        document = Scenarios.corridor().withName("Editor test").json();
        c = store.create(document, "Ana", "start");
    }

    private String body(RequestBuilder r, int status) throws Exception {
        return mvc.perform(r)
                .andExpect(status().is(status))
                .andReturn()
                .getResponse()
                .getContentAsString();
    }

    private String withDoorWidth(double width) {
        ObjectNode root = (ObjectNode) JSON.readTree(document);
        ((ObjectNode) root.path("site").path("doors").get(0)).put("width", width);
        return JSON.writeValueAsString(root);
    }

    private static byte[] png(int w, int h, int[][] darkCells) throws Exception {
        BufferedImage img = new BufferedImage(w, h, BufferedImage.TYPE_INT_RGB);
        for (int y = 0; y < h; y++) {
            for (int x = 0; x < w; x++) {
                img.setRGB(x, y, 0xffffff);
            }
        }
        for (int[] cell : darkCells) {
            img.setRGB(cell[0], cell[1], 0x101010);
        }
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        ImageIO.write(img, "png", out);
        return out.toByteArray();
    }

    @Test
    void editorPage_withEditLink_carriesDocumentToolsSettingsShareAndRuns() throws Exception {
        String html = body(get("/s/" + c.editToken() + "/editor"), 200);

        assertThat(html)
                .contains("id=\"ed-plan\"")
                .contains("data-editable=\"true\"")
                .contains("data-base=\"1\"");
        assertThat(html).contains("driftlab-scenario/1").contains("Editor test");
        // every fault kind of the one list can be added, spurious max range too, and the scripts
        // get the kinds' names and fields from the page rather than spelling them
        for (dev.driftlab.scenario.FaultKind k : dev.driftlab.scenario.FaultKind.values()) {
            assertThat(html).contains("<option value=\"" + k.fileName() + "\">" + k.label() + "</option>");
        }
        assertThat(html).contains("data-fault-kinds=\"{&quot;kinds&quot;:[{&quot;name&quot;:&quot;slip&quot;");
        assertThat(html).contains("spurious-max-range");
        // the pose a kind sets on the plan comes with the list, and the target tool is named from it
        assertThat(html)
                .contains("&quot;name&quot;:&quot;kidnap&quot;,&quot;label&quot;:&quot;kidnap&quot;,"
                        + "&quot;mark&quot;:&quot;K&quot;,&quot;target&quot;:&quot;to&quot;");
        assertThat(html).contains("data-tool=\"fault-target\"").contains(">Kidnap to</button>");
        assertThat(html)
                .contains("Save revision")
                .contains("data-tool=\"door\"")
                .contains("id=\"ed-fault-add\"");
        assertThat(html).contains("id=\"ed-share\"").contains(c.viewToken()).contains("id=\"runs\"");
        assertThat(html)
                .contains(">alpha1<")
                .contains(">z_hit<")
                .contains(">sigma_hit<")
                .contains(">lambda_short<")
                .contains(">alpha_slow<")
                .contains(">epsilon<")
                .contains("Turn noise from turning");
        assertThat(html).doesNotContain("editing is refused").contains("Simulation results do not certify safety");
        assertThat(html).contains("/assets/editor/editor.js").doesNotContain("onclick");
    }

    @Test
    void editorPage_withViewLink_isReadOnlyAndHidesTheEditLink() throws Exception {
        String html = body(get("/s/" + c.viewToken() + "/editor"), 200);

        assertThat(html).contains("editing is refused").contains("data-editable=\"false\"");
        assertThat(html)
                .doesNotContain("id=\"ed-save\"")
                .doesNotContain("data-tool=\"box-room\"")
                .doesNotContain("id=\"ed-share\"")
                .doesNotContain("id=\"ed-import\"")
                .doesNotContain(c.editToken());
        assertThat(html).contains("<fieldset disabled=\"disabled\">");
    }

    @Test
    void editorPage_unknownToken_isNotFound() throws Exception {
        body(get("/s/AAAAAAAAAAAAAAAAAAAAAA/editor"), 404);
    }

    @Test
    void newInEditor_storesTheStarterAndOpensItsEditor() throws Exception {
        mvc.perform(post("/editor/new").with(csrf()))
                .andExpect(status().is3xxRedirection())
                .andExpect(redirectedUrlPattern("/s/*/editor"));
    }

    @Test
    void check_validDocument_isOk() throws Exception {
        String json = body(
                post("/s/" + c.editToken() + "/editor/check")
                        .with(csrf())
                        .contentType(MediaType.APPLICATION_JSON)
                        .content(document),
                200);

        assertThat(JSON.readTree(json).path("ok").asBoolean()).isTrue();
    }

    @Test
    void check_returnsTheWallPiecesTheSiteCompilerCuts() throws Exception {
        String json = body(
                post("/s/" + c.viewToken() + "/editor/check")
                        .with(csrf())
                        .contentType(MediaType.APPLICATION_JSON)
                        .content(document),
                200);

        JsonNode walls = JSON.readTree(json).path("walls");
        List<Segment> expected = WallPieces.of(Scenarios.corridor().build().site(), d -> DoorState.OPEN);
        assertThat(walls).hasSize(expected.size());
        for (int i = 0; i < expected.size(); i++) {
            Segment e = expected.get(i);
            JsonNode w = walls.get(i);
            assertThat(new double[] {
                        w.get(0).asDouble(),
                        w.get(1).asDouble(),
                        w.get(2).asDouble(),
                        w.get(3).asDouble()
                    })
                    .containsExactly(e.a().x(), e.a().y(), e.b().x(), e.b().y());
        }
        // the corridor's door at x = 3 opens the corridor's and the side room's wall: 8 edges, 2 cut
        assertThat(walls).hasSize(10);
    }

    @Test
    void check_unreadableDocument_hasNoWalls() throws Exception {
        String json = body(
                post("/s/" + c.viewToken() + "/editor/check")
                        .with(csrf())
                        .contentType(MediaType.APPLICATION_JSON)
                        .content("{\"format\": \"driftlab-scenario/1\", \"site\": 3"),
                200);

        assertThat(JSON.readTree(json).path("walls").isNull()).isTrue();
    }

    @Test
    void check_doorOfZeroWidth_namesTheField_andStoresNothing() throws Exception {
        String json = body(
                post("/s/" + c.viewToken() + "/editor/check")
                        .with(csrf())
                        .contentType(MediaType.APPLICATION_JSON)
                        .content(withDoorWidth(0)),
                200);

        JsonNode body = JSON.readTree(json);
        assertThat(body.path("ok").asBoolean()).isFalse();
        assertThat(body.path("problems").toString()).contains("\"path\":\"site.doors[0].width\"");
        assertThat(store.history(c.scenarioId())).hasSize(1);
    }

    @Test
    void check_unreadableDocument_isAProblemNotAnError() throws Exception {
        String json = body(
                post("/s/" + c.editToken() + "/editor/check")
                        .with(csrf())
                        .contentType(MediaType.APPLICATION_JSON)
                        .content("{\"format\": \"driftlab-scenario/1\", \"site\": 3"),
                200);

        JsonNode body = JSON.readTree(json);
        assertThat(body.path("ok").asBoolean()).isFalse();
        assertThat(body.path("problems")).isNotEmpty();
        assertThat(json).doesNotContain("Exception").doesNotContain("at dev.");
    }

    @Test
    void check_withoutCsrf_isRefused() throws Exception {
        body(
                post("/s/" + c.editToken() + "/editor/check")
                        .contentType(MediaType.APPLICATION_JSON)
                        .content(document),
                403);
    }

    @Test
    void settings_withHtmx_validValue_returnsTheFormAndTheSectionToTakeOver() throws Exception {
        String html = body(
                post("/s/" + c.editToken() + "/editor/settings/robot")
                        .with(csrf())
                        .header("HX-Request", "true")
                        .param("wheelbase", "0.45")
                        .param("maxTurnRate", "120")
                        .param("document", document),
                200);

        assertThat(html).startsWith("<form").contains("id=\"settings-robot\"");
        assertThat(html).contains("data-section-json=").contains("&quot;wheelbase&quot;:0.45");
        assertThat(html).contains("&quot;maxTurnRate&quot;:120.0").contains("Taken into the scenario");
        assertThat(html).doesNotContain("<html");
    }

    @Test
    void settings_notANumber_namesTheFieldAndTakesNothing() throws Exception {
        String html = body(
                post("/s/" + c.editToken() + "/editor/settings/robot")
                        .with(csrf())
                        .header("HX-Request", "true")
                        .param("wheelbase", "wide<script>")
                        .param("document", document),
                200);

        assertThat(html).contains("robot.wheelbase: &quot;wide&lt;script&gt;&quot; is not a number");
        assertThat(html).doesNotContain("data-section-json").doesNotContain("<script>");
        assertThat(html).contains("aria-invalid=\"true\"");
    }

    @Test
    void settings_outOfRange_usesTheValidatorsMessage() throws Exception {
        String html = body(
                post("/s/" + c.editToken() + "/editor/settings/localizer")
                        .with(csrf())
                        .header("HX-Request", "true")
                        .param("rangeModel_hitWeight", "1.5")
                        .param("document", document),
                200);

        assertThat(html).contains("localizer.rangeModel.hitWeight").doesNotContain("data-section-json");
        assertThat(html).contains(">z_hit<");
    }

    @Test
    void settings_flag_isYesNoOrDefault_soAnOnDefaultIsNeverTurnedOffByAccident() throws Exception {
        String off = body(
                post("/s/" + c.editToken() + "/editor/settings/localizer")
                        .with(csrf())
                        .header("HX-Request", "true")
                        .param("recovery_injection", "false")
                        .param("particles_count", "500")
                        .param("document", document),
                200);
        String untouched = body(
                post("/s/" + c.editToken() + "/editor/settings/localizer")
                        .with(csrf())
                        .header("HX-Request", "true")
                        .param("particles_count", "500")
                        .param("document", document),
                200);

        assertThat(off).contains("&quot;injection&quot;:false").contains("&quot;count&quot;:500");
        assertThat(untouched).contains("&quot;count&quot;:500").doesNotContain("&quot;injection&quot;");
    }

    @Test
    void gates_withHtmx_validRow_isTakenOver_andAFreshRowOffered() throws Exception {
        String html = body(
                post("/s/" + c.editToken() + "/editor/gates")
                        .with(csrf())
                        .header("HX-Request", "true")
                        .param("gate_0_id", "recovers")
                        .param("gate_0_metric", "recovery-time")
                        .param("gate_0_bound", "20")
                        .param("gate_0_share", "0.9")
                        .param("document", document),
                200);

        assertThat(html).startsWith("<form").contains("id=\"settings-gates\"");
        assertThat(html).contains("&quot;id&quot;:&quot;recovers&quot;").contains("&quot;bound&quot;:20.0");
        assertThat(html).contains("name=\"gate_1_id\"").contains("Taken into the scenario");
    }

    @Test
    void gates_badRow_namesTheRowAndTakesNothing() throws Exception {
        String html = body(
                post("/s/" + c.editToken() + "/editor/gates")
                        .with(csrf())
                        .header("HX-Request", "true")
                        .param("gate_0_id", "quick")
                        .param("gate_0_metric", "final-error")
                        .param("gate_0_bound", "-1")
                        .param("document", document),
                200);

        assertThat(html).contains("gates[0].bound").doesNotContain("data-section-json");
        body(post("/s/" + c.viewToken() + "/editor/gates").with(csrf()).param("document", document), 403);
    }

    @Test
    void editorPage_showsAVariantsFormWithAnEmptyBlockForANewVariant() throws Exception {
        String html = body(get("/s/" + c.editToken() + "/editor"), 200);

        assertThat(html).contains("id=\"settings-variants\"").contains("name=\"variant_0_name\"");
        assertThat(html).contains("name=\"variant_0_particles_count\"").contains("placeholder=\"base\"");
    }

    @Test
    void variants_withHtmx_newVariant_isTakenOverWithOnlyWhatItChanges() throws Exception {
        String html = body(
                post("/s/" + c.editToken() + "/editor/variants")
                        .with(csrf())
                        .header("HX-Request", "true")
                        .param("variant_0_name", "more particles")
                        .param("variant_0_particles_count", "4000")
                        .param("variant_0_recovery_injection", "false")
                        .param("variant_0_rangeModel_kind", "")
                        .param("document", document),
                200);

        assertThat(html).startsWith("<form").contains("id=\"settings-variants\"");
        String taken = org.springframework.web.util.HtmlUtils.htmlUnescape(
                html.replaceAll("(?s).*data-section-json=\"([^\"]*)\".*", "$1"));
        JsonNode variants = JSON.readTree(taken);
        assertThat(variants).hasSize(1);
        assertThat(variants.get(0).get("name").asString()).isEqualTo("more particles");
        assertThat(variants.get(0).get("localizer").toString())
                .isEqualTo("{\"particles\":{\"count\":4000},\"recovery\":{\"injection\":false}}");
        // the taken-over form offers an empty block for the next variant
        assertThat(html).contains("name=\"variant_1_name\"").contains("Taken into the scenario");
    }

    @Test
    void variants_badValueOrDuplicateName_namesTheInputAndTakesNothing() throws Exception {
        String zero = body(
                post("/s/" + c.editToken() + "/editor/variants")
                        .with(csrf())
                        .header("HX-Request", "true")
                        .param("variant_0_name", "none")
                        .param("variant_0_particles_count", "0")
                        .param("document", document),
                200);
        String twice = body(
                post("/s/" + c.editToken() + "/editor/variants")
                        .with(csrf())
                        .header("HX-Request", "true")
                        .param("variant_0_name", "base")
                        .param("variant_0_particles_count", "12x")
                        .param("document", document),
                200);

        assertThat(zero)
                .contains("variants[0].localizer.particles.count: must be at least 1, got 0")
                .contains("id=\"variant-0-particles_count-msg\"")
                .doesNotContain("data-section-json");
        assertThat(twice)
                .contains("variants[0].localizer.particles.count: &quot;12x&quot; is not a whole number")
                .doesNotContain("data-section-json");
        String dup = body(
                post("/s/" + c.editToken() + "/editor/variants")
                        .with(csrf())
                        .header("HX-Request", "true")
                        .param("variant_0_name", "base")
                        .param("document", document),
                200);
        assertThat(dup)
                .contains("variants[0].name: &quot;base&quot; is used twice")
                .contains("id=\"variant-0-name-msg\"");
        body(post("/s/" + c.viewToken() + "/editor/variants").with(csrf()).param("document", document), 403);
    }

    @Test
    void variants_clearingANameDropsThatVariant_andKeepsTheOthersAsTheyWere() throws Exception {
        ObjectNode root = (ObjectNode) JSON.readTree(document);
        root.putArray("variants")
                .add(JSON.readTree("{\"name\":\"a\",\"localizer\":{\"particles\":{\"count\":3000}}}"))
                .add(JSON.readTree("{\"name\":\"b\",\"localizer\":{\"resampling\":{\"scheme\":\"residual\"}}}"));
        String withTwo = JSON.writeValueAsString(root);

        String html = body(
                post("/s/" + c.editToken() + "/editor/variants")
                        .with(csrf())
                        .header("HX-Request", "true")
                        .param("variant_0_name", "")
                        .param("variant_0_particles_count", "3000")
                        .param("variant_1_name", "b")
                        .param("variant_1_resampling_scheme", "residual")
                        .param("variant_2_name", "")
                        .param("document", withTwo),
                200);

        assertThat(html).contains("&quot;name&quot;:&quot;b&quot;").doesNotContain("&quot;name&quot;:&quot;a&quot;");
        assertThat(html).contains("&quot;scheme&quot;:&quot;residual&quot;");
    }

    @Test
    void settings_unknownSection_isNotFound() throws Exception {
        body(
                post("/s/" + c.editToken() + "/editor/settings/wheels")
                        .with(csrf())
                        .param("document", document),
                404);
    }

    @Test
    void importImage_darkCells_becomeMergedBlocks_andNothingIsStored() throws Exception {
        // a 2 x 3 dark block at columns 1-2, rows 0-2 of a 10 x 5 image: one block, rows merged
        int[][] dark = {{1, 0}, {2, 0}, {1, 1}, {2, 1}, {1, 2}, {2, 2}, {7, 4}};
        String json = body(
                multipart("/s/" + c.editToken() + "/editor/import")
                        .file(new MockMultipartFile("image", "plan.png", "image/png", png(10, 5, dark)))
                        .param("cellSize", "0.5")
                        .param("originX", "1")
                        .param("originY", "0")
                        .with(csrf()),
                200);

        JsonNode blocks = JSON.readTree(json).path("blocks");
        assertThat(blocks).hasSize(2);
        JsonNode first = blocks.get(0).path("y1").asDouble() == 2.5 ? blocks.get(0) : blocks.get(1);
        // image rows run down, the site's y runs up: rows 0-2 of 5 cover y 1.0 to 2.5
        assertThat(first.path("x0").asDouble()).isEqualTo(1.5);
        assertThat(first.path("x1").asDouble()).isEqualTo(2.5);
        assertThat(first.path("y0").asDouble()).isEqualTo(1.0);
        assertThat(first.path("y1").asDouble()).isEqualTo(2.5);
        assertThat(JSON.readTree(json).path("extent").toString())
                .isEqualTo("{\"x0\":1.0,\"y0\":0.0,\"x1\":6.0,\"y1\":2.5}");
        assertThat(store.history(c.scenarioId())).hasSize(1);
    }

    @Test
    void importImage_binaryGreymap_readsLikeThePng_andGreyUnknownAddsNothing() throws Exception {
        // Netpbm P5 (the format is specified at netpbm.sourceforge.net/doc/pgm.html): the same dark
        // cells as the PNG test, on a background of 180, a neutral grey of our own standing for unknown space
        int[][] dark = {{1, 0}, {2, 0}, {1, 1}, {2, 1}, {1, 2}, {2, 2}, {7, 4}};
        byte[] header = "P5\n# written by a test\n10 5\n255\n".getBytes(java.nio.charset.StandardCharsets.US_ASCII);
        byte[] pgm = java.util.Arrays.copyOf(header, header.length + 50);
        java.util.Arrays.fill(pgm, header.length, pgm.length, (byte) 180);
        for (int[] d : dark) {
            pgm[header.length + d[1] * 10 + d[0]] = 0;
        }
        String json = body(
                multipart("/s/" + c.editToken() + "/editor/import")
                        .file(new MockMultipartFile("image", "map.pgm", "image/x-portable-graymap", pgm))
                        .param("cellSize", "0.5")
                        .param("originX", "1")
                        .param("originY", "0")
                        .with(csrf()),
                200);
        String fromPng = body(
                multipart("/s/" + c.editToken() + "/editor/import")
                        .file(new MockMultipartFile("image", "plan.png", "image/png", png(10, 5, dark)))
                        .param("cellSize", "0.5")
                        .param("originX", "1")
                        .param("originY", "0")
                        .with(csrf()),
                200);

        assertThat(JSON.readTree(json)).isEqualTo(JSON.readTree(fromPng));
        byte[] cut = java.util.Arrays.copyOf(pgm, pgm.length - 7);
        String refused = body(
                multipart("/s/" + c.editToken() + "/editor/import")
                        .file(new MockMultipartFile("image", "map.pgm", "image/x-portable-graymap", cut))
                        .with(csrf()),
                422);
        assertThat(refused).contains("the PGM file ends before its last pixel");
    }

    @Test
    void importImage_notAPng_isRefusedWithTheField() throws Exception {
        String json = body(
                multipart("/s/" + c.editToken() + "/editor/import")
                        .file(new MockMultipartFile("image", "plan.png", "image/png", "hello".getBytes()))
                        .with(csrf()),
                422);

        assertThat(JSON.readTree(json).path("message").asString())
                .isEqualTo("image: neither a PNG nor a binary PGM (P5) file");
        assertThat(store.history(c.scenarioId())).hasSize(1);
    }

    @Test
    void importImage_tooManyPixels_isRefused() throws Exception {
        String json = body(
                multipart("/s/" + c.editToken() + "/editor/import")
                        .file(new MockMultipartFile("image", "big.png", "image/png", png(2001, 2, new int[0][])))
                        .with(csrf()),
                422);

        assertThat(json).contains("2001 x 2 pixels is over the limit");
    }

    @Test
    void importImage_badCellSize_namesTheField() throws Exception {
        String json = body(
                multipart("/s/" + c.editToken() + "/editor/import")
                        .file(new MockMultipartFile("image", "p.png", "image/png", png(4, 4, new int[0][])))
                        .param("cellSize", "abc")
                        .with(csrf()),
                422);

        assertThat(JSON.readTree(json).path("field").asString()).isEqualTo("cellSize");
    }

    @Test
    void importImage_noisyImage_isCappedWithAMessage() throws Exception {
        int[][] checker = new int[2000][];
        int n = 0;
        for (int y = 0; y < 40; y++) {
            for (int x = (y % 2); x < 100; x += 2) {
                checker[n++] = new int[] {x, y};
            }
        }
        String json = body(
                multipart("/s/" + c.editToken() + "/editor/import")
                        .file(new MockMultipartFile("image", "noise.png", "image/png", png(100, 40, checker)))
                        .with(csrf()),
                422);

        assertThat(json).contains("more than 800 wall blocks");
    }

    @Test
    void viewLink_isRefusedOnEveryChangingEditorEndpoint() throws Exception {
        String v = c.viewToken();
        body(post("/s/" + v + "/editor/settings/robot").with(csrf()).param("document", document), 403);
        body(
                multipart("/s/" + v + "/editor/import")
                        .file(new MockMultipartFile("image", "p.png", "image/png", png(4, 4, new int[0][])))
                        .with(csrf()),
                403);
        body(
                post("/api/s/" + v + "/revisions")
                        .param("base", "1")
                        .contentType(MediaType.APPLICATION_JSON)
                        .content(document),
                403);
        assertThat(store.history(c.scenarioId())).hasSize(1);
    }
}
