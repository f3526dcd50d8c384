package dev.driftlab.scenario;

import java.util.List;
import java.util.Locale;
import java.util.Map;

/**
 * The problems one validation collects, with the small checks every part of the validator shares:
 * ranges, positive values, unique ids and the short number text the messages use.
 */
final class Findings {

    private final List<Problem> problems;

    Findings(List<Problem> problems) {
        this.problems = problems;
    }

    /** The problems found so far, in the order found; callers may add to it. */
    List<Problem> list() {
        return problems;
    }

    void error(String path, String message) {
        problems.add(Problem.error(path, message));
    }

    void warning(String path, String message) {
        problems.add(Problem.warning(path, message));
    }

    /** Checks an id is not blank and not already used in {@code ids}, recording it under path {@code p}. */
    void uniqueId(Map<String, String> ids, String id, String p) {
        if (id.isBlank()) {
            error(p + ".id", "must not be empty");
            return;
        }
        String previous = ids.putIfAbsent(id, p);
        if (previous != null) {
            error(p + ".id", "\"" + id + "\" is already the id of " + previous);
        }
    }

    /** Checks {@code min <= v <= max}; returns whether it holds. */
    boolean range(double v, double min, double max, String p, String unit) {
        if (v < min || v > max) {
            error(
                    p,
                    fmt(v) + unitText(unit) + " is out of range; allowed " + fmt(min) + " to " + fmt(max)
                            + unitText(unit));
            return false;
        }
        return true;
    }

    /** Checks {@code 0 < v <= max}. */
    void positive(double v, double max, String p, String unit) {
        if (v <= 0) {
            error(p, "must be more than 0" + unitText(unit) + ", got " + fmt(v));
        } else if (v > max) {
            error(p, fmt(v) + unitText(unit) + " is more than the maximum of " + fmt(max) + unitText(unit));
        }
    }

    private static String unitText(String unit) {
        return unit.isEmpty() ? "" : " " + unit;
    }

    /** Short number text: up to 3 decimals, no trailing zeros. */
    static String fmt(double v) {
        if (v == Math.rint(v) && Math.abs(v) < 1e15) {
            return String.format(Locale.ROOT, "%.0f", v);
        }
        String t = String.format(Locale.ROOT, "%.3f", v);
        t = t.replaceAll("0+$", "");
        return t.endsWith(".") ? t.substring(0, t.length() - 1) : t;
    }
}
