package dev.driftlab.cli;

import dev.driftlab.cli.Options.UsageException;
import dev.driftlab.cli.ServerSession.NoAnswer;
import dev.driftlab.cli.ServerSession.OutOfTime;
import dev.driftlab.cli.ServerSession.Refused;
import dev.driftlab.scenario.Scenario;
import dev.driftlab.scenario.ScenarioException;
import dev.driftlab.scenario.ScenarioFiles;
import dev.driftlab.scenario.ScenarioJson;
import java.io.IOException;
import java.io.PrintStream;
import java.net.http.HttpResponse;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Set;
import java.util.regex.Pattern;
import tools.jackson.core.JacksonException;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;
import tools.jackson.databind.node.ArrayNode;
import tools.jackson.databind.node.ObjectNode;

/**
 * The {@code submit} subcommand: runs a batch on a Driftlab server instead of this machine and
 * writes the same {@code result.json}, {@code report.html}, {@code junit.xml} and {@code
 * trials.jsonl} a local {@code batch} job writes. It uploads the scenario file (or uses a
 * scenario link), queues every settings variant on the same seeds, shows progress while the
 * server runs it, then downloads the batch's files, which the server makes with the same
 * renderers. Exit statuses as the local jobs, plus {@link Cli#NO_ANSWER} when the server cannot
 * be reached, fails, or the batch does not finish within {@code --timeout}.
 */
final class Submit {

    private static final int MAX_SEEDS = 100_000;
    private static final Pattern LINK = Pattern.compile("/s/([A-Za-z0-9_-]+)");
    private static final JsonMapper JSON = ServerSession.JSON;

    private final PrintStream out;
    private final PrintStream err;
    private final boolean terminal;
    private ServerSession session;
    private String uploadedView;
    /** An outside localizer from the server's list, by name; null for the built-in one. */
    private String localizer;

    Submit(PrintStream out, PrintStream err) {
        this(out, err, System.console() != null);
    }

    Submit(PrintStream out, PrintStream err, boolean terminal) {
        this.out = out;
        this.err = err;
        this.terminal = terminal;
    }

    int run(String[] args) {
        Options o = Options.parse(
                "submit",
                args,
                Set.of("server", "out", "seeds", "first-seed", "variants", "timeout", "link", "server-localizer"),
                Set.of("quiet"));
        String link = o.text("link", null);
        if (link != null && !o.positional().isEmpty()) {
            throw new UsageException("give either a scenario file or --link, not both");
        }
        if (link == null && o.positional().size() != 1) {
            throw new UsageException("give exactly one scenario file, or --link TOKEN");
        }
        if (link != null && o.text("variants", null) != null) {
            throw new UsageException("--variants goes with a scenario file; a link runs the variants its scenario has");
        }
        String server = ServerSession.serverOf(o.required("server"));
        int seeds = o.integer("seeds", 20, 1, MAX_SEEDS);
        long firstSeed = o.longValue("first-seed", 1);
        double timeoutMinutes = ServerSession.timeoutOf(o.text("timeout", "60"));
        String document = link == null ? document(o) : null;
        String token = link == null ? null : ServerSession.tokenOf(link, LINK, "a scenario link (.../s/TOKEN)");
        Path dir = Path.of(o.required("out"));
        try {
            Files.createDirectories(dir);
        } catch (IOException e) {
            throw new UsageException(dir + ": cannot create the output folder: " + e.getMessage());
        }
        boolean quiet = o.flag("quiet");
        localizer = ServerSession.listedLocalizer(o);
        session = new ServerSession("submit", server, timeoutMinutes, err);
        try {
            if (document != null) {
                String name = Path.of(o.positional().get(0)).getFileName().toString();
                token = upload(document, name);
            }
            JsonNode scenario = scenario(token, link != null);
            List<String> variants = new ArrayList<>();
            scenario.path("variants").forEach(v -> variants.add(v.asString()));
            boolean canCancel = "edit".equals(scenario.path("access").asString());
            JsonNode batch =
                    submit(token, variants, scenario.path("latestRevision").asInt(), firstSeed, seeds);
            String batchKey = batch.path("batch").asString();
            String runToken = batch.path("runs").path(0).path("viewToken").asString();
            if (!quiet) {
                err.printf(
                        Locale.ROOT,
                        "submit: %s, %d %s x %d %s on %s%n",
                        scenario.path("name").asString(),
                        variants.size(),
                        variants.size() == 1 ? "variant" : "variants",
                        seeds,
                        seeds == 1 ? "seed" : "seeds",
                        server);
                if (uploadedView != null) {
                    // the view link only: a CI log is read by many, the edit link would let them change it
                    err.println("  scenario: " + server + "/s/" + uploadedView);
                }
                err.println("  batch report: " + server + "/r/" + runToken + "/batch-report");
            }
            batch = await(token, batchKey, batch, quiet, canCancel);
            return download(runToken, batch, dir);
        } catch (Refused e) {
            err.println("driftlab submit: " + e.getMessage());
            return Cli.BAD_INPUT;
        } catch (NoAnswer e) {
            err.println("driftlab submit: " + e.getMessage());
            return Cli.NO_ANSWER;
        }
    }

    /** The scenario file's text, checked as {@code batch} checks it, with a variants file merged in. */
    private static String document(Options o) {
        Path file = Path.of(o.positional().get(0));
        String text;
        try {
            text = Cli.readFile(file);
        } catch (IOException e) {
            throw new UsageException(file + ": cannot read: " + e.getMessage());
        }
        ScenarioFiles.Checked checked = ScenarioFiles.check(text);
        if (!checked.ok()) {
            throw new Jobs.BadScenario(file.toString(), checked.report().problems());
        }
        String variantsFile = o.text("variants", null);
        if (variantsFile == null) {
            return text;
        }
        Path vf = Path.of(variantsFile);
        String variants;
        try {
            variants = Cli.readFile(vf);
        } catch (IOException e) {
            throw new UsageException(vf + ": cannot read: " + e.getMessage());
        }
        Scenario s = checked.scenario().orElseThrow();
        try {
            ScenarioJson.readVariants(variants, s);
        } catch (ScenarioException e) {
            throw new Jobs.BadScenario(vf.toString(), e.problems());
        }
        // the server stores what it runs, so the extra variants travel inside the scenario, after its own
        ObjectNode root = (ObjectNode) JSON.readTree(text);
        JsonNode extra = JSON.readTree(variants).path("variants");
        ArrayNode list = root.has("variants") ? (ArrayNode) root.get("variants") : root.putArray("variants");
        extra.forEach(list::add);
        String merged = JSON.writerWithDefaultPrettyPrinter().writeValueAsString(root);
        ScenarioFiles.Checked again = ScenarioFiles.check(merged);
        if (!again.ok()) {
            throw new Jobs.BadScenario(file + " with " + vf, again.report().problems());
        }
        return merged;
    }

    private String upload(String document, String fileName) {
        String message = "Uploaded by driftlab submit from " + ServerSession.clip(fileName, 100);
        HttpResponse<String> r = session.post(
                "/api/scenarios?author=" + ServerSession.enc("driftlab submit") + "&message="
                        + ServerSession.enc(message),
                document,
                "the scenario upload");
        JsonNode body = session.answer(r, "the scenario", "file");
        uploadedView = body.path("viewToken").asString();
        return body.path("editToken").asString();
    }

    private JsonNode scenario(String token, boolean fromLink) {
        HttpResponse<String> r = session.get("/api/s/" + token, "the scenario");
        JsonNode body = session.answer(r, "the link", fromLink ? "--link" : "link");
        if (!body.path("valid").asBoolean()) {
            StringBuilder sb = new StringBuilder("the scenario at this link does not validate, so it cannot run:");
            body.path("problems")
                    .forEach(p -> sb.append(System.lineSeparator()).append("  ").append(ServerSession.problem(p)));
            throw new Refused(sb.toString());
        }
        return body;
    }

    private JsonNode submit(String token, List<String> variants, int revision, long firstSeed, int seeds) {
        ObjectNode request = JSON.createObjectNode();
        ArrayNode names = request.putArray("variants");
        variants.forEach(names::add);
        request.put("firstSeed", firstSeed);
        request.put("seedCount", seeds);
        request.put("recordFrames", false);
        request.put("revision", revision);
        if (localizer != null) {
            request.put("localizer", localizer);
        }
        while (true) {
            HttpResponse<String> r = session.post("/api/s/" + token + "/batches", request.toString(), "the batch");
            if (r.statusCode() == 503) {
                session.waitBusy(r.headers(), "the server's run queue is full");
                continue;
            }
            return session.answer(r, "the batch", "batch");
        }
    }

    /** Polls the batch until every run is over, showing progress; cancels what it can on timeout. */
    private JsonNode await(String token, String batchKey, JsonNode batch, boolean quiet, boolean canCancel) {
        long started = System.nanoTime();
        ServerSession.ProgressLine line = new ServerSession.ProgressLine(err, terminal, quiet);
        while (!batch.path("finished").asBoolean()) {
            line.show(progress(batch, started));
            session.pause();
            if (session.outOfTime()) {
                line.interrupt();
                throw new NoAnswer(timedOut(token, batch, canCancel));
            }
            HttpResponse<String> r;
            try {
                r = session.get("/api/s/" + token + "/batches/" + batchKey, "the batch");
            } catch (OutOfTime e) {
                // a slow answer used up what --timeout left: the same as running out between polls
                line.interrupt();
                throw new NoAnswer(timedOut(token, batch, canCancel));
            }
            batch = session.answer(r, "the batch", "batch");
        }
        line.last(progress(batch, started));
        for (JsonNode run : batch.path("runs")) {
            String state = run.path("state").asString();
            if (!"done".equals(state)) {
                String why = run.path("failure").asString();
                err.println("driftlab submit: run of variant "
                        + run.path("variant").asString() + " ended " + state + (why.isBlank() ? "" : ": " + why));
            }
        }
        return batch;
    }

    private static String progress(JsonNode batch, long started) {
        double done = 0;
        int total = 0;
        for (JsonNode run : batch.path("runs")) {
            int n = run.path("seeds").size();
            total += n;
            done += "done".equals(run.path("state").asString())
                    ? n
                    : run.path("progress").asDouble() * n;
        }
        int trials = (int) Math.floor(done + 1e-9);
        return String.format(
                Locale.ROOT,
                "submit: batch %d/%d trials, %d %%, %.0f s",
                trials,
                total,
                total == 0 ? 0 : 100 * trials / total,
                (System.nanoTime() - started) / 1e9);
    }

    private String timedOut(String token, JsonNode batch, boolean canCancel) {
        String what = "the batch did not finish within " + session.timeoutWords() + " (--timeout)";
        if (!canCancel) {
            return what + "; it goes on on the server (this link cannot cancel it)";
        }
        // a CI job that gave up should not leave a shared server busy with its runs
        session.graceForCleanUp();
        int cancelled = 0;
        for (JsonNode run : batch.path("runs")) {
            if (!run.path("finished").asBoolean()) {
                try {
                    HttpResponse<String> r = session.post(
                            "/api/s/" + token + "/runs/" + run.path("id").asLong() + "/cancel", null, "the cancel");
                    if (r.statusCode() / 100 == 2) {
                        cancelled++;
                    }
                } catch (NoAnswer e) {
                    return what + "; cancelling its runs failed: " + e.getMessage();
                }
            }
        }
        return what + "; cancelled its " + cancelled + (cancelled == 1 ? " unfinished run" : " unfinished runs");
    }

    /** Downloads the batch's files into the folder, prints the verdict and returns the status. */
    private int download(String runToken, JsonNode batch, Path dir) {
        String base = "/api/r/" + runToken;
        Path result = session.fetch(base + "/batch-result", dir, "result.json", "batch");
        Path report = session.fetch(base + "/batch-report.html", dir, "report.html", "batch");
        Path junit = session.fetch(base + "/batch-junit.xml", dir, "junit.xml", "batch");
        JsonNode doc;
        try {
            doc = JSON.readTree(Files.readString(result.resolveSibling(".result.json.part")));
        } catch (IOException | JacksonException e) {
            throw new NoAnswer("the server's result document does not read: " + e.getMessage());
        }
        StringBuilder lines = new StringBuilder();
        for (JsonNode t : doc.path("trials")) {
            lines.append(t.toString()).append('\n');
        }
        try {
            for (Path p : List.of(result, report, junit)) {
                Files.move(p.resolveSibling("." + p.getFileName() + ".part"), p, StandardCopyOption.REPLACE_EXISTING);
            }
            Files.writeString(dir.resolve("trials.jsonl"), lines, StandardCharsets.UTF_8);
        } catch (IOException e) {
            throw new UsageException(dir + ": cannot write: " + e.getMessage());
        }
        summary(doc, batch, report);
        return doc.path("passed").asBoolean() ? Cli.OK : Cli.FAILED;
    }

    private void summary(JsonNode doc, JsonNode batch, Path report) {
        out.println(doc.path("verdict").asString().replace('-', ' ').toUpperCase(Locale.ROOT) + ": "
                + doc.path("scenario").asString() + " ("
                + doc.path("trialsFinished").asInt() + " of "
                + doc.path("trialsPlanned").asInt() + " trials)");
        for (JsonNode v : doc.path("variants")) {
            for (JsonNode e : v.path("earlyEnds")) {
                out.println("  ! " + e.path("summary").asString() + " ["
                        + v.path("name").asString() + "]");
            }
        }
        for (JsonNode g : doc.path("gates")) {
            String mark = g.path("pass").asBoolean()
                    ? "pass "
                    : g.path("notExercised").asBoolean() ? "NOT EXERCISED " : "FAIL ";
            out.println("  " + mark + g.path("id").asString() + " ["
                    + g.path("variant").asString() + "]: " + g.path("reason").asString());
        }
        if (doc.path("cancelled").asBoolean()) {
            out.println("  cancelled: finished trials are in " + report.resolveSibling("result.json"));
        }
        out.println("  report: " + report);
    }
}
