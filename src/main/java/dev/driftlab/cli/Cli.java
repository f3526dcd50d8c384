package dev.driftlab.cli;

import dev.driftlab.scenario.Problem;
import dev.driftlab.scenario.ScenarioFiles;
import dev.driftlab.scenario.ValidationReport;
import java.io.IOException;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;

/**
 * Dispatches {@code driftlab.jar SUBCOMMAND ...}. Exit codes: 0 success, 1 the job found failures
 * (validation errors, failed gates), 2 bad usage, unreadable input or a request the server refused,
 * 3 ({@code submit} and {@code suite --server} only) no usable answer from the server in time. Never prints a stack trace.
 */
public final class Cli {

    /** Exit status: success. */
    public static final int OK = 0;
    /** Exit status: the job ran and found failures. */
    public static final int FAILED = 1;
    /** Exit status: bad usage or unreadable input. */
    public static final int BAD_INPUT = 2;
    /**
     * Exit status of {@code submit} and {@code suite --server}: the server could not be reached,
     * failed, or the batch or suite run did not finish within {@code --timeout}.
     */
    public static final int NO_ANSWER = 3;

    /** Largest scenario file read, in bytes. */
    static final long MAX_FILE_BYTES = 8L * 1024 * 1024;

    private Cli() {}

    /**
     * Runs one subcommand.
     *
     * @param args subcommand and its arguments
     * @param out normal output
     * @param err error output
     * @return exit status
     */
    public static int run(String[] args, PrintStream out, PrintStream err) {
        if (args.length == 0) {
            usage(err);
            return BAD_INPUT;
        }
        String[] rest = Arrays.copyOfRange(args, 1, args.length);
        try {
            return switch (args[0]) {
                case "validate" -> validate(rest, out, err);
                case "run" -> new Jobs(out, err).run(rest);
                case "batch" -> new Jobs(out, err).batch(rest);
                case "sweep" -> new Jobs(out, err).sweep(rest);
                case "submit" -> new Submit(out, err).run(rest);
                case "suite" -> new SuiteJob(out, err).run(rest);
                case "localizer-stdio" -> LocalizerStdio.serve(System.in, out, err);
                case "help", "-h", "--help" -> {
                    usage(out);
                    yield OK;
                }
                default -> {
                    err.println("driftlab: unknown command '" + args[0] + "'");
                    usage(err);
                    yield BAD_INPUT;
                }
            };
        } catch (Options.UsageException e) {
            err.println("driftlab " + args[0] + ": " + e.getMessage());
            return BAD_INPUT;
        } catch (Jobs.BadScenario e) {
            err.println(e.getMessage());
            for (Problem p : e.problems()) {
                err.println("  " + p);
            }
            return BAD_INPUT;
        } catch (RuntimeException e) {
            // A bug must still end with one readable line and a failing status.
            err.println("driftlab: internal error: " + e);
            return BAD_INPUT;
        }
    }

    static void usage(PrintStream s) {
        s.println("usage: java -jar driftlab.jar [COMMAND ARGS]");
        s.println("  (no command)           start the web app on http://localhost:8080");
        s.println("  validate FILE...       check scenario files; lists every problem with its path");
        s.println("  run FILE --out DIR [--seed S] [--variant NAME] [--frames-per-chunk N]");
        s.println("                         one run with frames recorded");
        s.println("  batch FILE --out DIR [--seeds N] [--first-seed S] [--threads T] [--variants FILE2]");
        s.println("                         every settings variant on N seeds, paired");
        s.println("  sweep FILE --out DIR --particles 100,300,1000,3000 [--seeds N] [--threads T]");
        s.println("                         success against particle count");
        s.println("  submit FILE --server URL --out DIR [--seeds N] [--first-seed S] [--variants FILE2]");
        s.println("         [--timeout MINUTES]");
        s.println("  submit --link TOKEN --server URL --out DIR [--seeds N] [--first-seed S] [--timeout MINUTES]");
        s.println("                         a batch run on a Driftlab server (the file uploaded, or the");
        s.println("                         scenario of an existing link), the same files written here;");
        s.println("                         --timeout defaults to 60 minutes, fractions allowed");
        s.println("  suite SUITE_FILE_OR_DIR --out DIR [--seeds N] [--first-seed S] [--profile FILE]...");
        s.println("        [--baseline OLD/result.json] [--threads T]");
        s.println("                         every scenario as it is and under each profile, paired;");
        s.println("                         regressions against the baseline run; exit 1 on a failing");
        s.println("                         or regressed gate, or a scenario a profile makes invalid");
        s.println("  suite SUITE_FILE_OR_DIR --server URL --out DIR [--seeds N] [--first-seed S] [--profile FILE]...");
        s.println("        [--baseline OLD/result.json] [--timeout MINUTES]");
        s.println("  suite --link TOKEN --server URL --out DIR [--baseline OLD/result.json] [--timeout MINUTES]");
        s.println("                         the suite run on a Driftlab server (the file's scenarios uploaded");
        s.println("                         as a new suite, or a stored suite's link, whose previous run is");
        s.println("                         the baseline unless --baseline is given); the same files written here");
        s.println(
                "  run, batch, sweep and suite also take --localizer \"COMMAND ARGS\" (an outside localizer speaking");
        s.println("         driftlab-localizer/1, one process per trial) and --answer-limit SECONDS (default 5)");
        s.println("  submit and suite --server take --server-localizer NAME: an outside localizer from the");
        s.println("         server's list (GET /api/localizers), run by the server's processes that offer it");
        s.println(
                "  localizer-stdio        the built-in localizer on standard input and output (driftlab-localizer/1)");
        s.println("  each job writes DIR/result.json, DIR/report.html and DIR/junit.xml");
        s.println("  worker [--threads N] [--spring.datasource.url=...]");
        s.println("                         run work units from the team's database; serves no pages");
        s.println("  help                   this text");
        s.println("exit status: 0 ok (every gate holds), 1 problems found or a gate fails, 2 bad input");
        s.println("  or a request the server refused, 3 (submit, suite --server) server unreachable, failing, or");
        s.println("  --timeout passed");
    }

    static int validate(String[] files, PrintStream out, PrintStream err) {
        if (files.length == 0) {
            err.println("driftlab validate: give at least one scenario file");
            return BAD_INPUT;
        }
        int status = OK;
        for (String name : files) {
            if (name.startsWith("-")) {
                err.println("driftlab validate: unknown option '" + name + "'");
                return BAD_INPUT;
            }
            String text;
            try {
                text = readFile(Path.of(name));
            } catch (IOException | IllegalArgumentException e) {
                err.println(name + ": cannot read: " + e.getMessage());
                status = BAD_INPUT;
                continue;
            }
            ValidationReport report = ScenarioFiles.check(text).report();
            int errors = report.errors().size();
            int warnings = report.warnings().size();
            out.println(name + ": " + (errors == 0 ? "valid" : "refused") + summary(errors, warnings));
            for (Problem p : report.problems()) {
                out.println("  " + p);
            }
            if (errors > 0 && status == OK) {
                status = FAILED;
            }
        }
        return status;
    }

    static String readFile(Path path) throws IOException {
        if (!Files.isRegularFile(path)) {
            throw new IOException("no such file");
        }
        if (Files.size(path) > MAX_FILE_BYTES) {
            throw new IOException("larger than " + MAX_FILE_BYTES / (1024 * 1024) + " MB");
        }
        return Files.readString(path, StandardCharsets.UTF_8);
    }

    private static String summary(int errors, int warnings) {
        if (errors == 0 && warnings == 0) {
            return "";
        }
        StringBuilder sb = new StringBuilder(" (");
        if (errors > 0) {
            sb.append(errors).append(errors == 1 ? " error" : " errors");
        }
        if (warnings > 0) {
            if (errors > 0) {
                sb.append(", ");
            }
            sb.append(warnings).append(warnings == 1 ? " warning" : " warnings");
        }
        return sb.append(')').toString();
    }
}
