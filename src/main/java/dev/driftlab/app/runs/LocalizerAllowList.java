package dev.driftlab.app.runs;

import dev.driftlab.localizer.protocol.CommandWords;
import dev.driftlab.localizer.protocol.ProcessLocalizer;
import dev.driftlab.report.Report;
import dev.driftlab.trial.LocalizerSource;
import dev.driftlab.trial.OutsideLocalizer;
import java.time.Duration;
import java.util.Collections;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.TreeMap;
import java.util.regex.Pattern;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.boot.context.properties.bind.Bindable;
import org.springframework.boot.context.properties.bind.Binder;
import org.springframework.core.env.Environment;
import org.springframework.stereotype.Component;

/**
 * The outside localizers this process may start, as its administrator listed them in the
 * application properties:
 *
 * <pre>
 * driftlab.localizers.dead-reckoning.command=java /opt/driftlab/DeadReckoning.java
 * driftlab.localizers.dead-reckoning.answer-limit=2s
 * driftlab.localizers.dead-reckoning.description=Odometry only, for comparison
 * </pre>
 *
 * <p>A run names a localizer by its key ({@code dead-reckoning}); a command never comes from a
 * request or a scenario. The process advertises the names in the {@code work_process} table and
 * takes only units of runs whose localizer it has (see {@link WorkEngine}). A list that does not
 * read (a bad name, an empty command, an unclosed quote, a time limit out of range) stops the
 * process at start with a message naming the property.
 */
@Component
public class LocalizerAllowList {

    /** What a localizer's name may be: {@link OutsideLocalizer#LISTED_NAME}. */
    public static final Pattern NAME = OutsideLocalizer.LISTED_NAME;

    /** Shortest and longest per-scan time limit an administrator may set. */
    static final Duration MIN_ANSWER_LIMIT = Duration.ofMillis(10);

    static final Duration MAX_ANSWER_LIMIT = Duration.ofMinutes(10);

    /**
     * One entry as the properties give it.
     *
     * @param command the program and its arguments, split as a POSIX shell splits simple quoting,
     *     never handed to a shell
     * @param answerLimit time limit for each answer (default 5 s)
     * @param description one line shown beside the name in the run form (optional)
     */
    public record Entry(String command, Duration answerLimit, String description) {}

    /**
     * One allowed localizer, checked.
     *
     * @param name its key
     * @param command the program's words
     * @param limits the exchange's time limits
     * @param description what the run form shows beside the name, may be empty
     */
    public record Allowed(String name, List<String> command, ProcessLocalizer.Limits limits, String description) {

        /** Copies the command. */
        public Allowed {
            command = List.copyOf(command);
        }

        /** Trials of this localizer: one process per trial. */
        public LocalizerSource source() {
            return new OutsideLocalizer(command, limits);
        }
    }

    /**
     * A localizer field as a form or request gives it: blank is the built-in one (null), anything
     * else must be a well-formed name (whether a process offers it is {@link RunQueue#checkLocalizer}'s).
     *
     * @throws RunRefused naming the field {@code localizer}
     */
    public static String requestedName(String raw) {
        if (raw == null || raw.isBlank() || raw.strip().equals(Report.BUILT_IN)) {
            return null;
        }
        String name = raw.strip();
        if (!LocalizerAllowList.NAME.matcher(name).matches()) {
            throw new RunRefused(
                    "localizer",
                    "a localizer is named by 1 to 40 lower-case letters, digits and hyphens, as the server's"
                            + " administrator listed it (GET /api/localizers); a command is never accepted here");
        }
        return name;
    }

    private final Map<String, Allowed> byName;

    /** The list under {@code driftlab.localizers} of the application's properties. */
    @Autowired
    public LocalizerAllowList(Environment env) {
        this(Binder.get(env)
                .bind("driftlab.localizers", Bindable.mapOf(String.class, Entry.class))
                .orElse(Map.of()));
    }

    /**
     * The given list, checked.
     *
     * @throws IllegalStateException naming the property of the first entry that does not read
     */
    public LocalizerAllowList(Map<String, Entry> entries) {
        Map<String, Allowed> out = new TreeMap<>();
        for (Map.Entry<String, Entry> e : entries.entrySet()) {
            String name = e.getKey();
            String prefix = "driftlab.localizers." + name;
            if (!NAME.matcher(name).matches()) {
                throw new IllegalStateException(prefix + ": a localizer's name is 1 to 40 lower-case letters, digits"
                        + " and hyphens, starting with a letter or digit");
            }
            Entry entry = e.getValue();
            if (entry == null || entry.command() == null) {
                throw new IllegalStateException(prefix + ".command: give the program to start, e.g. java My.java");
            }
            List<String> words;
            try {
                words = CommandWords.split(prefix + ".command", entry.command());
            } catch (IllegalArgumentException bad) {
                throw new IllegalStateException(bad.getMessage(), bad);
            }
            ProcessLocalizer.Limits limits = ProcessLocalizer.Limits.DEFAULT;
            if (entry.answerLimit() != null) {
                Duration d = entry.answerLimit();
                if (d.compareTo(MIN_ANSWER_LIMIT) < 0 || d.compareTo(MAX_ANSWER_LIMIT) > 0) {
                    throw new IllegalStateException(
                            prefix + ".answer-limit: " + d.toMillis() + " ms is outside 10 ms to 10 min");
                }
                limits = limits.withAnswer(d);
            }
            String description =
                    entry.description() == null ? "" : entry.description().strip();
            if (description.length() > 200) {
                throw new IllegalStateException(prefix + ".description: at most 200 characters");
            }
            out.put(name, new Allowed(name, words, limits, description));
        }
        this.byName = Collections.unmodifiableMap(out);
    }

    /** The names, in order. */
    public List<String> names() {
        return List.copyOf(byName.keySet());
    }

    /** The localizer of that name, if this process has it. */
    public Optional<Allowed> find(String name) {
        return Optional.ofNullable(name == null ? null : byName.get(name));
    }

    /** Every allowed localizer, by name. */
    public Map<String, Allowed> all() {
        return byName;
    }
}
