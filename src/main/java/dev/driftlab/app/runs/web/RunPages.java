package dev.driftlab.app.runs.web;

import dev.driftlab.app.reports.RunReports;
import dev.driftlab.app.runs.RunBoard;
import dev.driftlab.app.runs.RunPanel;
import dev.driftlab.app.runs.RunQueue;
import dev.driftlab.app.runs.TrialOptions;
import dev.driftlab.app.runs.WorkerBoard;
import dev.driftlab.app.runs.persistence.RunRepository.RunRow;
import dev.driftlab.app.scenarios.ScenarioStore;
import dev.driftlab.app.sharing.Grant;
import dev.driftlab.app.sharing.ShareLinks;
import dev.driftlab.app.system.web.Htmx;
import org.springframework.http.MediaType;
import org.springframework.http.ResponseEntity;
import org.springframework.stereotype.Controller;
import org.springframework.ui.Model;
import org.springframework.web.bind.annotation.GetMapping;
import org.springframework.web.bind.annotation.ModelAttribute;
import org.springframework.web.bind.annotation.PathVariable;
import org.springframework.web.bind.annotation.PostMapping;
import org.springframework.web.bind.annotation.RequestParam;

/**
 * Runs on the scenario page: submit, list, progress (a fragment that htmx polls until the run is
 * over), cancel, run again; and a run's own read-only view link.
 */
@Controller
class RunPages {

    private final ShareLinks links;
    private final ScenarioStore store;
    private final RunQueue queue;
    private final RunBoard board;
    private final RunReports reports;
    private final WorkerBoard workers;
    private final RunPanel panel;

    RunPages(
            ShareLinks links,
            ScenarioStore store,
            RunQueue queue,
            RunBoard board,
            WorkerBoard workers,
            RunPanel panel) {
        this.links = links;
        this.store = store;
        this.queue = queue;
        this.board = board;
        this.workers = workers;
        this.panel = panel;
        this.reports = new RunReports(store, board);
    }

    @GetMapping("/s/{token}/runs")
    String panel(@PathVariable String token, Model model) {
        Grant g = links.require(token);
        fillPanel(g, model);
        return "runs/panel :: panel";
    }

    @PostMapping("/s/{token}/runs")
    String submit(@PathVariable String token, @ModelAttribute RunForm form, Htmx htmx, Model model) {
        Grant g = links.require(token);
        ScenarioStore.ScenarioView v = store.view(g.scenarioId());
        if (form.sweep()) {
            queue.submitSweep(
                    g.scenarioId(),
                    v.latest().id(),
                    form.variantsOrBase(),
                    form.counts(),
                    form.seeds(),
                    form.frames(),
                    form.localizerName());
        } else {
            queue.submit(
                    g.scenarioId(),
                    v.latest().id(),
                    form.variantsOrBase(),
                    form.seeds(),
                    new TrialOptions(form.frames(), 0, form.localizerName()));
        }
        if (htmx.request()) {
            fillPanel(g, model);
            return "runs/panel :: panel";
        }
        return "redirect:/s/" + token + "#runs";
    }

    @GetMapping("/s/{token}/runs/{id}")
    String run(@PathVariable String token, @PathVariable long id, Htmx htmx, Model model) {
        Grant g = links.require(token);
        RunRow r = board.of(g.scenarioId(), id);
        fillRun(model, r, "/s/" + token + "/runs/" + id);
        model.addAttribute("grant", g);
        model.addAttribute("view", store.view(g.scenarioId()));
        return htmx.view("runs/show", "runs/show :: progress");
    }

    @PostMapping("/s/{token}/runs/{id}/cancel")
    String cancel(@PathVariable String token, @PathVariable long id, Htmx htmx, Model model) {
        // a view link is handed around widely; stopping someone's run needs the edit link
        Grant g = links.requireEdit(token);
        queue.cancel(board.of(g.scenarioId(), id).id());
        if (htmx.request()) {
            fillRun(model, board.of(g.scenarioId(), id), "/s/" + token + "/runs/" + id);
            model.addAttribute("grant", g);
            return "runs/show :: progress";
        }
        return "redirect:/s/" + token + "/runs/" + id;
    }

    @PostMapping("/s/{token}/runs/{id}/rerun")
    String rerun(@PathVariable String token, @PathVariable long id) {
        Grant g = links.require(token);
        RunQueue.Submitted s = queue.rerun(board.of(g.scenarioId(), id).id());
        return "redirect:/s/" + token + "/runs/" + s.runIds().get(0);
    }

    @PostMapping("/s/{token}/runs/{id}/replay")
    String replay(@PathVariable String token, @PathVariable long id, @RequestParam(required = false) String seed) {
        Grant g = links.require(token);
        RunQueue.Submitted s = queue.replaySeed(board.of(g.scenarioId(), id).id(), RunForm.seedOf(seed));
        return "redirect:/s/" + token + "/runs/" + s.runIds().get(0);
    }

    @GetMapping(value = "/s/{token}/runs/{id}/result", produces = MediaType.APPLICATION_JSON_VALUE)
    ResponseEntity<String> result(@PathVariable String token, @PathVariable long id) {
        Grant g = links.require(token);
        RunRow r = board.of(g.scenarioId(), id);
        return board.result(r.id())
                .map(json -> ResponseEntity.ok()
                        .header("Content-Disposition", "attachment; filename=\"run-" + r.id() + ".json\"")
                        .body(json))
                .orElse(ResponseEntity.notFound().build());
    }

    @GetMapping("/r/{runToken}")
    String sharedRun(@PathVariable String runToken, Htmx htmx, Model model) {
        RunRow r = board.byToken(runToken);
        fillRun(model, r, "/r/" + runToken);
        model.addAttribute("shared", true);
        return htmx.view("runs/show", "runs/show :: progress");
    }

    private void fillRun(Model model, RunRow r, String self) {
        model.addAttribute("run", r);
        model.addAttribute("self", self);
        model.addAttribute("result", board.result(r.id()).orElse(""));
        model.addAttribute("chunks", board.chunks(r.id()).size());
        model.addAttribute("seedList", r.seedList());
        model.addAttribute("shared", false);
        model.addAttribute("findings", reports.headline(r));
        model.addAttribute("units", workers.units(r));
    }

    private void fillPanel(Grant g, Model model) {
        ScenarioStore.ScenarioView v = store.view(g.scenarioId());
        model.addAttribute("grant", g);
        panel.fill(model, g.scenarioId(), v.rendering().variantNames(), 10);
    }
}
