package dev.driftlab.scenario;

/** Constructor checks shared by the scenario records. */
final class Checks {
    private Checks() {}

    static void present(Object value, String name) {
        if (value == null) {
            throw new IllegalArgumentException(name + " must be given");
        }
    }

    static void finite(double value, String name) {
        if (!Double.isFinite(value)) {
            throw new IllegalArgumentException(name + " must be a finite number, got " + value);
        }
    }
}
