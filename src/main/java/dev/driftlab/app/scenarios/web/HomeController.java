package dev.driftlab.app.scenarios.web;

import dev.driftlab.app.scenarios.SampleLibrary;
import org.springframework.http.MediaType;
import org.springframework.http.ResponseEntity;
import org.springframework.stereotype.Controller;
import org.springframework.ui.Model;
import org.springframework.web.bind.annotation.GetMapping;
import org.springframework.web.bind.annotation.PathVariable;

/** The home page: the sample scenarios with their description, check result and site plan. */
@Controller
class HomeController {

    private final SampleLibrary samples;

    HomeController(SampleLibrary samples) {
        this.samples = samples;
    }

    @GetMapping("/")
    String home(Model model) {
        model.addAttribute("samples", samples.all());
        return "home/index";
    }

    @GetMapping(value = "/samples/{file}", produces = MediaType.APPLICATION_JSON_VALUE)
    ResponseEntity<String> sampleFile(@PathVariable String file) {
        return samples.byFile(file)
                .map(s -> ResponseEntity.ok()
                        .header("Content-Disposition", "attachment; filename=\"" + s.file() + "\"")
                        .body(s.json()))
                .orElse(ResponseEntity.notFound().build());
    }
}
