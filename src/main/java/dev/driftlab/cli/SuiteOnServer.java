package dev.driftlab.cli;

import dev.driftlab.cli.Options.UsageException;
import dev.driftlab.cli.ServerSession.NoAnswer;
import dev.driftlab.cli.ServerSession.OutOfTime;
import dev.driftlab.cli.ServerSession.Refused;
import dev.driftlab.evaluation.Verdict;
import dev.driftlab.report.HtmlReport;
import dev.driftlab.report.JunitXml;
import dev.driftlab.report.Report;
import dev.driftlab.report.SuiteReport;
import dev.driftlab.report.SuiteResultJson;
import dev.driftlab.scenario.Profile;
import dev.driftlab.scenario.Scenario;
import dev.driftlab.scenario.ScenarioException;
import dev.driftlab.scenario.ScenarioFiles;
import dev.driftlab.trial.SuitePlan;
import dev.driftlab.trial.SuiteResult;
import java.io.IOException;
import java.io.PrintStream;
import java.net.http.HttpResponse;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import tools.jackson.core.JacksonException;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;
import tools.jackson.databind.node.ArrayNode;
import tools.jackson.databind.node.ObjectNode;

/**
 * {@code suite --server}: runs a suite on a Driftlab server and its workers instead of this
 * machine, and writes the same result.json, report.html and junit.xml. A suite file (or folder) is
 * checked here first, then its scenarios are uploaded and a new suite is stored from them on every
 * call; {@code --link} runs a suite the server already keeps, so that its previous run is the
 * baseline. {@code --baseline FILE} compares the server's result with that file here instead.
 * Exit statuses as {@code submit}.
 */
final class SuiteOnServer {

    private static final Pattern LINK = Pattern.compile("/suites/([A-Za-z0-9_-]+)");
    private static final Pattern REVISION = Pattern.compile("^revision (\\d+)\\b");
    private static final JsonMapper JSON = ServerSession.JSON;

    private final PrintStream out;
    private final PrintStream err;
    private final boolean terminal;
    private ServerSession session;
    /** An outside localizer from the server's list, by name; null for the built-in one. */
    private String localizer;

    SuiteOnServer(PrintStream out, PrintStream err) {
        this(out, err, System.console() != null);
    }

    SuiteOnServer(PrintStream out, PrintStream err, boolean terminal) {
        this.out = out;
        this.err = err;
        this.terminal = terminal;
    }

    /** What the server said about the suite when the run was started. */
    private record Started(String suiteToken, JsonNode suite, JsonNode run) {}

    int run(Options o) {
        String link = o.text("link", null);
        if (link != null && !o.positional().isEmpty()) {
            throw new UsageException("give either a suite file or folder, or --link, not both");
        }
        if (link == null && o.positional().size() != 1) {
            throw new UsageException("give exactly one suite file or folder of scenario files, or --link TOKEN");
        }
        for (String local : List.of("threads", "localizer", "answer-limit")) {
            if (o.text(local, null) != null) {
                throw new UsageException("--" + local + " goes with a suite run here; with --server the server's"
                        + " workers run it, with the built-in localizer or one of the server's list named by"
                        + " --server-localizer NAME");
            }
        }
        if (link != null) {
            for (String stored : List.of("seeds", "first-seed", "profile")) {
                if (o.text(stored, null) != null) {
                    throw new UsageException("--" + stored + " goes with a suite file; a link runs the suite as the"
                            + " server stores it");
                }
            }
        }
        String server = ServerSession.serverOf(o.required("server"));
        double timeoutMinutes = ServerSession.timeoutOf(o.text("timeout", "60"));
        SuiteJob.Input input = link == null ? SuiteJob.input(o) : null;
        String token = link == null ? null : ServerSession.tokenOf(link, LINK, "a suite link (.../suites/TOKEN)");
        Optional<SuiteReport.Baseline> baseline = SuiteJob.baseline(o);
        Path dir = Path.of(o.required("out"));
        try {
            Files.createDirectories(dir);
        } catch (IOException e) {
            throw new UsageException(dir + ": cannot create the output folder: " + e.getMessage());
        }
        boolean quiet = o.flag("quiet");
        localizer = ServerSession.listedLocalizer(o);
        session = new ServerSession("suite", server, timeoutMinutes, err);
        try {
            if (input != null) {
                token = store(input);
            }
            Started started = start(token, link != null);
            if (!quiet) {
                JsonNode doc = started.suite().path("document");
                int columns = doc.path("profiles").size() + 1;
                err.printf(
                        Locale.ROOT,
                        "suite: %s, %d scenarios x %d columns on %s%n",
                        started.suite().path("name").asString(),
                        doc.path("scenarios").size(),
                        columns,
                        server);
                // the view link only: a CI log is read by many, the edit link would let them change it
                err.println("  suite: " + server + "/suites/"
                        + started.suite().path("links").path("view").asString());
                err.println("  run: " + server + "/suite-runs/"
                        + started.run().path("link").asString());
            }
            JsonNode run = await(started, quiet);
            return download(started, run, baseline, dir);
        } catch (Refused e) {
            err.println("driftlab suite: " + e.getMessage());
            return Cli.BAD_INPUT;
        } catch (NoAnswer e) {
            err.println("driftlab suite: " + e.getMessage());
            return Cli.NO_ANSWER;
        }
    }

    /**
     * Uploads every scenario of the suite file and stores a new suite of them with the file's
     * profiles and seeds, so the server runs exactly what a local run would.
     *
     * @return the new suite's edit token (which may cancel its runs)
     */
    private String store(SuiteJob.Input input) {
        ObjectNode suite = JSON.createObjectNode();
        suite.put("name", input.name());
        suite.put("description", input.description());
        suite.put("firstSeed", input.firstSeed());
        ArrayNode entries = suite.putArray("scenarios");
        List<SuitePlan.Row> rows = input.plan().rows();
        for (int i = 0; i < rows.size(); i++) {
            SuitePlan.Entry e = rows.get(i).entry();
            String message = "Uploaded by driftlab suite from " + ServerSession.clip(input.source(), 100);
            HttpResponse<String> r = session.post(
                    "/api/scenarios?author=" + ServerSession.enc("driftlab suite") + "&message="
                            + ServerSession.enc(message),
                    input.documents().get(i),
                    "the upload of " + e.source());
            JsonNode body = session.answer(r, "the scenario " + e.source(), e.source());
            ObjectNode entry = entries.addObject();
            entry.put("link", body.path("editToken").asString());
            entry.put("seeds", e.seeds().length);
        }
        ArrayNode profiles = suite.putArray("profiles");
        for (String p : input.profileDocuments()) {
            profiles.add(JSON.readTree(p));
        }
        HttpResponse<String> r = session.post(
                "/api/suites?author=" + ServerSession.enc("driftlab suite"), suite.toString(), "the suite");
        return session.answer(r, "the suite", "suite").path("editLink").asString();
    }

    /** Reads the suite behind the token and starts a run of it, waiting while the queue is full. */
    private Started start(String token, boolean fromLink) {
        JsonNode suite = session.answer(
                session.get("/api/suites/" + token, "the suite"), "the suite", fromLink ? "--link" : "suite");
        while (true) {
            HttpResponse<String> r = session.post(
                    "/api/suites/" + token + "/runs",
                    localizer == null
                            ? null
                            : JSON.createObjectNode()
                                    .put("localizer", localizer)
                                    .toString(),
                    "the suite run");
            if (r.statusCode() == 503) {
                session.waitBusy(r.headers(), "the server's run queue is full");
                continue;
            }
            return new Started(token, suite, session.answer(r, "the suite run", "suite"));
        }
    }

    /** Polls the run until its result is stored, showing progress; cancels it on timeout when it can. */
    private JsonNode await(Started started, boolean quiet) {
        long begun = System.nanoTime();
        ServerSession.ProgressLine line = new ServerSession.ProgressLine(err, terminal, quiet);
        JsonNode run = started.run();
        String path = "/api/suite-runs/" + run.path("link").asString();
        while (!"finished".equals(run.path("state").asString())) {
            line.show(progress(run, begun));
            session.pause();
            if (session.outOfTime()) {
                line.interrupt();
                throw new NoAnswer(timedOut(started, run));
            }
            try {
                run = session.answer(session.get(path, "the suite run"), "the suite run", "suite run");
            } catch (OutOfTime e) {
                // a slow answer used up what --timeout left: the same as running out between polls
                line.interrupt();
                throw new NoAnswer(timedOut(started, run));
            }
        }
        line.last(progress(run, begun));
        for (JsonNode c : run.path("cells")) {
            String state = c.path("runState").asString();
            if (!"done".equals(state) && !"invalid".equals(state)) {
                err.println("driftlab suite: " + c.path("scenario").asString() + " ["
                        + c.path("column").asString() + "] ended " + state);
            }
        }
        return run;
    }

    private static String progress(JsonNode run, long begun) {
        int cells = 0;
        int ended = 0;
        for (JsonNode c : run.path("cells")) {
            String state = c.path("runState").asString();
            if (!"invalid".equals(state)) {
                cells++;
                if (!"queued".equals(state) && !"running".equals(state)) {
                    ended++;
                }
            }
        }
        return String.format(
                Locale.ROOT,
                "suite: %d %%, %d/%d cells ended, %.0f s",
                run.path("percent").asInt(0),
                ended,
                cells,
                (System.nanoTime() - begun) / 1e9);
    }

    private String timedOut(Started started, JsonNode run) {
        String what = "the suite run did not finish within " + session.timeoutWords() + " (--timeout)";
        if (!started.suite().path("canEdit").asBoolean()) {
            return what + "; it goes on on the server (this link cannot cancel it)";
        }
        // a CI job that gave up should not leave a shared server busy with its runs
        session.graceForCleanUp();
        try {
            HttpResponse<String> r = session.post(
                    "/api/suites/" + started.suiteToken() + "/runs/"
                            + run.path("id").asLong() + "/cancel",
                    null,
                    "the cancel");
            session.answer(r, "the cancel", "suite run");
        } catch (NoAnswer | Refused e) {
            return what + "; cancelling it failed: " + e.getMessage();
        }
        return what + "; cancelled it";
    }

    /**
     * Downloads the run's files into the folder (or, with a baseline file, makes them here from the
     * server's result compared with that file), prints the verdict and returns the status.
     */
    private int download(Started started, JsonNode run, Optional<SuiteReport.Baseline> baseline, Path dir) {
        String base = "/suite-runs/" + run.path("link").asString();
        Path result = session.fetch(base + "/result.json", dir, "result.json", "suite run");
        String text;
        JsonNode doc;
        try {
            text = Files.readString(part(result), StandardCharsets.UTF_8);
            doc = JSON.readTree(text);
        } catch (IOException | JacksonException e) {
            throw new NoAnswer("the server's result document does not read: " + e.getMessage());
        }
        Map<String, String> made = new LinkedHashMap<>();
        if (baseline.isPresent()) {
            SuiteReport report = compared(started, text, doc, baseline.get());
            made.put("result.json", SuiteResultJson.render(report));
            made.put("report.html", HtmlReport.render(report));
            made.put("junit.xml", JunitXml.render(report));
            doc = JSON.readTree(made.get("result.json"));
        } else {
            session.fetch(base + "/report.html", dir, "report.html", "suite run");
            session.fetch(base + "/junit.xml", dir, "junit.xml", "suite run");
        }
        try {
            for (String name : List.of("result.json", "report.html", "junit.xml")) {
                Path p = dir.resolve(name);
                if (made.containsKey(name)) {
                    Files.writeString(part(p), made.get(name), StandardCharsets.UTF_8);
                }
                Files.move(part(p), p, StandardCopyOption.REPLACE_EXISTING);
            }
        } catch (IOException e) {
            throw new UsageException(dir + ": cannot write: " + e.getMessage());
        }
        summary(doc, dir);
        return doc.path("passed").asBoolean() ? Cli.OK : Cli.FAILED;
    }

    private static Path part(Path file) {
        return file.resolveSibling("." + file.getFileName() + ".part");
    }

    /**
     * The server's result compared with the baseline file: the run read back from its document
     * (the scenarios and profiles it ran fetched from the server, revision by revision) and
     * reported as a local run would be.
     */
    private SuiteReport compared(Started started, String text, JsonNode doc, SuiteReport.Baseline baseline) {
        JsonNode suite = started.suite().path("document");
        JsonNode rows = doc.path("scenarios");
        JsonNode entries = suite.path("scenarios");
        if (rows.size() != entries.size()) {
            throw new NoAnswer("the suite changed on the server while it ran; run again to compare with --baseline");
        }
        List<Scenario> scenarios = new ArrayList<>();
        for (int i = 0; i < rows.size(); i++) {
            String source = rows.get(i).path("source").asString("");
            Matcher m = REVISION.matcher(source);
            if (!m.find()) {
                throw new NoAnswer(
                        "the server's result names no scenario revision (scenarios[" + i + "].source: " + source + ")");
            }
            String view = entries.get(i).path("link").asString();
            HttpResponse<String> r = session.get(
                    "/api/s/" + view + "/revisions/" + m.group(1) + "/document",
                    "scenario " + (i + 1) + " of the suite");
            if (r.statusCode() != 200) {
                session.answer(r, "scenario " + (i + 1) + " of the suite", "scenarios[" + i + "]");
                throw new NoAnswer("scenario " + (i + 1) + " of the suite: unexpected answer " + r.statusCode());
            }
            Optional<Scenario> s = ScenarioFiles.check(r.body()).scenario();
            if (s.isEmpty()) {
                throw new NoAnswer("scenario " + (i + 1) + " of the suite does not read as the server ran it");
            }
            scenarios.add(s.get());
        }
        try {
            List<Profile> profiles = new ArrayList<>();
            for (JsonNode p : suite.path("profiles")) {
                profiles.add(Profile.read(p.toString()));
            }
            SuiteResult result = SuiteResultJson.result(text, scenarios, profiles);
            return SuiteReport.of(
                            doc.path("suite").asString(),
                            doc.path("description").asString(""),
                            doc.path("source").asString(""),
                            result,
                            Optional.of(baseline),
                            doc.path("generatedAt").asString())
                    .withLocalizer(doc.path("localizer").asString(Report.BUILT_IN));
        } catch (ScenarioException e) {
            throw new NoAnswer("the server's result does not match its suite: "
                    + e.problems().get(0).path() + ": " + e.problems().get(0).message());
        }
    }

    private void summary(JsonNode doc, Path dir) {
        String verdict = Verdict.byFileName(doc.path("verdict").asString())
                .map(Verdict::word)
                .orElse(doc.path("verdict").asString());
        out.println(verdict.toUpperCase(Locale.ROOT) + ": suite "
                + doc.path("suite").asString() + " ("
                + doc.path("gatesPassing").asInt() + " of "
                + doc.path("gatesPlanned").asInt() + " gates hold, "
                + doc.path("trialsFinished").asInt() + " of "
                + doc.path("trialsPlanned").asInt() + " trials)");
        for (JsonNode s : doc.path("scenarios")) {
            for (JsonNode c : s.path("cells")) {
                String where =
                        s.path("name").asString() + " [" + c.path("column").asString() + "]";
                if ("invalid".equals(c.path("status").asString())) {
                    JsonNode p = c.path("problems").path(0);
                    out.println("  INVALID " + where + ": " + p.path("path").asString() + ": "
                            + p.path("message").asString());
                    continue;
                }
                for (JsonNode g : c.path("gates")) {
                    if (!g.path("pass").asBoolean()) {
                        out.println("  " + (g.path("notExercised").asBoolean() ? "NOT EXERCISED " : "FAIL ") + where
                                + " " + g.path("id").asString() + ": "
                                + g.path("reason").asString());
                    }
                }
            }
        }
        for (JsonNode c : doc.path("sinceBaseline")) {
            if ("regression".equals(c.path("kind").asString())) {
                out.println("  REGRESSION " + c.path("scenario").asString() + " ["
                        + c.path("column").asString() + "] "
                        + c.path("gate").asString() + ": held in the baseline ("
                        + c.path("before").asString()
                        + "), fails now (" + c.path("now").asString() + ")");
            }
        }
        if (doc.path("cancelled").asBoolean()) {
            out.println("  cancelled: the finished trials are in " + dir.resolve("result.json"));
        }
        out.println("  report: " + dir.resolve("report.html"));
    }
}
