package dev.driftlab.scenario;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import net.jqwik.api.Arbitraries;
import net.jqwik.api.Arbitrary;
import net.jqwik.api.Combinators;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.Provide;

/**
 * Fuzzes the scenario reader and validator with random text and with mutated copies of valid
 * documents. Whatever comes in, the only exception allowed out is {@link ScenarioException}, and
 * {@link ScenarioFiles#check} never throws at all.
 */
class ScenarioReaderProperties {

    private static final List<String> SEEDS = loadSeeds();

    private static List<String> loadSeeds() {
        try (var files = Files.list(Path.of("sample-projects"))) {
            return files.filter(p -> p.toString().endsWith(".json"))
                    .sorted()
                    .map(p -> {
                        try {
                            return Files.readString(p);
                        } catch (IOException e) {
                            throw new UncheckedIOException(e);
                        }
                    })
                    .toList();
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    private static void readOnlyFailsCleanly(String doc) {
        try {
            Scenario s = ScenarioJson.read(doc);
            ScenarioValidator.validate(s);
        } catch (ScenarioException e) {
            assertThat(e.problems()).isNotEmpty();
            assertThat(e.problems()).allSatisfy(p -> assertThat(p.message()).isNotBlank());
        }
        ScenarioFiles.Checked checked = ScenarioFiles.check(doc);
        assertThat(checked.report()).isNotNull();
    }

    @Property(tries = 300)
    void randomText_neverEscapesAsAnythingElse(@ForAll("jsonish") String doc) {
        readOnlyFailsCleanly(doc);
    }

    @Property(tries = 600)
    void mutatedSample_neverEscapesAsAnythingElse(@ForAll("mutated") String doc) {
        readOnlyFailsCleanly(doc);
    }

    @Provide
    Arbitrary<String> jsonish() {
        Arbitrary<String> tokens = Arbitraries.of(
                "{",
                "}",
                "[",
                "]",
                ",",
                ":",
                "\"format\"",
                "\"driftlab-scenario/1\"",
                "\"site\"",
                "\"rooms\"",
                "\"outline\"",
                "\"route\"",
                "\"start\"",
                "\"x\"",
                "1e400",
                "-0",
                "NaN",
                "null",
                "true",
                "\"\"",
                "0.5",
                "9999999999999999999999",
                "\"kind\"",
                "\"kidnap\"");
        return tokens.list().ofMaxSize(60).map(l -> String.join("", l));
    }

    @Provide
    Arbitrary<String> mutated() {
        Arbitrary<String> seed = Arbitraries.of(SEEDS);
        Arbitrary<Integer> position = Arbitraries.integers().between(0, 1_000_000);
        Arbitrary<String> insert = Arbitraries.of(
                "",
                "0",
                "-1",
                "1e308",
                "1e400",
                "-1e400",
                "\"",
                "null",
                "[]",
                "{}",
                "[[0,0],[1,1],[0,1],[1,0]]",
                "\"x\"",
                "true",
                "99999999999",
                "0.000000001",
                ",\"extra\":1",
                "\"closed\"",
                "\"kidnap\"");
        Arbitrary<Integer> cut = Arbitraries.integers().between(0, 40);
        return Combinators.combine(seed, position, insert, cut).as((s, pos, ins, len) -> {
            int at = pos % (s.length() + 1);
            int end = Math.min(s.length(), at + len);
            return s.substring(0, at) + ins + s.substring(end);
        });
    }
}
