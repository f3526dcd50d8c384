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
 * The player page of a run, optionally beside a second run of the same batch. Addressed by the
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
            @PathVariable String runToken, @RequestParam(name = "with", required = false) String with, Model model) {
        RunRow run = board.byToken(runToken);
        List<RunRow> batch = board.batch(run.scenarioId(), run.batchKey()).stream()
                .filter(r -> r.id() != run.id())
                .toList();
        // only runs of the same submission are offered, so the pair shares seeds and revision
        Optional<RunRow> other = Optional.ofNullable(with)
                .flatMap(
                        w -> batch.stream().filter(r -> r.viewToken().equals(w)).findFirst());
        model.addAttribute("run", run);
        model.addAttribute("others", batch);
        model.addAttribute("other", other.orElse(null));
        return "player/show";
    }
}
