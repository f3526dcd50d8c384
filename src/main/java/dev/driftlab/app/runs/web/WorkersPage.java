package dev.driftlab.app.runs.web;

import dev.driftlab.app.runs.WorkerBoard;
import dev.driftlab.app.system.web.Htmx;
import org.springframework.stereotype.Controller;
import org.springframework.ui.Model;
import org.springframework.web.bind.annotation.GetMapping;
import org.springframework.web.bind.annotation.RequestParam;

/**
 * The workers page: which processes are alive, what each runs, units waiting and trials per
 * minute. The figures are a fragment that htmx fetches again every 2 s; {@code live=false} leaves
 * them still (for anyone who needs the page not to change while they read it).
 */
@Controller
class WorkersPage {

    private final WorkerBoard board;

    WorkersPage(WorkerBoard board) {
        this.board = board;
    }

    @GetMapping("/workers")
    String workers(@RequestParam(defaultValue = "true") boolean live, Htmx htmx, Model model) {
        model.addAttribute("snap", board.snapshot());
        model.addAttribute("live", live);
        model.addAttribute("shownHours", WorkerBoard.SHOWN_FOR.toHours());
        return htmx.view("runs/workers", "runs/workers :: board");
    }
}
