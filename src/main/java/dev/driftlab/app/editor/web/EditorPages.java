package dev.driftlab.app.editor.web;

import dev.driftlab.app.runs.RunPanel;
import dev.driftlab.app.scenarios.ScenarioStore;
import dev.driftlab.app.sharing.Grant;
import dev.driftlab.app.sharing.ShareLinks;
import dev.driftlab.scenario.FaultKind;
import java.util.Arrays;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.stream.Collectors;
import org.springframework.stereotype.Controller;
import org.springframework.ui.Model;
import org.springframework.web.bind.annotation.GetMapping;
import org.springframework.web.bind.annotation.PathVariable;
import org.springframework.web.bind.annotation.PostMapping;
import tools.jackson.databind.json.JsonMapper;
import tools.jackson.databind.node.ArrayNode;
import tools.jackson.databind.node.ObjectNode;

/**
 * The editor page. A view link opens it read-only: the plan is drawn, but tools, saving and the
 * share panel are left out and a notice says why.
 */
@Controller
class EditorPages {

    static final int RECENT_RUNS = 5;

    /** The fault kinds for the editor's scripts, which take every kind name and field from here. */
    static final String FAULT_KINDS_JSON = faultKindsJson();

    /** The labels of the fault kinds that set a pose on the plan, for the target tool's words. */
    static final String TARGET_KINDS = Arrays.stream(FaultKind.values())
            .filter(k -> !k.target().isEmpty())
            .map(FaultKind::label)
            .collect(Collectors.joining(" or "));

    private final ScenarioStore store;
    private final ShareLinks links;
    private final RunPanel panel;

    EditorPages(ScenarioStore store, ShareLinks links, RunPanel panel) {
        this.store = store;
        this.links = links;
        this.panel = panel;
    }

    /** What "new scenario in the editor" starts from: one empty room and a short route inside it. */
    static final String STARTER = """
            {
              "format": "driftlab-scenario/1",
              "name": "New scenario",
              "description": "Drawn in the editor.",
              "site": {
                "rooms": [{"id": "room-1", "name": "Room 1", "outline": [[0, 0], [8, 0], [8, 5], [0, 5]]}]
              },
              "route": {
                "start": {"x": 1, "y": 1, "heading": 0},
                "waypoints": [{"x": 6, "y": 1, "speed": 0.5, "dwell": 0}],
                "settle": 5
              }
            }
            """;

    @PostMapping("/editor/new")
    String create() {
        ScenarioStore.Created c = store.create(STARTER, "anonymous", "New scenario from the editor");
        return "redirect:/s/" + c.editToken() + "/editor";
    }

    /** The run form needs something to tick even while the document does not read. */
    private static String faultKindsJson() {
        JsonMapper json = JsonMapper.builder().build();
        ObjectNode root = json.createObjectNode();
        ArrayNode kinds = root.putArray("kinds");
        for (FaultKind k : FaultKind.values()) {
            ObjectNode n = kinds.addObject();
            n.put("name", k.fileName());
            n.put("label", k.label());
            n.put("mark", k.mark());
            n.put("target", k.target());
            ArrayNode fields = n.putArray("fields");
            for (FaultKind.Field f : k.fields()) {
                ObjectNode fn = fields.addObject();
                fn.put("key", f.key());
                fn.put("label", f.label());
                fn.put("type", f.type());
                fn.put("source", f.source());
                fn.set("initial", json.valueToTree(f.initial()));
            }
        }
        root.set("choices", json.valueToTree(FaultKind.CHOICES));
        return json.writeValueAsString(root);
    }

    private static List<String> baseWhenUnread(List<String> names) {
        return names.isEmpty() ? List.of("base") : names;
    }

    @GetMapping("/s/{token}/editor")
    String editor(@PathVariable String token, Model model) {
        Grant g = links.require(token);
        ScenarioStore.ScenarioView v = store.view(g.scenarioId());
        String document = store.document(g.scenarioId(), v.latest().number());
        model.addAttribute("grant", g);
        model.addAttribute("view", v);
        model.addAttribute("document", document);
        model.addAttribute("editable", g.canEdit());
        model.addAttribute("links", g.canEdit() ? links.current(g.scenarioId()) : null);
        panel.fill(model, g.scenarioId(), baseWhenUnread(v.rendering().variantNames()), RECENT_RUNS);
        model.addAttribute(
                "forms",
                Arrays.stream(SettingsSection.values())
                        .map(s -> new SectionForm(
                                s,
                                SettingsForm.fromDocument(s, document),
                                new SettingsForm.Outcome(Map.of(), List.of(), Optional.empty())))
                        .toList());
        model.addAttribute("faultKinds", FaultKind.values());
        model.addAttribute("faultKindsJson", FAULT_KINDS_JSON);
        model.addAttribute("targetKinds", TARGET_KINDS);
        model.addAttribute("gates", GatesForm.fromDocument(document));
        model.addAttribute("gatesOutcome", new GatesForm.Outcome(Map.of(), Optional.empty()));
        model.addAttribute("metrics", GatesForm.METRICS);
        model.addAttribute("rules", GatesForm.RULES);
        model.addAttribute("variantRows", VariantsForm.fromDocument(document));
        model.addAttribute("variantsOutcome", VariantsForm.Outcome.none());
        return "editor/editor";
    }
}
