package dev.driftlab.localizer.protocol;

import java.io.IOException;
import java.io.InputStream;
import java.io.InputStreamReader;
import java.io.Reader;
import java.nio.charset.StandardCharsets;
import java.util.ArrayDeque;

/**
 * Drains a program's error output on its own thread and keeps only its last lines, each cut to a
 * bounded length, so a chatty or broken program can neither block on a full pipe nor fill memory.
 */
final class ErrorTail {

    /** Lines kept. */
    static final int LINES = 20;

    /** Characters kept per line. */
    static final int LINE_CHARS = 300;

    private final ArrayDeque<String> lines = new ArrayDeque<>();
    private final Thread drain;

    ErrorTail(InputStream stderr, String name) {
        drain = new Thread(() -> drain(stderr), name);
        drain.setDaemon(true);
        drain.start();
    }

    private void drain(InputStream in) {
        try (Reader r = new InputStreamReader(in, StandardCharsets.UTF_8)) {
            StringBuilder line = new StringBuilder();
            boolean cut = false;
            int c;
            while ((c = r.read()) >= 0) {
                if (c == '\n') {
                    add(line.toString() + (cut ? " [cut]" : ""));
                    line.setLength(0);
                    cut = false;
                } else if (c != '\r') {
                    if (line.length() < LINE_CHARS) {
                        line.append((char) c);
                    } else {
                        cut = true;
                    }
                }
            }
            if (line.length() > 0) {
                add(line.toString());
            }
        } catch (IOException closed) {
            // the stream was closed under us: what was read is kept
        }
    }

    private synchronized void add(String line) {
        if (lines.size() == LINES) {
            lines.removeFirst();
        }
        lines.addLast(line);
    }

    /** The last lines, after waiting up to {@code millis} for the program's output to end. */
    String text(long millis) {
        try {
            drain.join(millis);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
        synchronized (this) {
            return String.join("\n", lines);
        }
    }
}
