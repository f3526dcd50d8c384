package dev.driftlab.app.editor.web;

import dev.driftlab.app.scenarios.ScenarioNotFound;
import dev.driftlab.app.sharing.ShareLinks;
import java.util.Map;
import org.springframework.stereotype.Controller;
import org.springframework.ui.Model;
import org.springframework.web.bind.annotation.PathVariable;
import org.springframework.web.bind.annotation.PostMapping;
import org.springframework.web.bind.annotation.RequestParam;

/**
 * The settings forms' inline check: htmx posts a form together with the document being edited and
 * gets the form back with a message beside every input at fault, plus, when the section is fine,
 * the section as file JSON for the editor to take over.
 */
@Controller
class SettingsPages {

    private final ShareLinks links;

    SettingsPages(ShareLinks links) {
        this.links = links;
    }

    @PostMapping("/s/{token}/editor/settings/{section}")
    String check(
            @PathVariable String token,
            @PathVariable String section,
            @RequestParam Map<String, String> params,
            Model model) {
        links.requireEdit(token);
        SettingsSection s = SettingsSection.byKey(section).orElseThrow(() -> new ScenarioNotFound("The settings form"));
        SettingsForm form = SettingsForm.fromRequest(s, params);
        SettingsForm.Outcome outcome = form.check(params.getOrDefault("document", ""));
        model.addAttribute("section", s);
        model.addAttribute("form", form);
        model.addAttribute("outcome", outcome);
        model.addAttribute("token", token);
        model.addAttribute("editable", true);
        return "editor/settings :: form";
    }

    @PostMapping("/s/{token}/editor/gates")
    String gates(@PathVariable String token, @RequestParam Map<String, String> params, Model model) {
        links.requireEdit(token);
        GatesForm form = GatesForm.fromRequest(params);
        GatesForm.Outcome outcome = form.check(params.getOrDefault("document", ""));
        // a taken-over form gets a fresh empty row, so the next gate can be typed straight away
        model.addAttribute(
                "gates", outcome.gatesJson().isPresent() ? GatesForm.fromDocument(withGates(outcome)) : form);
        model.addAttribute("gatesOutcome", outcome);
        model.addAttribute("token", token);
        model.addAttribute("editable", true);
        model.addAttribute("metrics", GatesForm.METRICS);
        model.addAttribute("rules", GatesForm.RULES);
        return "editor/gates :: form";
    }

    @PostMapping("/s/{token}/editor/variants")
    String variants(@PathVariable String token, @RequestParam Map<String, String> params, Model model) {
        links.requireEdit(token);
        VariantsForm form = VariantsForm.fromRequest(params);
        VariantsForm.Outcome outcome = form.check(params.getOrDefault("document", ""));
        // a taken-over form is shown afresh from the result, with an empty block for the next one
        model.addAttribute(
                "variantRows",
                outcome.variantsJson().isPresent()
                        ? VariantsForm.fromDocument(
                                "{\"variants\": " + outcome.variantsJson().get() + "}")
                        : form);
        model.addAttribute("variantsOutcome", outcome);
        model.addAttribute("token", token);
        model.addAttribute("editable", true);
        return "editor/variants :: form";
    }

    private static String withGates(GatesForm.Outcome outcome) {
        return "{\"gates\": " + outcome.gatesJson().orElse("[]") + "}";
    }
}
