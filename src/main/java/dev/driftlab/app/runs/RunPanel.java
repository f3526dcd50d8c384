package dev.driftlab.app.runs;

import java.util.List;
import org.springframework.stereotype.Component;
import org.springframework.ui.Model;

/**
 * What the runs panel ({@code runs/panel.html}) needs, filled in one place for every page that
 * shows it (the scenario page, the editor, the panel's own refresh): the scenario's recent runs,
 * its variants to tick, and the outside localizers a run may name.
 */
@Component
public class RunPanel {

    private final RunBoard runs;
    private final WorkerBoard workers;

    public RunPanel(RunBoard runs, WorkerBoard workers) {
        this.runs = runs;
        this.workers = workers;
    }

    /**
     * Adds the panel's attributes.
     *
     * @param scenarioId the scenario
     * @param variants its settings variants' names, in the order the form lists them
     * @param recent how many of its latest runs to list
     */
    public void fill(Model model, long scenarioId, List<String> variants, int recent) {
        model.addAttribute("runs", runs.recent(scenarioId, recent));
        model.addAttribute("variants", variants);
        model.addAttribute("localizers", workers.offeredLocalizers());
    }
}
