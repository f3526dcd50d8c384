package dev.driftlab.app.suites.web;

import dev.driftlab.app.runs.LocalizerAllowList;
import dev.driftlab.app.runs.WorkerBoard;
import dev.driftlab.app.scenarios.SampleLibrary;
import dev.driftlab.app.scenarios.ScenarioStore;
import dev.driftlab.app.sharing.Access;
import dev.driftlab.app.sharing.ShareLinks;
import dev.driftlab.app.suites.SuiteDocument;
import dev.driftlab.app.suites.SuiteGrant;
import dev.driftlab.app.suites.SuiteRefused;
import dev.driftlab.app.suites.SuiteRuns;
import dev.driftlab.app.suites.SuiteSamples;
import dev.driftlab.app.suites.SuiteStore;
import dev.driftlab.app.suites.persistence.SuiteRepository.SuiteRunRow;
import dev.driftlab.app.system.web.Htmx;
import dev.driftlab.report.HtmlReport;
import dev.driftlab.report.JunitXml;
import dev.driftlab.report.PdfReport;
import dev.driftlab.scenario.Problem;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import org.springframework.http.MediaType;
import org.springframework.http.ResponseEntity;
import org.springframework.stereotype.Controller;
import org.springframework.ui.Model;
import org.springframework.web.bind.annotation.GetMapping;
import org.springframework.web.bind.annotation.PathVariable;
import org.springframework.web.bind.annotation.PostMapping;
import org.springframework.web.bind.annotation.RequestParam;
import tools.jackson.core.JacksonException;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;

/** Suite pages: new suite, a suite with its runs and edit form, a suite run's progress and report. */
@Controller
class SuitePages {

    private static final JsonMapper MAPPER = JsonMapper.builder().build();

    /** A sample scenario to pick: its name and view token. */
    record Pick(String name, String file, String token) {}

    private final SuiteStore store;
    private final SuiteRuns runs;
    private final SuiteSamples samples;
    private final ScenarioStore scenarios;
    private final ShareLinks links;
    private final SampleLibrary library;
    private final dev.driftlab.app.reports.ReportRenders renders;
    private final SuiteEntries listing;
    private final SuiteRunReports reports;

    private final WorkerBoard workers;

    SuitePages(
            SuiteStore store,
            SuiteRuns runs,
            SuiteSamples samples,
            ScenarioStore scenarios,
            ShareLinks links,
            SampleLibrary library,
            dev.driftlab.app.reports.ReportRenders renders,
            SuiteEntries listing,
            SuiteRunReports reports,
            WorkerBoard workers) {
        this.reports = reports;
        this.workers = workers;
        this.renders = renders;
        this.listing = listing;
        this.store = store;
        this.runs = runs;
        this.samples = samples;
        this.scenarios = scenarios;
        this.links = links;
        this.library = library;
    }

    @GetMapping("/suites/new")
    String newForm(Model model) {
        model.addAttribute("picks", picks());
        model.addAttribute("profiles", samples.profiles());
        return "suites/new";
    }

    @PostMapping("/suites")
    String create(
            @RequestParam(defaultValue = "") String name,
            @RequestParam(defaultValue = "") String description,
            @RequestParam(defaultValue = "") String seeds,
            @RequestParam(defaultValue = "") String firstSeed,
            @RequestParam(name = "sample", required = false) List<String> picked,
            @RequestParam(defaultValue = "") String links,
            @RequestParam(name = "shippedProfile", required = false) List<String> shipped,
            @RequestParam(defaultValue = "") String newProfile,
            @RequestParam(defaultValue = "") String author) {
        List<SuiteDocument.Entry> entries = new ArrayList<>();
        added(picked, links, entries);
        List<JsonNode> profiles = new ArrayList<>();
        addedProfiles(shipped, newProfile, profiles.size(), profiles);
        SuiteDocument d = new SuiteDocument(
                name, description, number("seeds", seeds), longNumber("firstSeed", firstSeed), entries, profiles);
        SuiteStore.Created c = store.create(d, author, "Created in the browser");
        return "redirect:/suites/" + c.editToken();
    }

    @GetMapping("/suites/{token}")
    String show(@PathVariable String token, Model model) {
        SuiteGrant g = store.require(token);
        SuiteStore.SuiteView v = store.view(g.suiteId());
        Map<Access, String> active = store.links(g.suiteId());
        model.addAttribute("grant", g);
        model.addAttribute("view", v);
        model.addAttribute("entries", listing.of(v.document()));
        model.addAttribute(
                "suiteProfiles",
                v.document().profiles().stream().map(this::pretty).toList());
        model.addAttribute("viewToken", active.get(Access.VIEW));
        model.addAttribute("editToken", g.canEdit() ? active.get(Access.EDIT) : null);
        model.addAttribute("runs", runs.recent(g.suiteId(), 20));
        model.addAttribute("localizers", workers.offeredLocalizers());
        model.addAttribute("picks", picks());
        model.addAttribute("profiles", samples.profiles());
        return "suites/show";
    }

    @PostMapping("/suites/{token}/edit")
    String save(
            @PathVariable String token,
            @RequestParam int base,
            @RequestParam(defaultValue = "") String name,
            @RequestParam(defaultValue = "") String description,
            @RequestParam(defaultValue = "") String seeds,
            @RequestParam(defaultValue = "") String firstSeed,
            @RequestParam(name = "entryLink", required = false) List<String> entryLink,
            @RequestParam(name = "entryRevision", required = false) List<String> entryRevision,
            @RequestParam(name = "entrySeeds", required = false) List<String> entrySeeds,
            @RequestParam(name = "entryRemove", required = false) List<Integer> entryRemove,
            @RequestParam(name = "sample", required = false) List<String> picked,
            @RequestParam(defaultValue = "") String links,
            @RequestParam(name = "profileRemove", required = false) List<Integer> profileRemove,
            @RequestParam(name = "shippedProfile", required = false) List<String> shipped,
            @RequestParam(defaultValue = "") String newProfile,
            @RequestParam(defaultValue = "") String author,
            @RequestParam(defaultValue = "") String message,
            jakarta.servlet.http.HttpServletRequest request) {
        SuiteGrant g = store.require(token).requireEdit();
        List<SuiteDocument.Entry> entries = new ArrayList<>();
        List<String> ls = entryLink == null ? List.of() : entryLink;
        for (int i = 0; i < ls.size(); i++) {
            if (entryRemove != null && entryRemove.contains(i)) {
                continue;
            }
            entries.add(new SuiteDocument.Entry(
                    ls.get(i),
                    number("scenarios[" + i + "].revision", at(entryRevision, i)),
                    number("scenarios[" + i + "].seeds", at(entrySeeds, i))));
        }
        added(picked, links, entries);
        List<JsonNode> profiles = new ArrayList<>();
        // read as sent: bound to a List, a lone profile's JSON would be split at its commas
        String[] sent = request.getParameterValues("profileJson");
        List<String> ps = sent == null ? List.of() : List.of(sent);
        for (int j = 0; j < ps.size(); j++) {
            if (profileRemove == null || !profileRemove.contains(j)) {
                profiles.add(json("profiles[" + j + "]", ps.get(j)));
            }
        }
        addedProfiles(shipped, newProfile, profiles.size(), profiles);
        SuiteDocument d = new SuiteDocument(
                name, description, number("seeds", seeds), longNumber("firstSeed", firstSeed), entries, profiles);
        store.save(g.suiteId(), base, d, author, message);
        return "redirect:/suites/" + token;
    }

    @PostMapping("/suites/{token}/runs")
    String run(@PathVariable String token, @RequestParam(required = false) String localizer) {
        SuiteGrant g = store.require(token);
        SuiteRunRow r = runs.submit(g.suiteId(), LocalizerAllowList.requestedName(localizer));
        return "redirect:/suite-runs/" + r.viewToken();
    }

    @PostMapping("/suites/{token}/runs/{id}/cancel")
    String cancel(@PathVariable String token, @PathVariable long id) {
        SuiteGrant g = store.require(token).requireEdit();
        runs.cancel(runs.of(g.suiteId(), id));
        return "redirect:/suites/" + token;
    }

    @PostMapping("/suites/{token}/links/{access}/reissue")
    String reissue(@PathVariable String token, @PathVariable String access) {
        SuiteGrant g = store.require(token).requireEdit();
        Access a = Access.inPath(access);
        String fresh = store.reissue(g.suiteId(), a);
        return "redirect:/suites/" + (a == Access.EDIT ? fresh : token);
    }

    @GetMapping("/suite-runs/{runToken}")
    String suiteRun(
            @PathVariable String runToken,
            Model model,
            Htmx htmx,
            jakarta.servlet.http.HttpServletRequest request,
            jakarta.servlet.http.HttpServletResponse response) {
        SuiteRuns.Progress p = runs.progress(runs.byToken(runToken));
        String self = "/suite-runs/" + runToken;
        model.addAttribute("p", p);
        model.addAttribute("self", self);
        model.addAttribute("suite", store.view(p.run().suiteId(), p.run().revisionNumber()));
        if (p.run().finished()) {
            model.addAttribute("reportHtml", reports.html(p, self, request, response));
        }
        return htmx.view("suites/run", "suites/run :: progress");
    }

    @GetMapping(value = "/suite-runs/{runToken}/report.html", produces = MediaType.TEXT_HTML_VALUE)
    ResponseEntity<String> reportFile(@PathVariable String runToken) {
        SuiteRunRow r = finished(runToken);
        return ResponseEntity.ok(renders.suitePage(r.id() + "/html", true, () -> HtmlReport.render(runs.report(r))));
    }

    @GetMapping(value = "/suite-runs/{runToken}/report.pdf", produces = MediaType.APPLICATION_PDF_VALUE)
    ResponseEntity<byte[]> reportPdf(@PathVariable String runToken) {
        SuiteRunRow r = finished(runToken);
        return ResponseEntity.ok(renders.suitePdf(r.id() + "/pdf", true, () -> PdfReport.render(runs.report(r))));
    }

    @GetMapping(value = "/suite-runs/{runToken}/junit.xml", produces = MediaType.APPLICATION_XML_VALUE)
    ResponseEntity<String> junit(@PathVariable String runToken) {
        SuiteRunRow r = finished(runToken);
        return ResponseEntity.ok(renders.suitePage(r.id() + "/junit", true, () -> JunitXml.render(runs.report(r))));
    }

    @GetMapping(value = "/suite-runs/{runToken}/result.json", produces = MediaType.APPLICATION_JSON_VALUE)
    ResponseEntity<String> resultFile(@PathVariable String runToken) {
        return ResponseEntity.ok(runs.result(finished(runToken)).orElseThrow());
    }

    private SuiteRunRow finished(String runToken) {
        SuiteRunRow r = runs.settle(runs.byToken(runToken).id());
        if (!r.finished()) {
            throw new dev.driftlab.app.runs.RunRefused("state", "this suite run has not finished yet");
        }
        return r;
    }

    /** The loaded samples, by their current view links (scenarios whose view link was revoked are left out). */
    private List<Pick> picks() {
        List<Pick> out = new ArrayList<>();
        Map<String, Long> loaded = scenarios.sampleScenarios();
        Map<Long, String> tokens = links.viewTokens(loaded.values());
        for (SampleLibrary.Sample s : library.all()) {
            Long id = loaded.get(s.file());
            if (id != null && tokens.containsKey(id)) {
                out.add(new Pick(s.name(), s.file(), tokens.get(id)));
            }
        }
        return out;
    }

    private void added(List<String> picked, String pasted, List<SuiteDocument.Entry> entries) {
        if (picked != null) {
            picked.forEach(t -> entries.add(new SuiteDocument.Entry(t, null, null)));
        }
        for (String line : pasted.split("\\R")) {
            if (!line.isBlank()) {
                entries.add(new SuiteDocument.Entry(line.strip(), null, null));
            }
        }
    }

    private void addedProfiles(List<String> shipped, String pasted, int offset, List<JsonNode> profiles) {
        if (shipped != null) {
            for (String f : shipped) {
                samples.profile(f).ifPresent(p -> profiles.add(MAPPER.readTree(p.json())));
            }
        }
        if (!pasted.isBlank()) {
            profiles.add(json("profiles[" + profiles.size() + "]", pasted));
        }
    }

    private String pretty(JsonNode n) {
        return MAPPER.writerWithDefaultPrettyPrinter().writeValueAsString(n);
    }

    private static JsonNode json(String path, String text) {
        try {
            return MAPPER.readTree(text);
        } catch (JacksonException e) {
            throw new SuiteRefused(List.of(Problem.error(path, dev.driftlab.scenario.JsonTrouble.describe(e))));
        }
    }

    private static String at(List<String> list, int i) {
        return list == null || i >= list.size() ? "" : list.get(i);
    }

    private static Integer number(String field, String text) {
        if (text == null || text.isBlank()) {
            return null;
        }
        try {
            return Integer.valueOf(text.strip());
        } catch (NumberFormatException e) {
            throw SuiteRefused.of(field, "\"" + clip(text) + "\" is not a whole number");
        }
    }

    private static Long longNumber(String field, String text) {
        if (text == null || text.isBlank()) {
            return null;
        }
        try {
            return Long.valueOf(text.strip());
        } catch (NumberFormatException e) {
            throw SuiteRefused.of(field, "\"" + clip(text) + "\" is not a whole number");
        }
    }

    private static String clip(String s) {
        return s.length() <= 40 ? s : s.substring(0, 40) + "...";
    }
}
