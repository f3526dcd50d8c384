package dev.driftlab.app.scenarios.web;

import dev.driftlab.app.runs.RunPanel;
import dev.driftlab.app.scenarios.RevisionConflict;
import dev.driftlab.app.scenarios.ScenarioRefused;
import dev.driftlab.app.scenarios.ScenarioStore;
import dev.driftlab.app.sharing.Grant;
import dev.driftlab.app.sharing.ShareLinks;
import dev.driftlab.app.system.web.Htmx;
import dev.driftlab.scenario.Problem;
import jakarta.servlet.http.HttpServletResponse;
import java.util.List;
import org.springframework.http.HttpStatus;
import org.springframework.http.MediaType;
import org.springframework.http.ResponseEntity;
import org.springframework.stereotype.Controller;
import org.springframework.ui.Model;
import org.springframework.web.bind.annotation.GetMapping;
import org.springframework.web.bind.annotation.ModelAttribute;
import org.springframework.web.bind.annotation.PathVariable;
import org.springframework.web.bind.annotation.PostMapping;
import org.springframework.web.bind.annotation.RequestParam;

/** The scenario page and its sub-pages, reached through a view or edit link. */
@Controller
class ScenarioPages {

    static final int RECENT = 10;

    private final ScenarioStore store;
    private final ShareLinks links;
    private final RunPanel panel;

    ScenarioPages(ScenarioStore store, ShareLinks links, RunPanel panel) {
        this.store = store;
        this.links = links;
        this.panel = panel;
    }

    @GetMapping("/s/{token}")
    String show(@PathVariable String token, Model model) {
        Grant g = links.require(token);
        ScenarioStore.ScenarioView v = store.view(g.scenarioId());
        model.addAttribute("grant", g);
        model.addAttribute("view", v);
        List<dev.driftlab.app.scenarios.persistence.ScenarioRepository.RevisionRow> history =
                store.history(g.scenarioId());
        model.addAttribute("revisions", history.subList(0, Math.min(RECENT, history.size())));
        model.addAttribute("revisionCount", history.size());
        model.addAttribute("links", g.canEdit() ? links.current(g.scenarioId()) : null);
        panel.fill(model, g.scenarioId(), v.rendering().variantNames(), RECENT);
        return "scenarios/show";
    }

    @GetMapping("/s/{token}/edit")
    String editForm(@PathVariable String token, Model model) {
        Grant g = links.requireEdit(token);
        ScenarioStore.ScenarioView v = store.view(g.scenarioId());
        String document = store.document(g.scenarioId(), v.latest().number());
        model.addAttribute("grant", g);
        model.addAttribute("view", v);
        model.addAttribute("form", new Forms.RevisionForm(v.latest().number(), "", "", document));
        model.addAttribute("problems", List.of());
        return "scenarios/edit";
    }

    @PostMapping("/s/{token}/edit")
    String save(
            @PathVariable String token,
            @ModelAttribute Forms.RevisionForm form,
            Htmx htmx,
            Model model,
            HttpServletResponse response) {
        Grant g = links.requireEdit(token);
        ScenarioStore.ScenarioView v = store.view(g.scenarioId());
        model.addAttribute("grant", g);
        model.addAttribute("view", v);
        model.addAttribute("form", form);
        model.addAttribute("problems", List.of());
        String again = htmx.view("scenarios/edit", "scenarios/edit :: form");
        if (form.baseRevision() == null) {
            model.addAttribute("problems", List.of(Problem.error("baseRevision", "missing; reload the edit page")));
            response.setStatus(HttpStatus.BAD_REQUEST.value());
            return again;
        }
        try {
            store.save(
                    g.scenarioId(),
                    form.baseRevision(),
                    form.documentOrEmpty(),
                    form.authorOrDefault(),
                    form.messageOrEmpty());
        } catch (ScenarioRefused e) {
            model.addAttribute("problems", e.problems());
            response.setStatus(HttpStatus.UNPROCESSABLE_CONTENT.value());
            return again;
        } catch (RevisionConflict e) {
            model.addAttribute("conflict", e.getMessage());
            response.setStatus(HttpStatus.CONFLICT.value());
            return again;
        }
        if (htmx.request()) {
            response.setHeader("HX-Redirect", "/s/" + token);
            return "scenarios/edit :: saved";
        }
        return "redirect:/s/" + token;
    }

    @GetMapping("/s/{token}/history")
    String history(@PathVariable String token, Model model) {
        Grant g = links.require(token);
        model.addAttribute("grant", g);
        model.addAttribute("view", store.view(g.scenarioId()));
        model.addAttribute("revisions", store.history(g.scenarioId()));
        return "scenarios/history";
    }

    @GetMapping("/s/{token}/compare")
    String compare(@PathVariable String token, @RequestParam int from, @RequestParam int to, Htmx htmx, Model model) {
        Grant g = links.require(token);
        model.addAttribute("grant", g);
        model.addAttribute("view", store.view(g.scenarioId()));
        model.addAttribute("diff", store.compare(g.scenarioId(), from, to));
        return htmx.view("scenarios/compare", "scenarios/compare :: diff");
    }

    @GetMapping(value = "/s/{token}/export", produces = MediaType.APPLICATION_JSON_VALUE)
    ResponseEntity<String> export(@PathVariable String token) {
        Grant g = links.require(token);
        return download(g, store.view(g.scenarioId()).latest().number());
    }

    @GetMapping(value = "/s/{token}/revisions/{number}/export", produces = MediaType.APPLICATION_JSON_VALUE)
    ResponseEntity<String> exportRevision(@PathVariable String token, @PathVariable int number) {
        return download(links.require(token), number);
    }

    @PostMapping("/s/{token}/duplicate")
    String duplicate(@PathVariable String token, @RequestParam(defaultValue = "") String author) {
        Grant g = links.requireEdit(token);
        ScenarioStore.Created c = store.duplicate(g.scenarioId(), author.isBlank() ? Forms.NO_AUTHOR : author);
        return "redirect:/s/" + c.editToken();
    }

    private ResponseEntity<String> download(Grant g, int number) {
        String doc = store.document(g.scenarioId(), number);
        return ResponseEntity.ok()
                .contentType(MediaType.APPLICATION_JSON)
                .header(
                        "Content-Disposition",
                        "attachment; filename=\"scenario-" + g.scenarioId() + "-rev" + number + ".json\"")
                .body(doc);
    }
}
