package dev.driftlab.cli;

import dev.driftlab.cli.Options.UsageException;
import dev.driftlab.trial.OutsideLocalizer;
import java.io.IOException;
import java.io.InputStream;
import java.io.PrintStream;
import java.net.URI;
import java.net.URLEncoder;
import java.net.http.HttpClient;
import java.net.http.HttpHeaders;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.net.http.HttpTimeoutException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.time.Duration;
import java.util.Locale;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import tools.jackson.core.JacksonException;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;

/**
 * One command's conversation with a Driftlab server ({@code submit}, {@code suite --server}): every
 * request bounded by the command's {@code --timeout}, answers read as JSON and sorted into
 * refusals (status 2, worded as the server worded them) and no answer (status 3), waits on a busy
 * server's {@code Retry-After}, downloads streamed beside their place, and the progress line.
 */
final class ServerSession {

    static final double MAX_TIMEOUT_MINUTES = 7 * 24 * 60;
    static final Duration REQUEST = Duration.ofSeconds(60);
    static final Duration POLL = Duration.ofSeconds(1);
    private static final Duration CONNECT = Duration.ofSeconds(10);
    // without a terminal (a CI log) a progress line every few seconds, not one per poll
    private static final long LOG_EVERY_NANOS = Duration.ofSeconds(5).toNanos();
    private static final Pattern TOKEN = Pattern.compile("[A-Za-z0-9_-]{10,100}");
    static final JsonMapper JSON = JsonMapper.builder().build();

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

    private final String command;
    private final String server;
    private final double timeoutMinutes;
    private final PrintStream err;
    private final HttpClient http;
    private long deadline;

    /**
     * @param command the command's name, for messages ("submit", "suite")
     * @param server the server's address as {@link #serverOf} returns it
     * @param timeoutMinutes the whole command's time, from now
     * @param err where waits are reported
     */
    ServerSession(String command, String server, double timeoutMinutes, PrintStream err) {
        this.command = command;
        this.server = server;
        this.timeoutMinutes = timeoutMinutes;
        this.err = err;
        this.deadline = System.nanoTime() + (long) (timeoutMinutes * 60e9);
        this.http = HttpClient.newBuilder()
                .connectTimeout(CONNECT)
                .followRedirects(HttpClient.Redirect.NEVER)
                .build();
    }

    String server() {
        return server;
    }

    /** {@code --timeout} in words, for messages. */
    String timeoutWords() {
        return minutes(timeoutMinutes);
    }

    /** Whether {@code --timeout} has passed. */
    boolean outOfTime() {
        return System.nanoTime() - deadline >= 0;
    }

    /** Sleeps one poll interval, or less when {@code --timeout} ends sooner. */
    void pause() {
        long left = deadline - System.nanoTime();
        sleep(Duration.ofNanos(Math.max(0, Math.min(POLL.toNanos(), left))));
    }

    /** Gives the clean-up after a timeout (cancelling what was started) one request's time. */
    void graceForCleanUp() {
        deadline = System.nanoTime() + REQUEST.toNanos();
    }

    HttpResponse<String> get(String path, String what) {
        return send(HttpRequest.newBuilder(uri(path)).GET(), what);
    }

    HttpResponse<String> post(String path, String json, String what) {
        HttpRequest.Builder b = HttpRequest.newBuilder(uri(path));
        if (json == null) {
            b.POST(HttpRequest.BodyPublishers.noBody());
        } else {
            b.header("Content-Type", "application/json")
                    .POST(HttpRequest.BodyPublishers.ofString(json, StandardCharsets.UTF_8));
        }
        return send(b, what);
    }

    HttpResponse<String> send(HttpRequest.Builder b, String what) {
        return exchange(b, HttpResponse.BodyHandlers.ofString(StandardCharsets.UTF_8), what);
    }

    /** The answer's JSON when it is a success; a refusal or failure otherwise, worded as the server did. */
    JsonNode answer(HttpResponse<String> r, String what, String field) {
        return answer(r.statusCode(), r.body(), what, field);
    }

    static JsonNode answer(int status, String text, String what, String field) {
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

    static String problem(JsonNode p) {
        return p.path("severity").asString() + " " + p.path("path").asString() + ": "
                + p.path("message").asString();
    }

    /**
     * Streams one file into {@code .NAME.part} in the folder, waiting while the server is busy
     * making other reports; the caller moves it into place once every file is there.
     *
     * @return the file's final place
     */
    Path fetch(String path, Path dir, String name, String field) {
        Path part = dir.resolve("." + name + ".part");
        while (true) {
            HttpResponse<InputStream> r =
                    exchange(HttpRequest.newBuilder(uri(path)).GET(), HttpResponse.BodyHandlers.ofInputStream(), name);
            try (InputStream in = r.body()) {
                if (r.statusCode() == 200) {
                    java.nio.file.Files.copy(in, part, StandardCopyOption.REPLACE_EXISTING);
                    return dir.resolve(name);
                }
                String text = new String(in.readNBytes(64 * 1024), StandardCharsets.UTF_8);
                if (r.statusCode() == 503) {
                    waitBusy(r.headers(), "the server is making other reports");
                    continue;
                }
                answer(r.statusCode(), text, name, field);
                throw new NoAnswer(name + ": unexpected answer " + r.statusCode());
            } catch (IOException e) {
                throw new NoAnswer("downloading " + name + " failed: " + e.getMessage());
            }
        }
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

    /** Waits what a 503's {@code Retry-After} asks (1 to 60 s), or gives up when --timeout ends first. */
    void waitBusy(HttpHeaders headers, String why) {
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
        err.println(command + ": " + why + "; trying again in " + seconds + " s");
        sleep(Duration.ofSeconds(seconds));
    }

    private static void sleep(Duration d) {
        try {
            Thread.sleep(d.toMillis());
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new NoAnswer("stopped while waiting for the server");
        }
    }

    private URI uri(String path) {
        return URI.create(server + path);
    }

    /** The {@code --server} address without trailing slashes, or a usage error. */
    static String serverOf(String text) {
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

    /**
     * A bare token or a link whose path holds it after {@code /PREFIX/}.
     *
     * @param what how the message names a link ("a scenario link (.../s/TOKEN)")
     */
    static String tokenOf(String link, Pattern inLink, String what) {
        String s = link.strip();
        Matcher m = inLink.matcher(s);
        String token = m.find() ? m.group(1) : s;
        if (!TOKEN.matcher(token).matches()) {
            throw new UsageException("--link must be " + what + " or its token, got '" + link + "'");
        }
        return token;
    }

    /** {@code --timeout} in minutes, fractions allowed. */
    static double timeoutOf(String text) {
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

    static String minutes(double m) {
        return m == Math.rint(m)
                ? String.format(Locale.ROOT, "%d minutes", (long) m)
                : String.format(Locale.ROOT, "%.2f minutes", m);
    }

    static String enc(String s) {
        return URLEncoder.encode(s, StandardCharsets.UTF_8);
    }

    static String clip(String s, int max) {
        return s.length() <= max ? s : s.substring(0, max);
    }

    /**
     * The progress line while the server works: rewritten in place on a terminal, one line every
     * few seconds (and only when it changed) in a log.
     */
    static final class ProgressLine {
        private final PrintStream err;
        private final boolean terminal;
        private final boolean quiet;
        private long lastLine = Long.MIN_VALUE;
        private String lastText = "";

        ProgressLine(PrintStream err, boolean terminal, boolean quiet) {
            this.err = err;
            this.terminal = terminal;
            this.quiet = quiet;
        }

        void show(String text) {
            if (quiet) {
                return;
            }
            long now = System.nanoTime();
            if (terminal) {
                err.print("\r" + text);
            } else if (lastLine == Long.MIN_VALUE || now - lastLine >= LOG_EVERY_NANOS && !text.equals(lastText)) {
                err.println(text);
                lastLine = now;
                lastText = text;
            }
        }

        /** The last line, always shown, ending the line. */
        void last(String text) {
            if (!quiet) {
                err.print(terminal ? "\r" + text + System.lineSeparator() : text + System.lineSeparator());
            }
        }

        /** Ends a rewritten line before a message follows it. */
        void interrupt() {
            if (terminal && !quiet) {
                err.println();
            }
        }
    }

    /**
     * The {@code --server-localizer NAME} option: an outside localizer the server's administrator
     * listed, by name (the server refuses a name none of its processes offers); null when absent.
     */
    static String listedLocalizer(Options o) {
        String name = o.text("server-localizer", null);
        if (name == null) {
            return null;
        }
        String n = name.strip();
        if (!OutsideLocalizer.LISTED_NAME.matcher(n).matches()) {
            throw new Options.UsageException("--server-localizer takes a name from the server's list (GET"
                    + " /api/localizers), e.g. dead-reckoning; a command runs locally with --localizer");
        }
        return n;
    }
}
