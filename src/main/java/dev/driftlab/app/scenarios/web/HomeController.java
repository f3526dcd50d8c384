package dev.driftlab.app.scenarios.web;

import dev.driftlab.app.scenarios.SampleLibrary;
import dev.driftlab.app.scenarios.ScenarioRefused;
import dev.driftlab.app.scenarios.ScenarioStore;
import dev.driftlab.app.sharing.ShareLinks;
import dev.driftlab.app.system.web.Htmx;
import dev.driftlab.scenario.Problem;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
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

    private final SampleLibrary samples;
    private final ScenarioStore store;
    private final ShareLinks links;
    private final boolean listScenarios;

    HomeController(
            SampleLibrary samples,
            ScenarioStore store,
            ShareLinks links,
            @Value("${driftlab.home.list-scenarios:true}") boolean listScenarios) {
        this.samples = samples;
        this.store = store;
        this.links = links;
        this.listScenarios = listScenarios;
    }

    @GetMapping("/")
    String home(@RequestParam(defaultValue = "") String q, Htmx htmx, Model model) {
        fill(model, q);
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
        fill(model, "");
        model.addAttribute("importProblems", problems);
        ModelAndView mv = new ModelAndView("home/index", model.asMap());
        mv.setStatus(HttpStatus.UNPROCESSABLE_CONTENT);
        return mv;
    }

    private void fill(Model model, String q) {
        model.addAttribute("q", q);
        model.addAttribute("listing", listScenarios);
        model.addAttribute("scenarios", listScenarios ? store.search(q, LIST_LIMIT) : List.of());
        model.addAttribute("editTokens", listScenarios ? links.editTokens() : Map.of());
        model.addAttribute("samples", samples.all());
    }

    private static String fileName(Forms.ImportForm form) {
        String n = form.file().getOriginalFilename();
        return n == null || n.isBlank() ? "an uploaded file" : n;
    }
}
