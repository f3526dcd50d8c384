package dev.driftlab.app.suites;

import dev.driftlab.app.scenarios.ScenarioStore;
import dev.driftlab.app.sharing.ShareLinks;
import dev.driftlab.scenario.Profile;
import dev.driftlab.scenario.ScenarioException;
import dev.driftlab.scenario.SuiteFile;
import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;
import org.springframework.core.io.Resource;
import org.springframework.core.io.support.PathMatchingResourcePatternResolver;
import org.springframework.stereotype.Component;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;

/**
 * The packaged suite and profiles ({@code sample-projects/suites/}): the profiles are offered on
 * the suite forms, and the suite is turned into a stored suite of the loaded sample scenarios.
 */
@Component
public class SuiteSamples {

    private static final Logger LOG = LoggerFactory.getLogger(SuiteSamples.class);
    private static final JsonMapper MAPPER = JsonMapper.builder().build();

    /** A packaged profile: file name and document. */
    public record ShippedProfile(String file, String name, String description, String json) {}

    private final Map<String, ShippedProfile> profiles = new LinkedHashMap<>();
    private final Map<String, String> suites = new LinkedHashMap<>();

    SuiteSamples() {
        PathMatchingResourcePatternResolver resolver = new PathMatchingResourcePatternResolver();
        try {
            for (Resource r : resolver.getResources("classpath*:sample-projects/suites/*.json")) {
                String file = Optional.ofNullable(r.getFilename()).orElse("");
                String json;
                try (InputStream in = r.getInputStream()) {
                    json = new String(in.readAllBytes(), StandardCharsets.UTF_8);
                }
                if (file.endsWith(".profile.json")) {
                    try {
                        Profile p = Profile.read(json);
                        profiles.put(file, new ShippedProfile(file, p.name(), p.description(), p.toJson()));
                    } catch (ScenarioException e) {
                        LOG.warn("packaged profile {} does not read: {}", file, e.getMessage());
                    }
                } else if (file.endsWith(".suite.json")) {
                    suites.put(file, json);
                }
            }
        } catch (IOException e) {
            throw new UncheckedIOException("cannot read the packaged suites", e);
        }
    }

    /** The packaged profiles, by file name. */
    public List<ShippedProfile> profiles() {
        return List.copyOf(profiles.values());
    }

    /** A packaged profile by file name. */
    public Optional<ShippedProfile> profile(String file) {
        return Optional.ofNullable(profiles.get(file));
    }

    /** File names of the packaged suites. */
    public List<String> suiteFiles() {
        return List.copyOf(suites.keySet());
    }

    /**
     * A packaged suite as a web suite over the loaded samples: each {@code ../NAME.json} entry
     * becomes the sample scenario loaded from that file (by its view link), each profile file its
     * document. Empty when a sample it names was not loaded.
     */
    public Optional<SuiteDocument> asDocument(String file, ScenarioStore store, ShareLinks links) {
        String json = suites.get(file);
        if (json == null) {
            return Optional.empty();
        }
        SuiteFile suite;
        try {
            suite = SuiteFile.read(json);
        } catch (ScenarioException e) {
            LOG.warn("packaged suite {} does not read: {}", file, e.getMessage());
            return Optional.empty();
        }
        Map<String, Long> loaded = store.sampleScenarios();
        List<SuiteDocument.Entry> entries = new ArrayList<>();
        for (SuiteFile.Entry e : suite.scenarios()) {
            String name = e.file().substring(e.file().lastIndexOf('/') + 1);
            Long id = loaded.get(name);
            if (id == null) {
                return Optional.empty();
            }
            Optional<String> view = links.current(id).view();
            if (view.isEmpty()) {
                return Optional.empty();
            }
            entries.add(new SuiteDocument.Entry(
                    view.get(), null, e.seeds().isPresent() ? e.seeds().getAsInt() : null));
        }
        List<JsonNode> docs = new ArrayList<>();
        for (String p : suite.profiles()) {
            ShippedProfile sp = profiles.get(p.substring(p.lastIndexOf('/') + 1));
            if (sp == null) {
                return Optional.empty();
            }
            docs.add(MAPPER.readTree(sp.json()));
        }
        return Optional.of(new SuiteDocument(suite.name(), suite.description(), suite.seeds(), 1L, entries, docs));
    }
}
