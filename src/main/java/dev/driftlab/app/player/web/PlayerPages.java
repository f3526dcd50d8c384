package dev.driftlab.app.player.web;

import dev.driftlab.app.runs.RunBoard;
import dev.driftlab.app.runs.persistence.RunRepository.RunRow;
import dev.driftlab.app.sharing.Grant;
import dev.driftlab.app.sharing.ShareLinks;
import java.util.List;
import java.util.Optional;
import org.springframework.stereotype.Controller;
import org.springframework.ui.Model;
import org.springframework.web.bind.annotation.GetMapping;
import org.springframework.web.bind.annotation.PathVariable;
import org.springframework.web.bind.annotation.RequestParam;

/**
 * The player page of a run, optionally beside a second run: one of the same batch, or any run of
 * the same scenario whose link is pasted in. Addressed by the
 * run's own read-only token, so the page is a permalink; the scenario link redirects there.
 */
@Controller
class PlayerPages {

    private final ShareLinks links;
    private final RunBoard board;

    PlayerPages(ShareLinks links, RunBoard board) {
        this.links = links;
        this.board = board;
    }

    @GetMapping("/s/{token}/runs/{id}/play")
    String fromScenario(@PathVariable String token, @PathVariable long id) {
        Grant g = links.require(token);
        return "redirect:/r/" + board.of(g.scenarioId(), id).viewToken() + "/play";
    }

    @GetMapping("/r/{runToken}/play")
    String play(
            @PathVariable String runToken,
            @RequestParam(name = "with", required = false) String with,
            @RequestParam(name = "link", required = false) String link,
            Model model) {
        RunRow run = board.byToken(runToken);
        List<RunRow> batch = board.batch(run.scenarioId(), run.batchKey()).stream()
                .filter(r -> r.id() != run.id())
                .toList();
        Optional<RunRow> other = Optional.empty();
        String problem = null;
        if (link != null && !link.isBlank()) {
            // any run of the same scenario whose link the viewer holds, e.g. the same seed on the
            // revision before a change; holding its link is what gives access to it
            Optional<RunRow> pasted = board.byLink(link);
            if (pasted.isEmpty()) {
                problem = "That is not a run link: paste a run's read-only link, which contains /r/.";
            } else if (pasted.get().scenarioId() != run.scenarioId()) {
                problem = "That run belongs to another scenario; only runs of this scenario can be compared.";
            } else if (pasted.get().id() == run.id()) {
                problem = "That is the link of this run itself.";
            } else {
                other = pasted;
            }
        } else if (with != null) {
            // runs of the same submission are offered in the list: they share seeds and revision
            other = batch.stream().filter(r -> r.viewToken().equals(with)).findFirst();
        }
        model.addAttribute("run", run);
        model.addAttribute("others", batch);
        model.addAttribute("other", other.orElse(null));
        model.addAttribute("compareProblem", problem);
        model.addAttribute("link", link == null ? "" : link);
        return "player/show";
    }
}
