package dev.driftlab.scenario;

/**
 * One validation finding, tied to the field it concerns.
 *
 * @param severity error (refused) or warning (allowed)
 * @param path path of the field in the scenario file, e.g. {@code site.doors[2].width}
 * @param message plain-language explanation
 */
public record Problem(Severity severity, String path, String message) {
    /** Checks presence. */
    public Problem {
        Checks.present(severity, "severity");
        Checks.present(path, "path");
        Checks.present(message, "message");
    }

    /** An error at a path. */
    public static Problem error(String path, String message) {
        return new Problem(Severity.ERROR, path, message);
    }

    /** A warning at a path. */
    public static Problem warning(String path, String message) {
        return new Problem(Severity.WARNING, path, message);
    }

    /** Whether this problem refuses the scenario. */
    public boolean isError() {
        return severity == Severity.ERROR;
    }

    @Override
    public String toString() {
        return (isError() ? "error " : "warning ") + path + ": " + message;
    }
}
