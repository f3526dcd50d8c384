package dev.driftlab.cli;

import dev.driftlab.cli.Options.UsageException;
import dev.driftlab.evaluation.EpisodeRules;
import dev.driftlab.evaluation.GateChange;
import dev.driftlab.report.HtmlReport;
import dev.driftlab.report.JunitXml;
import dev.driftlab.report.SuiteReport;
import dev.driftlab.report.SuiteResultJson;
import dev.driftlab.scenario.Profile;
import dev.driftlab.scenario.ScenarioException;
import dev.driftlab.scenario.ScenarioFiles;
import dev.driftlab.scenario.SuiteFile;
import dev.driftlab.trial.BatchProgress;
import dev.driftlab.trial.BatchRunner;
import dev.driftlab.trial.LocalizerSource;
import dev.driftlab.trial.SuitePlan;
import dev.driftlab.trial.SuiteResult;
import dev.driftlab.trial.SuiteRunner;
import java.io.IOException;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.time.Instant;
import java.time.temporal.ChronoUnit;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;
import java.util.OptionalInt;
import java.util.Set;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicBoolean;
import java.util.stream.Stream;

/**
 * The {@code suite} subcommand: reads a suite file (or a folder of scenario files), the profiles
 * and the baseline, checks all of it before running anything, runs every scenario as it is and
 * under each profile on the same seeds, and writes result.json, report.html and junit.xml. Bad
 * input writes nothing: the output folder is made only once every input has been read and
 * checked, and the three files are rendered before the first is written. With {@code --server} or
 * {@code --link} the run happens on a server instead ({@link SuiteOnServer}).
 */
final class SuiteJob {

    /** Ending of suite files, which a folder given in place of a suite file is searched for. */
    static final String SUITE_ENDING = ".suite.json";

    /** Ending of profile files, left out when a folder's scenario files make the suite. */
    static final String PROFILE_ENDING = ".profile.json";

    private static final int MAX_TRIALS = 10_000_000;

    private final PrintStream out;
    private final PrintStream err;

    SuiteJob(PrintStream out, PrintStream err) {
        this.out = out;
        this.err = err;
    }

    /**
     * What the files say, read and checked.
     *
     * @param name the suite's name
     * @param description what it is for
     * @param source the suite file's or folder's name
     * @param plan what runs
     * @param documents each scenario file's text, in the plan's order (what a server is sent)
     * @param profileDocuments each profile file's text, in column order
     * @param firstSeed the first seed
     */
    record Input(
            String name,
            String description,
            String source,
            SuitePlan plan,
            List<String> documents,
            List<String> profileDocuments,
            long firstSeed) {}

    int run(String[] args) {
        Options o = Options.parse(
                "suite",
                args,
                Set.of(
                        "seeds",
                        "first-seed",
                        "profile",
                        "baseline",
                        "threads",
                        "out",
                        "localizer",
                        "answer-limit",
                        "server",
                        "link",
                        "timeout",
                        "server-localizer"),
                Set.of("quiet"));
        if (o.text("server", null) != null || o.text("link", null) != null) {
            return new SuiteOnServer(out, err).run(o);
        }
        if (o.text("timeout", null) != null) {
            throw new UsageException("--timeout goes with --server; a local suite runs until it is done");
        }
        if (o.text("server-localizer", null) != null) {
            throw new UsageException("--server-localizer names a localizer of the server's list and goes with"
                    + " --server; here, give your program with --localizer \"COMMAND ARGS\"");
        }
        if (o.positional().size() != 1) {
            throw new UsageException("give exactly one suite file or folder of scenario files");
        }
        Path outDir = Path.of(o.required("out"));
        Input input = input(o);
        Optional<SuiteReport.Baseline> baseline = baseline(o);
        int threads = o.integer("threads", Runtime.getRuntime().availableProcessors(), 1, 256);
        boolean quiet = o.flag("quiet");
        LocalizerSource localizers = Jobs.localizers(o);
        mkdirs(outDir);

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
        try {
            SuitePlan plan = input.plan();
            if (!quiet) {
                err.printf(
                        Locale.ROOT,
                        "suite: %s, %d scenarios x %d columns, %d trials on %d threads%n",
                        input.name(),
                        plan.rows().size(),
                        plan.columns().size(),
                        plan.trials(),
                        threads);
                for (SuitePlan.Row row : plan.rows()) {
                    for (SuitePlan.Cell c : row.cells()) {
                        if (c.invalid()) {
                            err.println("suite: profile \"" + c.name() + "\" makes \""
                                    + row.entry().name() + "\" invalid; it is reported, not run");
                        }
                    }
                }
            }
            BatchProgress progress = quiet ? BatchProgress.NONE : new Tenths(err);
            SuiteResult result =
                    new SuiteRunner(threads, localizers).run(plan, EpisodeRules.defaults(), progress, cancel);
            SuiteReport report = SuiteReport.of(
                    input.name(),
                    input.description(),
                    input.source(),
                    result,
                    baseline,
                    Instant.now().truncatedTo(ChronoUnit.SECONDS).toString());
            if (localizers != LocalizerSource.BUILT_IN) {
                report = report.withLocalizer(localizers.name());
            }
            Map<String, String> files = new LinkedHashMap<>();
            files.put("result.json", SuiteResultJson.render(report));
            files.put("report.html", HtmlReport.render(report));
            files.put("junit.xml", JunitXml.render(report));
            files.forEach((name, text) -> write(outDir, name, text));
            summary(report, outDir);
            return report.passed() ? Cli.OK : Cli.FAILED;
        } finally {
            written.countDown();
            try {
                Runtime.getRuntime().removeShutdownHook(hook);
            } catch (IllegalStateException alreadyStopping) {
                // the JVM is shutting down: the hook is running and waits for the latch released above
            }
        }
    }

    private void summary(SuiteReport report, Path dir) {
        SuiteResult res = report.result();
        out.println(report.verdict().word().toUpperCase(Locale.ROOT) + ": suite " + report.name() + " ("
                + res.gatesPassing() + " of " + res.gatesPlanned() + " gates hold, " + res.finished() + " of "
                + res.planned() + " trials)");
        for (SuiteResult.Row row : res.rows()) {
            for (SuitePlan.Cell c : row.plan().cells()) {
                if (c.invalid()) {
                    out.println("  INVALID " + row.name() + " [" + c.name() + "]: "
                            + c.problems().get(0));
                    continue;
                }
                row.column(c.name())
                        .ifPresent(v -> v.gates().forEach(g -> {
                            if (!g.pass()) {
                                out.println("  " + (g.notExercised() ? "NOT EXERCISED " : "FAIL ") + row.name() + " ["
                                        + c.name() + "] " + g.gate().id() + ": " + g.reason());
                            }
                        }));
            }
        }
        for (GateChange c : report.regressions()) {
            out.println("  REGRESSION " + c.after().scenario() + " ["
                    + c.after().column() + "] " + c.after().gate() + ": held in the baseline ("
                    + c.before().counts() + "), fails now (" + c.after().counts() + ")");
        }
        out.println("  report: " + dir.resolve("report.html"));
    }

    static Input input(Options o) {
        Path given = Path.of(o.positional().get(0));
        Path suiteFile;
        SuiteFile suite;
        Path folder;
        if (Files.isDirectory(given)) {
            List<Path> suites = list(given, p -> p.endsWith(SUITE_ENDING));
            if (suites.size() > 1) {
                throw new UsageException(given + " holds " + suites.size() + " suite files; name one of them");
            }
            if (suites.size() == 1) {
                suiteFile = suites.get(0);
                suite = readSuite(suiteFile);
                folder = given;
            } else {
                List<Path> scenarios = list(
                        given, p -> p.endsWith(".json") && !p.endsWith(PROFILE_ENDING) && !p.endsWith(SUITE_ENDING));
                if (scenarios.isEmpty()) {
                    throw new UsageException(given + " holds no scenario file (*.json): the suite would be empty");
                }
                suiteFile = null;
                folder = given;
                suite = new SuiteFile(
                        name(given),
                        "",
                        SuiteFile.DEFAULT_SEEDS,
                        scenarios.stream()
                                .map(p -> new SuiteFile.Entry(p.getFileName().toString(), OptionalInt.empty()))
                                .toList(),
                        List.of());
            }
        } else {
            suiteFile = given;
            suite = readSuite(given);
            folder = given.toAbsolutePath().getParent();
        }
        String source = suiteFile != null ? suiteFile.getFileName().toString() : name(given) + "/";
        String label = suiteFile != null ? suiteFile.toString() : given.toString();

        OptionalInt seedsOverride = o.text("seeds", null) == null
                ? OptionalInt.empty()
                : OptionalInt.of(o.integer("seeds", 1, 1, SuiteFile.MAX_SEEDS));
        long first = o.longValue("first-seed", 1);
        List<SuitePlan.Entry> entries = new ArrayList<>();
        List<String> documents = new ArrayList<>();
        List<String> profileDocuments = new ArrayList<>();
        Set<String> names = new HashSet<>();
        long trials = 0;
        for (int i = 0; i < suite.scenarios().size(); i++) {
            SuiteFile.Entry e = suite.scenarios().get(i);
            Path file = folder.resolve(e.file());
            String text;
            try {
                text = Cli.readFile(file);
            } catch (IOException | IllegalArgumentException x) {
                throw new UsageException(
                        label + ": scenarios[" + i + "].file: cannot read " + file + ": " + x.getMessage());
            }
            ScenarioFiles.Checked checked = ScenarioFiles.check(text);
            if (!checked.ok()) {
                throw new Jobs.BadScenario(file.toString(), checked.report().problems());
            }
            var scenario = checked.scenario().orElseThrow();
            documents.add(text);
            String name = names.add(scenario.name()) ? scenario.name() : scenario.name() + " (" + e.file() + ")";
            names.add(name);
            int count = seedsOverride.orElse(e.seedsOr(suite.seeds()));
            trials += count;
            entries.add(new SuitePlan.Entry(name, e.file(), scenario, BatchRunner.seeds(first, count)));
        }
        List<Profile> profiles = new ArrayList<>();
        List<String> given2 = o.all("profile");
        List<Path> profileFiles = given2.isEmpty()
                ? suite.profiles().stream().map(folder::resolve).toList()
                : given2.stream().map(Path::of).toList();
        for (Path p : profileFiles) {
            String text;
            try {
                text = Cli.readFile(p);
            } catch (IOException x) {
                throw new UsageException(p + ": cannot read the profile: " + x.getMessage());
            }
            try {
                profiles.add(Profile.read(text));
                profileDocuments.add(text);
            } catch (ScenarioException x) {
                throw new Jobs.BadScenario(p.toString(), x.problems());
            }
        }
        if (trials * (profiles.size() + 1) > MAX_TRIALS) {
            throw new UsageException("the suite would run " + trials * (profiles.size() + 1) + " trials; at most "
                    + MAX_TRIALS + " run in one go");
        }
        SuitePlan plan;
        try {
            plan = SuitePlan.of(entries, profiles);
        } catch (ScenarioException x) {
            throw new Jobs.BadScenario(label, x.problems());
        }
        return new Input(suite.name(), suite.description(), source, plan, documents, profileDocuments, first);
    }

    private static SuiteFile readSuite(Path file) {
        String text;
        try {
            text = Cli.readFile(file);
        } catch (IOException e) {
            throw new UsageException(file + ": cannot read: " + e.getMessage());
        }
        try {
            return SuiteFile.read(text);
        } catch (ScenarioException e) {
            throw new Jobs.BadScenario(file.toString(), e.problems());
        }
    }

    static Optional<SuiteReport.Baseline> baseline(Options o) {
        String name = o.text("baseline", null);
        if (name == null) {
            return Optional.empty();
        }
        Path file = Path.of(name);
        String text;
        try {
            text = Cli.readFile(file);
        } catch (IOException e) {
            throw new UsageException(file + ": cannot read the baseline: " + e.getMessage());
        }
        try {
            return Optional.of(SuiteResultJson.baseline(text));
        } catch (ScenarioException e) {
            throw new Jobs.BadScenario(file + " (baseline)", e.problems());
        }
    }

    private static List<Path> list(Path dir, java.util.function.Predicate<String> name) {
        try (Stream<Path> s = Files.list(dir)) {
            return s.filter(Files::isRegularFile)
                    .filter(p -> name.test(p.getFileName().toString()))
                    .sorted()
                    .toList();
        } catch (IOException e) {
            throw new UsageException(dir + ": cannot list: " + e.getMessage());
        }
    }

    private static String name(Path dir) {
        Path n = dir.toAbsolutePath().normalize().getFileName();
        return n == null ? "suite" : n.toString();
    }

    private static void mkdirs(Path dir) {
        try {
            Files.createDirectories(dir);
        } catch (IOException e) {
            throw new UsageException(dir + ": cannot create the output folder: " + e.getMessage());
        }
    }

    /** Writes through a temporary file and a move, so a reader never sees half a file. */
    private static void write(Path dir, String name, String text) {
        try {
            Path tmp = Files.createTempFile(dir, "." + name, ".part");
            Files.writeString(tmp, text, StandardCharsets.UTF_8);
            Files.move(tmp, dir.resolve(name), StandardCopyOption.REPLACE_EXISTING, StandardCopyOption.ATOMIC_MOVE);
        } catch (IOException e) {
            throw new java.io.UncheckedIOException(e);
        }
    }

    /** Prints a progress line per tenth of the trials. */
    private static final class Tenths implements BatchProgress {
        private final PrintStream err;
        private final long started = System.nanoTime();
        private int lastTenth = -1;

        Tenths(PrintStream err) {
            this.err = err;
        }

        @Override
        public synchronized void trialDone(int done, int total, dev.driftlab.evaluation.TrialOutcome last) {
            int tenth = 10 * done / total;
            if (tenth != lastTenth) {
                lastTenth = tenth;
                err.printf(
                        Locale.ROOT,
                        "suite: %d/%d trials (%d %%), %.1f s%n",
                        done,
                        total,
                        100 * done / total,
                        (System.nanoTime() - started) / 1e9);
            }
        }
    }
}
