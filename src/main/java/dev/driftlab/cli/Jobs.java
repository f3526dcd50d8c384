package dev.driftlab.cli;

import dev.driftlab.cli.Options.UsageException;
import dev.driftlab.evaluation.BatchSummary;
import dev.driftlab.evaluation.EpisodeRules;
import dev.driftlab.evaluation.KeyFrames;
import dev.driftlab.evaluation.TrialOutcome;
import dev.driftlab.localizer.protocol.ProcessLocalizer;
import dev.driftlab.recording.FrameChunk;
import dev.driftlab.recording.FrameRecorder;
import dev.driftlab.report.HtmlReport;
import dev.driftlab.report.JunitXml;
import dev.driftlab.report.Report;
import dev.driftlab.report.ResultJson;
import dev.driftlab.scenario.Problem;
import dev.driftlab.scenario.Scenario;
import dev.driftlab.scenario.ScenarioException;
import dev.driftlab.scenario.ScenarioFiles;
import dev.driftlab.scenario.ScenarioJson;
import dev.driftlab.scenario.SettingsVariant;
import dev.driftlab.trial.BatchProgress;
import dev.driftlab.trial.BatchResult;
import dev.driftlab.trial.BatchRunner;
import dev.driftlab.trial.LocalizerSource;
import dev.driftlab.trial.OutsideLocalizer;
import dev.driftlab.trial.Sweep;
import dev.driftlab.trial.TrialRunner;
import java.io.IOException;
import java.io.PrintStream;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.time.Instant;
import java.time.temporal.ChronoUnit;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Optional;
import java.util.OptionalInt;
import java.util.Set;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicBoolean;

/** The {@code run}, {@code batch} and {@code sweep} subcommands. */
final class Jobs {

    private static final int MAX_SEEDS = 100_000;

    private final PrintStream out;
    private final PrintStream err;

    Jobs(PrintStream out, PrintStream err) {
        this.out = out;
        this.err = err;
    }

    int run(String[] args) {
        Options o = Options.parse(
                "run",
                args,
                Set.of("seed", "out", "variant", "frames-per-chunk", "localizer", "answer-limit"),
                Set.of("quiet"));
        Scenario s = scenario(o);
        Path dir = outDir(o);
        long seed = o.longValue("seed", 1);
        String variantName = o.text("variant", "base");
        SettingsVariant variant = s.allVariants().stream()
                .filter(v -> v.name().equals(variantName))
                .findFirst()
                .orElseThrow(() ->
                        new UsageException("no settings variant named '" + variantName + "'; the scenario has "
                                + String.join(
                                        ", ",
                                        s.allVariants().stream()
                                                .map(SettingsVariant::name)
                                                .toList())));
        int perChunk = o.integer("frames-per-chunk", 50, 1, 10_000);
        TrialRunner runner = new TrialRunner(s, localizers(o));
        Path frames = dir.resolve("frames");
        mkdirs(frames);
        FrameRecorder recorder = runner.recorder(
                perChunk,
                (index, first, count, data) ->
                        write(frames.resolve(String.format(Locale.ROOT, "chunk-%05d.bin", index)), data));
        long started = System.nanoTime();
        if (!o.flag("quiet")) {
            err.println("run: " + s.name() + ", variant " + variant.name() + ", seed " + seed);
        }
        TrialRunner.Result r = runner.run(variant, seed, recorder, EpisodeRules.defaults(), () -> false);
        double seconds = (System.nanoTime() - started) / 1e9;
        writeText(
                frames.resolve("index.json"),
                String.format(
                        Locale.ROOT,
                        "{%n  \"frames\": %d,%n  \"chunks\": %d,%n  \"framesPerChunk\": %d,%n  \"bytes\": %d%n}%n",
                        recorder.frames(),
                        recorder.chunks(),
                        recorder.framesPerChunk(),
                        recorder.bytes()));
        BatchResult result =
                new BatchResult(List.of(r.outcome()), BatchSummary.of(List.of(r.outcome()), s), 1, false, seconds);
        List<Report.KeyFrame> keys = new ArrayList<>();
        for (KeyFrames.Pick p : KeyFrames.pick(r.trace(), r.outcome())) {
            int chunk = p.index() / perChunk;
            byte[] data = read(frames.resolve(String.format(Locale.ROOT, "chunk-%05d.bin", chunk)));
            keys.add(new Report.KeyFrame(p.caption(), FrameChunk.frame(data, p.index() % perChunk)));
        }
        Report report = Report.of(
                        Report.Kind.RUN,
                        s,
                        source(o),
                        new long[] {seed},
                        result,
                        Optional.of(r.trace()),
                        OptionalInt.empty(),
                        new int[0],
                        now())
                .withKeyFrames(
                        keys, dev.driftlab.sim.ScanGeometry.of(s.rangefinder()).copyAngles())
                .withLocalizer(runner.localizers().name());
        if (!o.flag("quiet")) {
            err.printf(
                    Locale.ROOT,
                    "run: %.1f s of robot time in %.2f s, %d frames (%.1f MB), ended %s%n",
                    r.outcome().duration(),
                    seconds,
                    recorder.frames(),
                    recorder.bytes() / 1e6,
                    r.summary().outcome().name().toLowerCase(Locale.ROOT).replace('_', ' '));
        }
        return finish(report, dir);
    }

    int batch(String[] args) {
        Options o = Options.parse(
                "batch",
                args,
                Set.of("seeds", "first-seed", "out", "threads", "variants", "localizer", "answer-limit"),
                Set.of("quiet"));
        Scenario s = scenario(o);
        Path dir = outDir(o);
        List<SettingsVariant> variants = new ArrayList<>(s.allVariants());
        if (o.text("variants", null) != null) {
            Path vf = Path.of(o.required("variants"));
            try {
                variants.addAll(ScenarioJson.readVariants(Cli.readFile(vf), s));
            } catch (IOException e) {
                throw new UsageException(vf + ": cannot read: " + e.getMessage());
            } catch (ScenarioException e) {
                throw new BadScenario(vf.toString(), e.problems());
            }
        }
        long[] seeds = seeds(o);
        int threads = threads(o);
        return runBatch(
                Report.Kind.BATCH,
                new BatchRunner(s, threads, localizers(o)),
                s,
                source(o),
                dir,
                variants,
                seeds,
                threads,
                o.flag("quiet"),
                OptionalInt.empty(),
                new int[0]);
    }

    int sweep(String[] args) {
        Options o = Options.parse(
                "sweep",
                args,
                Set.of("particles", "seeds", "first-seed", "out", "threads", "localizer", "answer-limit"),
                Set.of("quiet"));
        Scenario s = scenario(o);
        Path dir = outDir(o);
        int[] counts = o.integers("particles", 1, dev.driftlab.scenario.Limits.MAX_PARTICLES);
        List<SettingsVariant> variants = Sweep.variants(s.localizer(), counts);
        long[] seeds = seeds(o);
        int threads = threads(o);
        // one compiled site serves the KLD probe and every trial
        BatchRunner batch = new BatchRunner(s, threads, localizers(o));
        int kld = Sweep.kldRequired(batch.trialRunner(), s.localizer(), seeds[0]);
        return runBatch(
                Report.Kind.SWEEP,
                batch,
                s,
                source(o),
                dir,
                variants,
                seeds,
                threads,
                o.flag("quiet"),
                OptionalInt.of(kld),
                counts);
    }

    private int runBatch(
            Report.Kind kind,
            BatchRunner batch,
            Scenario s,
            String source,
            Path dir,
            List<SettingsVariant> variants,
            long[] seeds,
            int threads,
            boolean quiet,
            OptionalInt kld,
            int[] counts) {
        AtomicBoolean cancel = new AtomicBoolean();
        CountDownLatch written = new CountDownLatch(1);
        Thread hook = new Thread(
                () -> {
                    cancel.set(true);
                    try {
                        written.await(60, TimeUnit.SECONDS);
                    } catch (InterruptedException e) {
                        Thread.currentThread().interrupt();
                    }
                },
                "driftlab-stop");
        Runtime.getRuntime().addShutdownHook(hook);
        Path stream = dir.resolve("trials.jsonl");
        writeText(stream, "");
        long started = System.nanoTime();
        Progress progress = new Progress(err, kind.name().toLowerCase(Locale.ROOT), quiet, started);
        if (!quiet) {
            err.printf(
                    Locale.ROOT,
                    "%s: %s, %d variants x %d seeds on %d threads%n",
                    kind.name().toLowerCase(Locale.ROOT),
                    s.name(),
                    variants.size(),
                    seeds.length,
                    threads);
        }
        try {
            BatchProgress onTrial = (done, total, last) -> {
                appendLine(stream, trialLine(last));
                progress.update(done, total);
            };
            BatchResult result = batch.run(variants, seeds, EpisodeRules.defaults(), onTrial, cancel);
            progress.done();
            Report report = Report.of(kind, s, source, seeds, result, Optional.empty(), kld, counts, now())
                    .withLocalizer(batch.trialRunner().localizers().name());
            return finish(report, dir);
        } finally {
            written.countDown();
            try {
                Runtime.getRuntime().removeShutdownHook(hook);
            } catch (IllegalStateException alreadyStopping) {
                // the JVM is shutting down: the hook is running and waits for the latch released above
            }
        }
    }

    private int finish(Report report, Path dir) {
        writeText(dir.resolve("result.json"), ResultJson.render(report));
        writeText(dir.resolve("report.html"), HtmlReport.render(report));
        writeText(dir.resolve("junit.xml"), JunitXml.render(report));
        out.println(report.verdict().word().toUpperCase(java.util.Locale.ROOT) + ": "
                + report.scenario().name() + " (" + report.trials().size() + " of " + report.planned() + " trials)");
        dev.driftlab.report.Findings.headline(report).forEach(line -> out.println("  ! " + line));
        report.verdicts()
                .forEach(v -> out.println("  " + (v.pass() ? "pass " : v.notExercised() ? "NOT EXERCISED " : "FAIL ")
                        + v.gate().id() + " [" + v.variant() + "]: " + v.reason()));
        if (report.cancelled()) {
            out.println("  cancelled: finished trials are in " + dir.resolve("result.json"));
        }
        out.println("  report: " + dir.resolve("report.html"));
        return report.passed() ? Cli.OK : Cli.FAILED;
    }

    private Scenario scenario(Options o) {
        if (o.positional().size() != 1) {
            throw new UsageException("give exactly one scenario file");
        }
        Path file = Path.of(o.positional().get(0));
        String text;
        try {
            text = Cli.readFile(file);
        } catch (IOException e) {
            throw new UsageException(file + ": cannot read: " + e.getMessage());
        }
        ScenarioFiles.Checked checked = ScenarioFiles.check(text);
        if (!checked.ok()) {
            throw new BadScenario(file.toString(), checked.report().problems());
        }
        return checked.scenario().orElseThrow();
    }

    private static String source(Options o) {
        return Path.of(o.positional().get(0)).getFileName().toString();
    }

    private static Path outDir(Options o) {
        Path dir = Path.of(o.required("out"));
        mkdirs(dir);
        return dir;
    }

    /** The built-in localizer, or the outside program of {@code --localizer} with its time limit. */
    static LocalizerSource localizers(Options o) {
        String command = o.text("localizer", null);
        if (command == null) {
            if (o.text("answer-limit", null) != null) {
                throw new UsageException("--answer-limit applies to an outside localizer; give --localizer too");
            }
            return LocalizerSource.BUILT_IN;
        }
        ProcessLocalizer.Limits limits = ProcessLocalizer.Limits.DEFAULT;
        String limit = o.text("answer-limit", null);
        if (limit != null) {
            double seconds;
            try {
                seconds = Double.parseDouble(limit.strip());
            } catch (NumberFormatException e) {
                throw new UsageException("--answer-limit must be a number of seconds, got '" + limit + "'");
            }
            if (!(seconds >= 0.01 && seconds <= 600)) {
                throw new UsageException("--answer-limit must be between 0.01 and 600 seconds, got " + limit);
            }
            limits = limits.withAnswer(java.time.Duration.ofNanos(Math.round(seconds * 1e9)));
        }
        return new OutsideLocalizer(CommandLine.split("localizer", command), limits);
    }

    private static long[] seeds(Options o) {
        int count = o.integer("seeds", 20, 1, MAX_SEEDS);
        return BatchRunner.seeds(o.longValue("first-seed", 1), count);
    }

    private static int threads(Options o) {
        return o.integer("threads", Runtime.getRuntime().availableProcessors(), 1, 256);
    }

    private static String trialLine(TrialOutcome t) {
        var node = tools.jackson.databind.json.JsonMapper.builder().build().createObjectNode();
        dev.driftlab.report.ResultJson.trialNode(node, t);
        return node.toString();
    }

    private static String now() {
        return Instant.now().truncatedTo(ChronoUnit.SECONDS).toString();
    }

    private static void mkdirs(Path dir) {
        try {
            Files.createDirectories(dir);
        } catch (IOException e) {
            throw new UsageException(dir + ": cannot create the output folder: " + e.getMessage());
        }
    }

    private static void write(Path file, byte[] data) {
        try {
            Files.write(file, data);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    private static byte[] read(Path file) {
        try {
            return Files.readAllBytes(file);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    private static void writeText(Path file, String text) {
        write(file, text.getBytes(StandardCharsets.UTF_8));
    }

    private static synchronized void appendLine(Path file, String line) {
        try {
            Files.writeString(file, line + "\n", StandardCharsets.UTF_8, StandardOpenOption.APPEND);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** A scenario file that was refused; every problem is printed. */
    static final class BadScenario extends RuntimeException {
        private static final long serialVersionUID = 1L;
        private final transient List<Problem> problems;

        BadScenario(String file, List<Problem> problems) {
            super(file + ": refused (" + count(problems) + ")");
            this.problems = List.copyOf(problems);
        }

        List<Problem> problems() {
            return problems;
        }

        private static String count(List<Problem> problems) {
            long n = problems.stream().filter(Problem::isError).count();
            return n + (n == 1 ? " error" : " errors");
        }
    }

    /** Prints progress: a rewriting line on a terminal, a line per tenth otherwise. */
    private static final class Progress {
        private final PrintStream err;
        private final String label;
        private final boolean quiet;
        private final long started;
        private final boolean terminal = System.console() != null;
        private int lastTenth = -1;

        Progress(PrintStream err, String label, boolean quiet, long started) {
            this.err = err;
            this.label = label;
            this.quiet = quiet;
            this.started = started;
        }

        synchronized void update(int done, int total) {
            if (quiet) {
                return;
            }
            double seconds = (System.nanoTime() - started) / 1e9;
            String line = String.format(
                    Locale.ROOT, "%s: %d/%d trials (%d %%), %.1f s", label, done, total, 100 * done / total, seconds);
            if (terminal) {
                err.print("\r" + line);
            } else {
                int tenth = 10 * done / total;
                if (tenth != lastTenth) {
                    lastTenth = tenth;
                    err.println(line);
                }
            }
        }

        synchronized void done() {
            if (!quiet && terminal) {
                err.println();
            }
        }
    }
}
