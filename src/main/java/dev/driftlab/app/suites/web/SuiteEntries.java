package dev.driftlab.app.suites.web;

import dev.driftlab.app.scenarios.ScenarioStore;
import dev.driftlab.app.sharing.ShareLinks;
import dev.driftlab.app.suites.SuiteDocument;
import dev.driftlab.scenario.Profile;
import dev.driftlab.scenario.ScenarioException;
import java.util.ArrayList;
import java.util.List;
import org.springframework.stereotype.Component;
import tools.jackson.databind.JsonNode;

/** A suite document's scenarios and profiles as the suite pages list them (current page and older revisions). */
@Component
public final class SuiteEntries {

    /** An entry of the suite as the pages show it; revision and seeds empty when not set. */
    record EntryRow(int index, String link, String name, String revision, String seeds) {}

    /**
     * A profile as the pages show it.
     *
     * @param name its name (the column heading)
     * @param description what it is for, may be empty
     * @param changes every changed field with its value, {@code rangefinder.rangeSigma = 0.25}
     */
    record ProfileRow(String name, String description, List<String> changes) {}

    private final ScenarioStore scenarios;
    private final ShareLinks links;

    SuiteEntries(ScenarioStore scenarios, ShareLinks links) {
        this.scenarios = scenarios;
        this.links = links;
    }

    /** Each scenario by its current name (or a note when its link no longer opens it). */
    List<EntryRow> of(SuiteDocument d) {
        List<EntryRow> out = new ArrayList<>();
        for (int i = 0; i < d.scenarios().size(); i++) {
            SuiteDocument.Entry e = d.scenarios().get(i);
            String name = links.resolve(e.link())
                    .map(gr -> scenarios.view(gr.scenarioId()).head().name())
                    .orElse("(this scenario's link no longer opens it)");
            out.add(new EntryRow(
                    i,
                    e.link(),
                    name,
                    e.revision() == null ? "" : e.revision().toString(),
                    e.seeds() == null ? "" : e.seeds().toString()));
        }
        return out;
    }

    /** Each profile with its changed fields; a document that does not read is shown as it is stored. */
    static List<ProfileRow> profiles(SuiteDocument d) {
        List<ProfileRow> out = new ArrayList<>();
        for (int j = 0; j < d.profiles().size(); j++) {
            JsonNode n = d.profiles().get(j);
            try {
                Profile p = Profile.read(String.valueOf(n));
                out.add(new ProfileRow(p.name(), p.description(), p.changedFields()));
            } catch (ScenarioException e) {
                out.add(new ProfileRow(
                        "profile " + (j + 1), "(does not read as a profile)", List.of(String.valueOf(n))));
            }
        }
        return out;
    }
}
