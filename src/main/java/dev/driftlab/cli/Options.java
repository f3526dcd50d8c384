package dev.driftlab.cli;

import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;

/**
 * Parsed {@code FILE --name value} arguments. Unknown options and malformed values are reported as
 * {@link UsageException} with a one-line message.
 */
final class Options {

    /** A bad command line, reported as one line and exit status 2. */
    static final class UsageException extends RuntimeException {
        private static final long serialVersionUID = 1L;

        UsageException(String message) {
            super(message);
        }
    }

    private final String command;
    private final List<String> positional = new ArrayList<>();
    private final Map<String, String> values = new HashMap<>();
    private final Map<String, List<String>> repeated = new HashMap<>();

    private Options(String command) {
        this.command = command;
    }

    /**
     * Parses arguments.
     *
     * @param command subcommand name, for messages
     * @param args the arguments after the subcommand
     * @param valued options that take a value
     * @param flags options without a value
     */
    static Options parse(String command, String[] args, Set<String> valued, Set<String> flags) {
        Options o = new Options(command);
        for (int i = 0; i < args.length; i++) {
            String a = args[i];
            if (a.startsWith("--")) {
                String name = a.substring(2);
                String value = null;
                int eq = name.indexOf('=');
                if (eq >= 0) {
                    value = name.substring(eq + 1);
                    name = name.substring(0, eq);
                }
                if (flags.contains(name)) {
                    if (value != null) {
                        throw new UsageException("option --" + name + " takes no value");
                    }
                    o.values.put(name, "true");
                } else if (valued.contains(name)) {
                    if (value == null) {
                        if (i + 1 >= args.length) {
                            throw new UsageException("option --" + name + " needs a value");
                        }
                        value = args[++i];
                    }
                    o.values.put(name, value);
                    o.repeated.computeIfAbsent(name, k -> new ArrayList<>()).add(value);
                } else {
                    throw new UsageException("unknown option '" + a + "' for " + command);
                }
            } else if (a.startsWith("-") && a.length() > 1) {
                throw new UsageException("unknown option '" + a + "' for " + command);
            } else {
                o.positional.add(a);
            }
        }
        return o;
    }

    List<String> positional() {
        return positional;
    }

    /** Every value of an option that may be given more than once, in order; empty when not given. */
    List<String> all(String name) {
        return List.copyOf(repeated.getOrDefault(name, List.of()));
    }

    boolean flag(String name) {
        return values.containsKey(name);
    }

    String required(String name) {
        String v = values.get(name);
        if (v == null || v.isBlank()) {
            throw new UsageException(command + " needs --" + name);
        }
        return v;
    }

    String text(String name, String fallback) {
        return values.getOrDefault(name, fallback);
    }

    int integer(String name, int fallback, int min, int max) {
        String v = values.get(name);
        if (v == null) {
            return fallback;
        }
        try {
            int n = Integer.parseInt(v.strip());
            if (n < min || n > max) {
                throw new UsageException("--" + name + " must be between " + min + " and " + max + ", got " + n);
            }
            return n;
        } catch (NumberFormatException e) {
            throw new UsageException("--" + name + " must be a whole number, got '" + v + "'");
        }
    }

    long longValue(String name, long fallback) {
        String v = values.get(name);
        if (v == null) {
            return fallback;
        }
        try {
            return Long.parseLong(v.strip());
        } catch (NumberFormatException e) {
            throw new UsageException("--" + name + " must be a whole number, got '" + v + "'");
        }
    }

    int[] integers(String name, int min, int max) {
        String v = required(name);
        String[] parts = v.split(",");
        int[] out = new int[parts.length];
        for (int i = 0; i < parts.length; i++) {
            try {
                out[i] = Integer.parseInt(parts[i].strip().replace("_", ""));
            } catch (NumberFormatException e) {
                throw new UsageException(
                        "--" + name + " must be a comma-separated list of whole numbers, got '" + v + "'");
            }
            if (out[i] < min || out[i] > max) {
                throw new UsageException(
                        "--" + name + " values must be between " + min + " and " + max + ", got " + out[i]);
            }
        }
        return out;
    }
}
