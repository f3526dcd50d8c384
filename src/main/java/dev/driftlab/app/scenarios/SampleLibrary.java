package dev.driftlab.app.scenarios;

import dev.driftlab.report.SitePlanSvg;
import dev.driftlab.scenario.ScenarioFiles;
import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import java.util.Optional;
import org.springframework.core.io.Resource;
import org.springframework.core.io.support.PathMatchingResourcePatternResolver;
import org.springframework.stereotype.Component;

/**
 * The sample scenarios packaged in the jar under {@code sample-projects/}, read and validated once
 * at start-up so the app works from any folder.
 */
@Component
public class SampleLibrary {

    private final List<Sample> samples;

    SampleLibrary() {
        this(new PathMatchingResourcePatternResolver());
    }

    SampleLibrary(PathMatchingResourcePatternResolver resolver) {
        try {
            Resource[] found = resolver.getResources("classpath*:sample-projects/*.json");
            List<Sample> list = new ArrayList<>();
            for (Resource r : found) {
                try (InputStream in = r.getInputStream()) {
                    String json = new String(in.readAllBytes(), StandardCharsets.UTF_8);
                    String file = Optional.ofNullable(r.getFilename()).orElse("sample.json");
                    list.add(Sample.of(file, json));
                }
            }
            list.sort(Comparator.comparing(Sample::file));
            this.samples = List.copyOf(list);
        } catch (IOException e) {
            throw new UncheckedIOException("cannot read the packaged sample projects", e);
        }
    }

    /** All samples, sorted by file name. */
    public List<Sample> all() {
        return samples;
    }

    /** A sample by file name. */
    public Optional<Sample> byFile(String file) {
        return samples.stream().filter(s -> s.file().equals(file)).findFirst();
    }

    /**
     * One packaged sample with its check result and drawing.
     *
     * @param file file name, e.g. {@code storage-hall-kidnap.json}
     * @param json the document as packaged
     * @param checked read and validation result
     * @param svg site plan drawing, empty when the document could not be read
     */
    public record Sample(String file, String json, ScenarioFiles.Checked checked, String svg) {
        static Sample of(String file, String json) {
            ScenarioFiles.Checked checked = ScenarioFiles.check(json);
            String svg = checked.scenario().map(SitePlanSvg::render).orElse("");
            return new Sample(file, json, checked, svg);
        }

        /** Display name: the scenario's name, or the file name when unreadable. */
        public String name() {
            return checked.scenario().map(s -> s.name()).orElse(file);
        }

        /** The scenario's description, or empty. */
        public String description() {
            return checked.scenario().map(s -> s.description()).orElse("");
        }
    }
}
