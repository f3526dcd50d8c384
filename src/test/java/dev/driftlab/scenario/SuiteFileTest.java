package dev.driftlab.scenario;

import static org.assertj.core.api.Assertions.assertThat;

import com.networknt.schema.InputFormat;
import com.networknt.schema.Schema;
import com.networknt.schema.SchemaRegistry;
import com.networknt.schema.SpecificationVersion;
import java.io.InputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;

/** Suite and profile files: reading, refusals with the field's path, applying, and their schemas. */
class SuiteFileTest {

    private static final Path SUITES = Path.of("sample-projects/suites");

    private static List<Problem> problems(Runnable r) {
        try {
            r.run();
        } catch (ScenarioException e) {
            return e.problems();
        }
        throw new AssertionError("expected a refusal");
    }

    @Test
    void sampleSuite_readsWithItsFourScenariosAndTwoProfiles() throws Exception {
        SuiteFile s = SuiteFile.read(Files.readString(SUITES.resolve("all-samples.suite.json")));

        assertThat(s.scenarios()).hasSize(4);
        assertThat(s.scenarios().get(2).seedsOr(s.seeds())).isEqualTo(20);
        assertThat(s.scenarios().get(0).seedsOr(s.seeds())).isEqualTo(10);
        for (SuiteFile.Entry e : s.scenarios()) {
            assertThat(SUITES.resolve(e.file())).isRegularFile();
        }
        assertThat(s.profiles()).hasSize(2);
    }

    @Test
    void sampleProfiles_leaveEverySampleValid_andChangeWhatTheySay() throws Exception {
        SuiteFile s = SuiteFile.read(Files.readString(SUITES.resolve("all-samples.suite.json")));
        for (String pf : s.profiles()) {
            Profile p = Profile.read(Files.readString(SUITES.resolve(pf)));
            for (SuiteFile.Entry e : s.scenarios()) {
                Scenario base = ScenarioFiles.load(Files.readString(SUITES.resolve(e.file())));
                Scenario changed = p.apply(base).orThrow();
                assertThat(changed.variants()).isEmpty();
                assertThat(changed.site()).isEqualTo(base.site());
                if (p.name().equals("fewer particles")) {
                    assertThat(changed.localizer().particles().count()).isEqualTo(100);
                    assertThat(changed.rangefinder()).isEqualTo(base.rangefinder());
                } else {
                    assertThat(changed.rangefinder().rangeSigma()).isEqualTo(0.25);
                    assertThat(changed.rangefinder().dropout()).isEqualTo(0.2);
                    assertThat(changed.rangefinder().beams())
                            .isEqualTo(base.rangefinder().beams());
                    assertThat(changed.localizer()).isEqualTo(base.localizer());
                }
            }
        }
    }

    @Test
    void profile_readsBackWhatItWrites() {
        Profile p = Profile.read("{\"format\":\"driftlab-profile/1\",\"name\":\" n \",\"description\":\"d\","
                + "\"localizer\":{\"particles\":{\"count\":100}},\"robot\":{\"wheelNoise\":0.05}}");

        assertThat(p.name()).isEqualTo("n");
        assertThat(p.changedFields()).containsExactly("robot.wheelNoise = 0.05", "localizer.particles.count = 100");
        assertThat(Profile.read(p.toJson())).isEqualTo(p);
    }

    @Test
    void profile_refusesUnknownTopLevelKeys_wrongShapes_andNoChange() {
        assertThat(problems(() -> Profile.read(
                        "{\"format\":\"driftlab-profile/1\",\"name\":\"x\",\"route\":{},\"rangefinder\":3}")))
                .extracting(Problem::path)
                .containsExactlyInAnyOrder("route", "rangefinder");
        assertThat(problems(() -> Profile.read("{\"format\":\"driftlab-profile/1\",\"name\":\"x\"}")))
                .extracting(Problem::message)
                .anySatisfy(m -> assertThat(m).contains("changes nothing"));
        assertThat(problems(() ->
                        Profile.read("{\"format\":\"driftlab-suite/1\",\"name\":\"x\",\"robot\":{\"maxSpeed\":1}}")))
                .extracting(Problem::path)
                .containsExactly("format");
    }

    @Test
    void profile_fieldThatDoesNotExist_isAFormatProblemAtItsPath() {
        Profile p = Profile.read(
                "{\"format\":\"driftlab-profile/1\",\"name\":\"x\"," + "\"localizer\":{\"particles\":{\"cuont\":10}}}");

        assertThat(p.formatProblems(Scenarios.corridor().build()))
                .extracting(Problem::path)
                .containsExactly("localizer.particles.cuont");
    }

    @Test
    void suite_refusesAnEmptyList_aRepeatedFile_badSeeds_andUnknownKeys() {
        assertThat(problems(() -> SuiteFile.read("{\"format\":\"driftlab-suite/1\",\"name\":\"s\",\"scenarios\":[]}")))
                .extracting(Problem::path)
                .containsExactly("scenarios");
        assertThat(problems(() -> SuiteFile.read("{\"format\":\"driftlab-suite/1\",\"name\":\"s\"}")))
                .extracting(Problem::path)
                .containsExactly("scenarios");
        assertThat(problems(() -> SuiteFile.read("{\"format\":\"driftlab-suite/1\",\"name\":\"s\",\"seeds\":0,"
                        + "\"scenarios\":[{\"file\":\"a.json\"},{\"file\":\"a.json\",\"seeds\":-1,\"pin\":3}]}")))
                .extracting(Problem::path)
                .containsExactlyInAnyOrder("seeds", "scenarios[1].seeds", "scenarios[1].pin", "scenarios[1].file");
    }

    @Test
    void schemas_acceptTheSamples_andRefuseWhatTheReadersRefuse() throws Exception {
        Schema suite = schema("suite-1");
        Schema profile = schema("profile-1");

        assertThat(suite.validate(Files.readString(SUITES.resolve("all-samples.suite.json")), InputFormat.JSON))
                .isEmpty();
        for (String f : List.of("noisier-rangefinder.profile.json", "fewer-particles.profile.json")) {
            assertThat(profile.validate(Files.readString(SUITES.resolve(f)), InputFormat.JSON))
                    .isEmpty();
        }
        assertThat(suite.validate(
                        "{\"format\":\"driftlab-suite/1\",\"name\":\"s\",\"scenarios\":[]}", InputFormat.JSON))
                .isNotEmpty();
        assertThat(profile.validate(
                        "{\"format\":\"driftlab-profile/1\",\"name\":\"x\",\"rangefinder\":{\"rangeSgma\":1}}",
                        InputFormat.JSON))
                .isNotEmpty();
        assertThat(profile.validate("{\"format\":\"driftlab-profile/1\",\"name\":\"x\"}", InputFormat.JSON))
                .isNotEmpty();
    }

    @Test
    void profileSchema_partsAreTheScenarioSchemasOwn() throws Exception {
        JsonMapper m = JsonMapper.builder().build();
        JsonNode scenario = m.readTree(resource("scenario-1"));
        JsonNode profile = m.readTree(resource("profile-1"));
        for (String part : Profile.PARTS) {
            assertThat(profile.path("properties").path(part))
                    .isEqualTo(scenario.path("properties").path(part));
        }
        for (var e : profile.path("$defs").properties()) {
            assertThat(e.getValue()).isEqualTo(scenario.path("$defs").path(e.getKey()));
        }
    }

    private static String resource(String name) throws Exception {
        try (InputStream in = SuiteFileTest.class.getResourceAsStream("/static/schema/" + name + ".schema.json")) {
            assertThat(in).as(name).isNotNull();
            return new String(in.readAllBytes(), java.nio.charset.StandardCharsets.UTF_8);
        }
    }

    private static Schema schema(String name) throws Exception {
        return SchemaRegistry.withDefaultDialect(SpecificationVersion.DRAFT_2020_12)
                .getSchema(resource(name), InputFormat.JSON);
    }
}
