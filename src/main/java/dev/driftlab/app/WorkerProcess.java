package dev.driftlab.app;

import java.io.PrintStream;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.CountDownLatch;
import org.springframework.boot.SpringApplication;
import org.springframework.boot.WebApplicationType;
import org.springframework.context.ConfigurableApplicationContext;
import org.springframework.context.event.ContextClosedEvent;

/**
 * {@code driftlab.jar worker --threads N}: a process that runs work units from the shared database
 * and serves no pages. It starts the same application without a web server, in the {@code worker}
 * role (no samples loaded, no web-only beans), and lives until it is stopped (SIGTERM lets the
 * units it holds go back in the queue; SIGKILL leaves them to be taken again after the engine's
 * heartbeat timeout).
 */
public final class WorkerProcess {

    private WorkerProcess() {}

    /**
     * Runs the worker until its context closes; returns the exit status (2 for bad options).
     *
     * @param args the arguments after {@code worker}: {@code --threads N} and any Spring
     *     property as {@code --name=value} (database settings, data folder)
     */
    public static int run(String[] args, PrintStream err) {
        List<String> spring = new ArrayList<>();
        int threads = Runtime.getRuntime().availableProcessors();
        for (int i = 0; i < args.length; i++) {
            String a = args[i];
            if (a.equals("--threads") || a.startsWith("--threads=")) {
                String v = a.contains("=") ? a.substring(a.indexOf('=') + 1) : (i + 1 < args.length ? args[++i] : "");
                try {
                    threads = Integer.parseInt(v.trim());
                } catch (NumberFormatException e) {
                    threads = -1;
                }
                if (threads < 1 || threads > 256) {
                    err.println("driftlab worker: --threads must be a whole number from 1 to 256, got '" + v + "'");
                    return 2;
                }
            } else if (a.equals("-h") || a.equals("--help")) {
                usage(err);
                return 0;
            } else if (a.startsWith("--") && a.contains("=")) {
                spring.add(a);
            } else {
                err.println("driftlab worker: unknown argument '" + a + "'");
                usage(err);
                return 2;
            }
        }
        spring.add("--driftlab.role=worker");
        spring.add("--driftlab.runs.execute=true");
        spring.add("--driftlab.runs.workers=" + threads);
        SpringApplication app = new SpringApplication(DriftlabApplication.class);
        app.setWebApplicationType(WebApplicationType.NONE);
        CountDownLatch closed = new CountDownLatch(1);
        app.addListeners(e -> {
            if (e instanceof ContextClosedEvent) {
                closed.countDown();
            }
        });
        ConfigurableApplicationContext ctx;
        try {
            ctx = app.run(spring.toArray(String[]::new));
        } catch (RuntimeException e) {
            err.println("driftlab worker: could not start: " + rootMessage(e));
            return 1;
        }
        // the engine's threads are daemons of the pool; keep the process until the context closes
        if (ctx.isActive()) {
            try {
                closed.await();
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
            }
        }
        return 0;
    }

    static void usage(PrintStream s) {
        s.println("usage: java -jar driftlab.jar worker [--threads N] [--spring.datasource.url=... ...]");
        s.println("  runs work units from the database the server uses; serves no pages");
        s.println("  --threads N   units run at once (default: number of cores)");
    }

    private static String rootMessage(Throwable e) {
        Throwable t = e;
        while (t.getCause() != null && t.getCause() != t) {
            t = t.getCause();
        }
        return t.getMessage() == null ? t.toString() : t.getMessage();
    }
}
