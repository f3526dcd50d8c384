package dev.driftlab.app.scenarios.web;

import dev.driftlab.app.scenarios.SampleLibrary;
import dev.driftlab.app.scenarios.ScenarioRefused;
import dev.driftlab.app.scenarios.ScenarioStore;
import dev.driftlab.app.sharing.ShareLinks;
import dev.driftlab.app.system.web.Htmx;
import dev.driftlab.scenario.Problem;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import org.springframework.beans.factory.annotation.Value;
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
import org.springframework.web.servlet.ModelAndView;

/** The home page: scenario list with search, new from a sample, import; and the sample downloads. */
@Controller
class HomeController {

    static final int LIST_LIMIT = 200;

    /** Scenarios per page of the home listing. */
    static final int PAGE_SIZE = 24;

    /**
     * Bytes of site plan drawings one page may inline. Each drawing must also fit the thumbnail
     * size; larger ones are named, not drawn, so a page of large sites stays a page.
     */
    static final long PAGE_DRAWING_BYTES = 512 * 1024;

    /**
     * One scenario in the listing.
     *
     * @param view the scenario at its latest revision
     * @param viewToken its view link, null when revoked (the listing never shows an edit link)
     * @param drawn whether its plan is drawn here
     */
    record Card(ScenarioStore.ScenarioView view, String viewToken, boolean drawn) {}

    /**
     * One suite in the listing: its view link (never the edit link) and last run.
     *
     * @param name the suite's name
     * @param viewToken its view link, null when revoked
     * @param last its last run, null when never run
     */
    record SuiteCard(
            String name, String viewToken, dev.driftlab.app.suites.persistence.SuiteRepository.SuiteRunRow last) {}

    /** Suites listed on the home page. */
    static final int SUITE_LIMIT = 20;

    private final SampleLibrary samples;
    private final dev.driftlab.app.suites.SuiteStore suites;
    private final dev.driftlab.app.suites.SuiteRuns suiteRuns;
    private final ScenarioStore store;
    private final ShareLinks links;
    private final boolean listScenarios;

    HomeController(
            SampleLibrary samples,
            ScenarioStore store,
            ShareLinks links,
            dev.driftlab.app.suites.SuiteStore suites,
            dev.driftlab.app.suites.SuiteRuns suiteRuns,
            @Value("${driftlab.home.list-scenarios:true}") boolean listScenarios) {
        this.suites = suites;
        this.suiteRuns = suiteRuns;
        this.samples = samples;
        this.store = store;
        this.links = links;
        this.listScenarios = listScenarios;
    }

    @GetMapping("/")
    String home(
            @RequestParam(defaultValue = "") String q,
            @RequestParam(defaultValue = "1") int page,
            Htmx htmx,
            Model model) {
        fill(model, q, page);
        return htmx.view("home/index", "home/index :: list");
    }

    @PostMapping("/scenarios/import")
    ModelAndView importFile(@ModelAttribute Forms.ImportForm form, Model model) {
        if (form.file() == null || form.file().isEmpty()) {
            return refused(model, List.of(Problem.error("file", "choose a scenario JSON file to import")));
        }
        String json;
        try {
            json = new String(form.file().getBytes(), StandardCharsets.UTF_8);
        } catch (IOException e) {
            return refused(model, List.of(Problem.error("file", "could not be read")));
        }
        try {
            ScenarioStore.Created c = store.create(json, form.authorOrDefault(), "Imported from " + fileName(form));
            return new ModelAndView("redirect:/s/" + c.editToken());
        } catch (ScenarioRefused e) {
            return refused(model, e.problems());
        }
    }

    @PostMapping("/scenarios/from-sample")
    String fromSample(@ModelAttribute Forms.SampleForm form) {
        SampleLibrary.Sample s = samples.byFile(form.sample() == null ? "" : form.sample())
                .orElseThrow(() -> new dev.driftlab.app.scenarios.ScenarioNotFound("The sample"));
        ScenarioStore.Created c = store.create(s.json(), form.authorOrDefault(), "New from the sample " + s.file());
        return "redirect:/s/" + c.editToken();
    }

    @GetMapping(value = "/samples/{file}", produces = MediaType.APPLICATION_JSON_VALUE)
    ResponseEntity<String> sampleFile(@PathVariable String file) {
        return samples.byFile(file)
                .map(s -> ResponseEntity.ok()
                        .header("Content-Disposition", "attachment; filename=\"" + s.file() + "\"")
                        .body(s.json()))
                .orElse(ResponseEntity.notFound().build());
    }

    private ModelAndView refused(Model model, List<Problem> problems) {
        fill(model, "", 1);
        model.addAttribute("importProblems", problems);
        ModelAndView mv = new ModelAndView("home/index", model.asMap());
        mv.setStatus(HttpStatus.UNPROCESSABLE_CONTENT);
        return mv;
    }

    private void fill(Model model, String q, int page) {
        int p = Math.max(1, Math.min(page, LIST_LIMIT / PAGE_SIZE + 1));
        model.addAttribute("q", q);
        model.addAttribute("listing", listScenarios);
        model.addAttribute("page", p);
        model.addAttribute("samples", samples.all());
        model.addAttribute("suites", List.of());
        if (!listScenarios) {
            model.addAttribute("cards", List.of());
            model.addAttribute("hasNext", false);
            return;
        }
        // one more than a page tells whether there is a next page
        List<ScenarioStore.ScenarioView> found = store.search(q, (p - 1) * PAGE_SIZE, PAGE_SIZE + 1);
        Map<Long, String> views = links.viewTokens();
        List<Card> cards = new ArrayList<>();
        long drawing = 0;
        for (ScenarioStore.ScenarioView v : found.subList(0, Math.min(PAGE_SIZE, found.size()))) {
            boolean draw =
                    v.rendering().thumbnail() && drawing + v.rendering().svg().length() <= PAGE_DRAWING_BYTES;
            if (draw) {
                drawing += v.rendering().svg().length();
            }
            cards.add(new Card(v, views.get(v.head().id()), draw));
        }
        model.addAttribute("cards", cards);
        // suites follow the scenarios' listing rule: view links only, and none when listing is off
        List<dev.driftlab.app.suites.persistence.SuiteRepository.SuiteRow> rows = suites.recent(SUITE_LIMIT);
        List<Long> ids = rows.stream().map(r -> r.id()).toList();
        Map<Long, String> suiteViews = suites.viewTokens(ids);
        var last = suiteRuns.last(ids);
        model.addAttribute(
                "suites",
                rows.stream()
                        .map(r -> new SuiteCard(r.name(), suiteViews.get(r.id()), last.get(r.id())))
                        .toList());
        model.addAttribute("hasNext", found.size() > PAGE_SIZE && p * PAGE_SIZE < LIST_LIMIT);
    }

    private static String fileName(Forms.ImportForm form) {
        String n = form.file().getOriginalFilename();
        return n == null || n.isBlank() ? "an uploaded file" : n;
    }
}
