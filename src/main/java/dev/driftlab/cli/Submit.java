package dev.driftlab.cli;

import dev.driftlab.cli.Options.UsageException;
import dev.driftlab.scenario.Scenario;
import dev.driftlab.scenario.ScenarioException;
import dev.driftlab.scenario.ScenarioFiles;
import dev.driftlab.scenario.ScenarioJson;
import java.io.IOException;
import java.io.InputStream;
import java.io.PrintStream;
import java.net.URI;
import java.net.URLEncoder;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.net.http.HttpTimeoutException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Set;
import java.util.regex.Matcher;
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
    private static final double MAX_TIMEOUT_MINUTES = 7 * 24 * 60;
    private static final Duration CONNECT = Duration.ofSeconds(10);
    private static final Duration REQUEST = Duration.ofSeconds(60);
    private static final Duration POLL = Duration.ofSeconds(1);
    // without a terminal (a CI log) a progress line every few seconds, not one per poll
    private static final long LOG_EVERY_NANOS = Duration.ofSeconds(5).toNanos();
    private static final Pattern TOKEN = Pattern.compile("[A-Za-z0-9_-]{10,100}");
    private static final Pattern LINK = Pattern.compile("/s/([A-Za-z0-9_-]+)");
    private static final JsonMapper JSON = JsonMapper.builder().build();

    /** An answer that says the request was wrong: printed as the server worded it, status 2. */
    static final class Refused extends RuntimeException {
        private static final long serialVersionUID = 1L;

        Refused(String message) {
            super(message);
        }
    }

    /** No usable answer (not reachable, failing, or out of time): status 3. */
    static class NoAnswer extends RuntimeException {
        private static final long serialVersionUID = 1L;

        NoAnswer(String message) {
            super(message);
        }
    }

    /** The whole command ran out of time (--timeout) while a request was under way. */
    static final class OutOfTime extends NoAnswer {
        private static final long serialVersionUID = 1L;

        OutOfTime(String message) {
            super(message);
        }
    }

    private final PrintStream out;
    private final PrintStream err;
    private final boolean terminal;
    private HttpClient http;
    private String server;
    private long deadline;
    private double timeoutMinutes;
    private String uploadedView;

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
                Set.of("server", "out", "seeds", "first-seed", "variants", "timeout", "link"),
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
        server = serverOf(o.required("server"));
        int seeds = o.integer("seeds", 20, 1, MAX_SEEDS);
        long firstSeed = o.longValue("first-seed", 1);
        timeoutMinutes = timeoutOf(o.text("timeout", "60"));
        String document = link == null ? document(o) : null;
        String token = link == null ? null : tokenOf(link);
        Path dir = Path.of(o.required("out"));
        try {
            Files.createDirectories(dir);
        } catch (IOException e) {
            throw new UsageException(dir + ": cannot create the output folder: " + e.getMessage());
        }
        boolean quiet = o.flag("quiet");
        deadline = System.nanoTime() + (long) (timeoutMinutes * 60e9);
        http = HttpClient.newBuilder()
                .connectTimeout(CONNECT)
                .followRedirects(HttpClient.Redirect.NEVER)
                .build();
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
        String message = "Uploaded by driftlab submit from " + clip(fileName, 100);
        HttpResponse<String> r = send(
                HttpRequest.newBuilder(
                                uri("/api/scenarios?author=" + enc("driftlab submit") + "&message=" + enc(message)))
                        .header("Content-Type", "application/json")
                        .POST(HttpRequest.BodyPublishers.ofString(document, StandardCharsets.UTF_8)),
                "the scenario upload");
        JsonNode body = answer(r, "the scenario", "file");
        uploadedView = body.path("viewToken").asString();
        return body.path("editToken").asString();
    }

    private JsonNode scenario(String token, boolean fromLink) {
        HttpResponse<String> r =
                send(HttpRequest.newBuilder(uri("/api/s/" + token)).GET(), "the scenario");
        JsonNode body = answer(r, "the link", fromLink ? "--link" : "link");
        if (!body.path("valid").asBoolean()) {
            StringBuilder sb = new StringBuilder("the scenario at this link does not validate, so it cannot run:");
            body.path("problems")
                    .forEach(p -> sb.append(System.lineSeparator()).append("  ").append(problem(p)));
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
        while (true) {
            HttpResponse<String> r = send(
                    HttpRequest.newBuilder(uri("/api/s/" + token + "/batches"))
                            .header("Content-Type", "application/json")
                            .POST(HttpRequest.BodyPublishers.ofString(request.toString())),
                    "the batch");
            if (r.statusCode() == 503) {
                waitBusy(r.headers(), "the server's run queue is full");
                continue;
            }
            return answer(r, "the batch", "batch");
        }
    }

    /** Polls the batch until every run is over, showing progress; cancels what it can on timeout. */
    private JsonNode await(String token, String batchKey, JsonNode batch, boolean quiet, boolean canCancel) {
        long started = System.nanoTime();
        long lastLine = Long.MIN_VALUE;
        String lastText = "";
        while (!batch.path("finished").asBoolean()) {
            if (!quiet) {
                String text = progress(batch, started);
                long now = System.nanoTime();
                if (terminal) {
                    err.print("\r" + text);
                } else if (lastLine == Long.MIN_VALUE || now - lastLine >= LOG_EVERY_NANOS && !text.equals(lastText)) {
                    err.println(text);
                    lastLine = now;
                    lastText = text;
                }
            }
            long left = deadline - System.nanoTime();
            sleep(Duration.ofNanos(Math.max(0, Math.min(POLL.toNanos(), left))));
            if (System.nanoTime() - deadline >= 0) {
                if (terminal && !quiet) {
                    err.println();
                }
                throw new NoAnswer(timedOut(token, batch, canCancel));
            }
            HttpResponse<String> r;
            try {
                r = send(
                        HttpRequest.newBuilder(uri("/api/s/" + token + "/batches/" + batchKey))
                                .GET(),
                        "the batch");
            } catch (OutOfTime e) {
                // a slow answer used up what --timeout left: the same as running out between polls
                if (terminal && !quiet) {
                    err.println();
                }
                throw new NoAnswer(timedOut(token, batch, canCancel));
            }
            batch = answer(r, "the batch", "batch");
        }
        if (!quiet) {
            String text = progress(batch, started);
            err.print(terminal ? "\r" + text + System.lineSeparator() : text + System.lineSeparator());
        }
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
        String what = "the batch did not finish within " + minutes(timeoutMinutes) + " (--timeout)";
        if (!canCancel) {
            return what + "; it goes on on the server (this link cannot cancel it)";
        }
        // a CI job that gave up should not leave a shared server busy with its runs
        deadline = System.nanoTime() + REQUEST.toNanos();
        int cancelled = 0;
        for (JsonNode run : batch.path("runs")) {
            if (!run.path("finished").asBoolean()) {
                try {
                    HttpResponse<String> r = send(
                            HttpRequest.newBuilder(uri("/api/s/" + token + "/runs/"
                                            + run.path("id").asLong() + "/cancel"))
                                    .POST(HttpRequest.BodyPublishers.noBody()),
                            "the cancel");
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
        Path result = fetch(base + "/batch-result", dir, "result.json");
        Path report = fetch(base + "/batch-report.html", dir, "report.html");
        Path junit = fetch(base + "/batch-junit.xml", dir, "junit.xml");
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

    /** Streams one file into {@code .NAME.part} beside its place; moved in once all are there. */
    private Path fetch(String path, Path dir, String name) {
        Path part = dir.resolve("." + name + ".part");
        while (true) {
            HttpResponse<InputStream> r =
                    sendStream(HttpRequest.newBuilder(uri(path)).GET(), name);
            try (InputStream in = r.body()) {
                if (r.statusCode() == 200) {
                    Files.copy(in, part, StandardCopyOption.REPLACE_EXISTING);
                    return dir.resolve(name);
                }
                String text = new String(in.readNBytes(64 * 1024), StandardCharsets.UTF_8);
                if (r.statusCode() == 503) {
                    waitBusy(r.headers(), "the server is making other reports");
                    continue;
                }
                answer(r.statusCode(), text, name, "batch");
                throw new NoAnswer(name + ": unexpected answer " + r.statusCode());
            } catch (IOException e) {
                throw new NoAnswer("downloading " + name + " failed: " + e.getMessage());
            }
        }
    }

    /** The answer's JSON when it is a success; a refusal or failure otherwise, worded as the server did. */
    private JsonNode answer(HttpResponse<String> r, String what, String field) {
        return answer(r.statusCode(), r.body(), what, field);
    }

    private static JsonNode answer(int status, String text, String what, String field) {
        JsonNode body;
        try {
            body = text == null || text.isBlank() ? JSON.nullNode() : JSON.readTree(text);
        } catch (JacksonException e) {
            body = JSON.nullNode();
        }
        if (status / 100 == 2) {
            if (!body.isObject()) {
                throw new NoAnswer(what + ": the server's answer is not the JSON expected (status " + status + ")");
            }
            return body;
        }
        String detail = body.path("detail").asString("");
        if (detail.isBlank()) {
            detail = "status " + status;
        }
        if (status == 404 || status == 403) {
            throw new Refused(field + ": " + detail);
        }
        if (status / 100 == 4) {
            StringBuilder sb = new StringBuilder("the server refused " + what + ": " + detail);
            body.path("problems")
                    .forEach(p -> sb.append(System.lineSeparator()).append("  ").append(problem(p)));
            throw new Refused(sb.toString());
        }
        throw new NoAnswer("the server failed on " + what + " (status " + status + "): " + detail);
    }

    private static String problem(JsonNode p) {
        return p.path("severity").asString() + " " + p.path("path").asString() + ": "
                + p.path("message").asString();
    }

    private HttpResponse<String> send(HttpRequest.Builder b, String what) {
        return exchange(b, HttpResponse.BodyHandlers.ofString(StandardCharsets.UTF_8), what);
    }

    private HttpResponse<InputStream> sendStream(HttpRequest.Builder b, String what) {
        return exchange(b, HttpResponse.BodyHandlers.ofInputStream(), what);
    }

    private <T> HttpResponse<T> exchange(HttpRequest.Builder b, HttpResponse.BodyHandler<T> handler, String what) {
        Duration left = Duration.ofNanos(deadline - System.nanoTime());
        if (left.isNegative() || left.isZero()) {
            throw new OutOfTime("out of time before " + what + " (--timeout " + minutes(timeoutMinutes) + ")");
        }
        boolean cappedByDeadline = left.compareTo(REQUEST) < 0;
        try {
            return http.send(b.timeout(cappedByDeadline ? left : REQUEST).build(), handler);
        } catch (HttpTimeoutException e) {
            if (cappedByDeadline) {
                throw new OutOfTime("out of time waiting for " + what + " (--timeout " + minutes(timeoutMinutes) + ")");
            }
            throw new NoAnswer("the server at " + server + " did not answer in time (" + what + ")");
        } catch (IOException e) {
            String why = e.getMessage() == null ? e.getClass().getSimpleName() : e.getMessage();
            throw new NoAnswer("cannot reach the server at " + server + " (" + what + "): " + why);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new NoAnswer("stopped while waiting for " + what);
        }
    }

    private void waitBusy(java.net.http.HttpHeaders headers, String why) {
        long seconds = headers.firstValue("Retry-After")
                .map(v -> {
                    try {
                        return Long.parseLong(v.strip());
                    } catch (NumberFormatException e) {
                        return 5L;
                    }
                })
                .orElse(5L);
        seconds = Math.max(1, Math.min(60, seconds));
        if (System.nanoTime() + seconds * 1_000_000_000L - deadline >= 0) {
            throw new NoAnswer(why + ", and --timeout " + minutes(timeoutMinutes) + " ends before it has room");
        }
        err.println("submit: " + why + "; trying again in " + seconds + " s");
        sleep(Duration.ofSeconds(seconds));
    }

    private static void sleep(Duration d) {
        try {
            Thread.sleep(d.toMillis());
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new NoAnswer("stopped while waiting for the batch");
        }
    }

    private URI uri(String path) {
        return URI.create(server + path);
    }

    private static String serverOf(String text) {
        String s = text.strip();
        while (s.endsWith("/")) {
            s = s.substring(0, s.length() - 1);
        }
        URI u;
        try {
            u = URI.create(s);
        } catch (IllegalArgumentException e) {
            u = null;
        }
        if (u == null
                || u.getHost() == null
                || !("http".equals(u.getScheme()) || "https".equals(u.getScheme()))
                || u.getQuery() != null
                || u.getFragment() != null) {
            throw new UsageException(
                    "--server must be an http:// or https:// address such as http://localhost:8080, got '" + text
                            + "'");
        }
        return s;
    }

    /** A bare token or a scenario link ({@code .../s/TOKEN}). */
    private static String tokenOf(String link) {
        String s = link.strip();
        Matcher m = LINK.matcher(s);
        String token = m.find() ? m.group(1) : s;
        if (!TOKEN.matcher(token).matches()) {
            throw new UsageException("--link must be a scenario link (.../s/TOKEN) or its token, got '" + link + "'");
        }
        return token;
    }

    private static double timeoutOf(String text) {
        double minutes;
        try {
            minutes = Double.parseDouble(text.strip());
        } catch (NumberFormatException e) {
            throw new UsageException("--timeout must be a number of minutes, got '" + text + "'");
        }
        if (!(minutes > 0) || minutes > MAX_TIMEOUT_MINUTES) {
            throw new UsageException("--timeout must be more than 0 and at most " + (long) MAX_TIMEOUT_MINUTES
                    + " minutes, got " + text.strip());
        }
        return minutes;
    }

    private static String minutes(double m) {
        return m == Math.rint(m)
                ? String.format(Locale.ROOT, "%d minutes", (long) m)
                : String.format(Locale.ROOT, "%.2f minutes", m);
    }

    private static String enc(String s) {
        return URLEncoder.encode(s, StandardCharsets.UTF_8);
    }

    private static String clip(String s, int max) {
        return s.length() <= max ? s : s.substring(0, max);
    }
}
