package dev.driftlab;

import dev.driftlab.app.DriftlabApplication;
import dev.driftlab.app.WorkerProcess;
import dev.driftlab.cli.Cli;

/**
 * Entry point of {@code driftlab.jar}: with no arguments it starts the web app; with a subcommand
 * it does that job without a web server and exits with its status.
 */
public final class Driftlab {

    private Driftlab() {}

    /** Starts the web app or runs a command-line job. */
    public static void main(String[] args) {
        if (args.length == 0 || args[0].startsWith("--")) {
            DriftlabApplication.start(args);
            return;
        }
        if (args[0].equals("worker")) {
            int status = WorkerProcess.run(java.util.Arrays.copyOfRange(args, 1, args.length), System.err);
            System.exit(status);
        }
        System.exit(Cli.run(args, System.out, System.err));
    }
}
