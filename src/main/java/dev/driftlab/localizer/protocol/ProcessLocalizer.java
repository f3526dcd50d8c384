package dev.driftlab.localizer.protocol;

import dev.driftlab.geometry.Pose;
import dev.driftlab.localizer.LocalizerFailure;
import dev.driftlab.localizer.LocalizerFailure.Kind;
import dev.driftlab.localizer.ParticleSet;
import dev.driftlab.localizer.Scan;
import dev.driftlab.localizer.TrialLocalizer;
import dev.driftlab.localizer.UpdateReport;
import java.io.BufferedInputStream;
import java.io.BufferedWriter;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStreamWriter;
import java.io.Writer;
import java.nio.charset.StandardCharsets;
import java.time.Duration;
import java.util.List;
import java.util.Set;
import java.util.concurrent.ConcurrentHashMap;
import java.util.concurrent.Executors;
import java.util.concurrent.ScheduledExecutorService;
import java.util.concurrent.ScheduledFuture;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicBoolean;

/**
 * An outside localizer: a child process speaking {@code driftlab-localizer/1} on its standard input
 * and output, one process per trial.
 *
 * <p>Every exchange (greeting, each scan) has a time limit; a watchdog kills the process and its
 * descendants when it passes, which ends the blocked read. Lines read are bounded ({@link
 * Messages#MAX_LINE_CHARS}), the error output is drained into a bounded tail, and {@link #close}
 * always kills and reaps the process and closes the pipes. Every failure is a {@link
 * LocalizerFailure} with the tail of the error output.
 */
public final class ProcessLocalizer implements TrialLocalizer {

    /**
     * Time limits.
     *
     * @param hello for the hello after the greeting (includes the program's start-up)
     * @param answer for each estimate after a scan
     * @param exit for the program to end after the end message before it is killed
     */
    public record Limits(Duration hello, Duration answer, Duration exit) {

        /** 30 s to say hello, 5 s per scan, 2 s to exit. */
        public static final Limits DEFAULT =
                new Limits(Duration.ofSeconds(30), Duration.ofSeconds(5), Duration.ofSeconds(2));

        /** Checks the limits are positive. */
        public Limits {
            for (Duration d : new Duration[] {hello, answer, exit}) {
                if (d == null || d.isNegative() || d.isZero()) {
                    throw new IllegalArgumentException("time limits must be positive");
                }
            }
        }

        /** The same limits with another per-scan limit. */
        public Limits withAnswer(Duration perScan) {
            return new Limits(hello, perScan, exit);
        }
    }

    private static final ScheduledExecutorService WATCHDOG = Executors.newSingleThreadScheduledExecutor(r -> {
        Thread t = new Thread(r, "driftlab-localizer-watchdog");
        t.setDaemon(true);
        return t;
    });

    /**
     * Programs started and not yet reaped. If this JVM stops (a worker told to stop, an orderly
     * shutdown) while trials are running, a shutdown hook kills them and their descendants, so no
     * localizer outlives the process that started it. (A JVM killed with SIGKILL runs no hook; the
     * programs then see their input close and, as the protocol asks, end.)
     */
    private static final Set<Process> LIVE = ConcurrentHashMap.newKeySet();

    static {
        Runtime.getRuntime()
                .addShutdownHook(new Thread(
                        () -> {
                            for (Process p : LIVE) {
                                p.descendants().forEach(ProcessHandle::destroyForcibly);
                                p.destroyForcibly();
                            }
                        },
                        "driftlab-localizer-reaper"));
    }

    private final Process process;
    private final Writer in;
    private final InputStream out;
    private final ErrorTail errors;
    private final Limits limits;
    private final String command;
    private final ParticleSet shown = new ParticleSet(Messages.MAX_PARTICLES);
    private String name = "";
    private boolean particlesShown;
    private Pose lastOdometry;
    private boolean closed;

    private ProcessLocalizer(Process process, Limits limits, String command) {
        this.process = process;
        this.limits = limits;
        this.command = command;
        this.in = new BufferedWriter(new OutputStreamWriter(process.getOutputStream(), StandardCharsets.UTF_8));
        this.out = new BufferedInputStream(process.getInputStream());
        this.errors = new ErrorTail(process.getErrorStream(), "driftlab-localizer-stderr");
    }

    /**
     * Starts the program, sends the greeting and waits for its hello.
     *
     * @param command the program and its arguments (never run through a shell)
     * @param greeting what the localizer is told
     * @param limits time limits
     * @throws LocalizerFailure when the program cannot start, refuses or answers badly
     */
    public static ProcessLocalizer start(List<String> command, Greeting greeting, Limits limits) {
        if (command.isEmpty()) {
            throw new IllegalArgumentException("the localizer command is empty");
        }
        Process p;
        try {
            p = new ProcessBuilder(command).start();
            LIVE.add(p);
        } catch (IOException | RuntimeException e) {
            throw new LocalizerFailure(
                    Kind.START, "cannot start '" + String.join(" ", command) + "': " + e.getMessage(), "");
        }
        ProcessLocalizer l = new ProcessLocalizer(p, limits, String.join(" ", command));
        try {
            String answer = l.exchange(Messages.greeting(greeting), limits.hello(), "the hello");
            l.name = Messages.readHello(Messages.parse(answer));
            return l;
        } catch (ProtocolException e) {
            l.close();
            throw l.failure(e.kind(), e.getMessage());
        } catch (LocalizerFailure e) {
            l.close();
            throw e;
        }
    }

    /** How many started programs are not yet reaped (for tests). */
    static int live() {
        return LIVE.size();
    }

    /** The name the localizer gave in its hello. */
    public String name() {
        return name;
    }

    /** An update stamped with time 0; the trial loop uses {@link #update(double, Pose, Scan)}. */
    @Override
    public UpdateReport update(Pose odometry, Scan scan) {
        return update(0, odometry, scan);
    }

    @Override
    public UpdateReport update(double time, Pose odometry, Scan scan) {
        String lines = Messages.odometry(time, lastOdometry, odometry) + "\n" + Messages.scan(time, scan);
        lastOdometry = odometry;
        String answer = exchange(lines, limits.answer(), "an estimate for the scan at " + time + " s");
        try {
            Messages.Estimate e = Messages.readEstimate(Messages.parse(answer), time);
            double[][] p = e.particles();
            particlesShown = p != null;
            if (p != null) {
                shown.setSample(p[0], p[1], p[2], p[3], p[0].length);
            } else {
                shown.setSample(new double[0], new double[0], new double[0], new double[0], 0);
            }
            judged = e.pose();
            return e.report();
        } catch (ProtocolException e) {
            throw failure(e.kind(), e.getMessage());
        }
    }

    private Pose judged;

    @Override
    public Pose judged(UpdateReport r) {
        return judged != null ? judged : r.estimate().mean();
    }

    @Override
    public ParticleSet particles() {
        return shown;
    }

    @Override
    public boolean showsParticles() {
        return particlesShown;
    }

    @Override
    public void close() {
        if (closed) {
            return;
        }
        closed = true;
        try {
            if (process.isAlive()) {
                in.write(Messages.end("trial ended"));
                in.write('\n');
                in.flush();
            }
        } catch (IOException gone) {
            // the program has gone already
        }
        try {
            in.close();
        } catch (IOException gone) {
            // closing a broken pipe
        }
        try {
            if (!process.waitFor(limits.exit().toMillis(), TimeUnit.MILLISECONDS)) {
                kill();
                process.waitFor(5, TimeUnit.SECONDS);
            }
        } catch (InterruptedException e) {
            kill();
            Thread.currentThread().interrupt();
        }
        // descendants that outlived the program still hold its pipes
        process.descendants().forEach(ProcessHandle::destroyForcibly);
        LIVE.remove(process);
        try {
            out.close();
        } catch (IOException ignored) {
            // nothing left to read
        }
        try {
            process.getErrorStream().close();
        } catch (IOException ignored) {
            // nothing left to read
        }
    }

    private void kill() {
        process.descendants().forEach(ProcessHandle::destroyForcibly);
        process.destroyForcibly();
    }

    /** Writes the lines and reads one answer line within the limit. */
    private String exchange(String lines, Duration limit, String what) {
        AtomicBoolean fired = new AtomicBoolean();
        ScheduledFuture<?> dog = WATCHDOG.schedule(
                () -> {
                    fired.set(true);
                    kill();
                },
                limit.toMillis(),
                TimeUnit.MILLISECONDS);
        try {
            try {
                in.write(lines);
                in.write('\n');
                in.flush();
            } catch (IOException e) {
                throw ended(fired, limit, what, "stopped reading its input");
            }
            String line;
            try {
                line = readLine();
            } catch (IOException e) {
                throw ended(fired, limit, what, "its output broke (" + e.getMessage() + ")");
            }
            if (line == null) {
                throw ended(fired, limit, what, "closed its output");
            }
            return line;
        } catch (ProtocolException e) {
            throw failure(e.kind(), e.getMessage());
        } finally {
            dog.cancel(false);
        }
    }

    private LocalizerFailure ended(AtomicBoolean fired, Duration limit, String what, String how) {
        if (fired.get()) {
            return failure(
                    Kind.HANG,
                    "no " + what + " within " + seconds(limit) + " (the time limit); the program was stopped");
        }
        String exit = "";
        try {
            if (process.waitFor(1, TimeUnit.SECONDS)) {
                exit = " and exited with status " + process.exitValue();
            }
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
        return failure(Kind.CRASH, "waiting for " + what + ", the program " + how + exit);
    }

    private LocalizerFailure failure(Kind kind, String message) {
        if (kind != Kind.HANG && kind != Kind.CRASH) {
            kill();
        }
        return new LocalizerFailure(kind, "'" + MessageFields.clip(command) + "': " + message, errors.text(1000));
    }

    private static String seconds(Duration d) {
        return d.toMillis() % 1000 == 0 ? d.toSeconds() + " s" : d.toMillis() + " ms";
    }

    /** One line of the program's output without its end, skipping blank lines; null at the end. */
    private String readLine() throws IOException {
        ByteArrayOutputStream line = new ByteArrayOutputStream(256);
        while (true) {
            int c = out.read();
            if (c < 0) {
                return line.size() == 0 ? null : line.toString(StandardCharsets.UTF_8);
            }
            if (c == '\n') {
                String s = line.toString(StandardCharsets.UTF_8).strip();
                if (!s.isEmpty()) {
                    return s;
                }
                line.reset();
                continue;
            }
            if (line.size() >= Messages.MAX_LINE_CHARS) {
                throw new ProtocolException(
                        Kind.MALFORMED, "a line longer than " + Messages.MAX_LINE_CHARS / (1024 * 1024) + " MB");
            }
            line.write(c);
        }
    }
}
