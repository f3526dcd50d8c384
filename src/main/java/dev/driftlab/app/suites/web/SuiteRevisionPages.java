package dev.driftlab.app.suites.web;

import dev.driftlab.app.scenarios.ScenarioNotFound;
import dev.driftlab.app.suites.SuiteGrant;
import dev.driftlab.app.suites.SuiteRuns;
import dev.driftlab.app.suites.SuiteStore;
import dev.driftlab.app.suites.persistence.SuiteRepository.SuiteRunRow;
import java.util.List;
import org.springframework.stereotype.Controller;
import org.springframework.ui.Model;
import org.springframework.web.bind.annotation.GetMapping;
import org.springframework.web.bind.annotation.PathVariable;

/**
 * A suite's older revisions, read-only: the list of every revision and one revision as it was
 * saved (its scenarios, pins, seeds and profiles, and what changed from the revision before). A
 * view link reads them as an edit link does; neither page changes anything nor shows an edit link.
 */
@Controller
class SuiteRevisionPages {

    /** The suite's latest runs searched for the runs of one revision. */
    static final int RECENT_RUNS = 50;

    private final SuiteStore store;
    private final SuiteRuns runs;
    private final SuiteEntries listing;

    SuiteRevisionPages(SuiteStore store, SuiteRuns runs, SuiteEntries listing) {
        this.store = store;
        this.runs = runs;
        this.listing = listing;
    }

    @GetMapping("/suites/{token}/history")
    String history(@PathVariable String token, Model model) {
        SuiteGrant g = store.require(token);
        model.addAttribute("grant", g);
        model.addAttribute("view", store.view(g.suiteId()));
        model.addAttribute("revisions", store.history(g.suiteId()));
        return "suites/history";
    }

    @GetMapping("/suites/{token}/revisions/{number}")
    String revision(@PathVariable String token, @PathVariable int number, Model model) {
        SuiteGrant g = store.require(token);
        SuiteStore.SuiteView latest = store.view(g.suiteId());
        int newest = latest.head().latestRevision();
        if (number < 1 || number > newest) {
            throw new ScenarioNotFound("Revision " + number + " of the suite \""
                    + latest.head().name() + "\" (it has revisions 1 to " + newest + ")");
        }
        SuiteStore.SuiteView v = store.view(g.suiteId(), number);
        List<SuiteEntries.EntryRow> entries = listing.of(v.document());
        model.addAttribute("grant", g);
        model.addAttribute("view", v);
        model.addAttribute("newest", newest);
        model.addAttribute("entries", entries);
        model.addAttribute("suiteProfiles", SuiteEntries.profiles(v.document()));
        if (number > 1) {
            SuiteStore.SuiteView before = store.view(g.suiteId(), number - 1);
            model.addAttribute(
                    "changes",
                    SuiteRevisionChanges.between(
                            before.document(), listing.of(before.document()), v.document(), entries));
        }
        List<SuiteRunRow> ran = runs.recent(g.suiteId(), RECENT_RUNS).stream()
                .filter(r -> r.revisionNumber() == number)
                .toList();
        model.addAttribute("runs", ran);
        return "suites/revision";
    }
}
