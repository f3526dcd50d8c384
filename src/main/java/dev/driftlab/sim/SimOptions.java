package dev.driftlab.sim;

/**
 * How the simulator runs, apart from the scenario.
 *
 * @param stepRate internal steps per second, positive (100 is the default)
 * @param steering which pose the route follower steers by
 */
public record SimOptions(double stepRate, Steering steering) {

    /** Checks the rate and presence. */
    public SimOptions {
        if (!(stepRate > 0) || !Double.isFinite(stepRate) || stepRate > 100_000) {
            throw new IllegalArgumentException("stepRate must be in (0, 100000], got " + stepRate);
        }
        if (steering == null) {
            throw new IllegalArgumentException("steering must be given");
        }
    }

    /** 100 Hz, steering by the true pose. */
    public static SimOptions defaults() {
        return new SimOptions(100, Steering.TRUE_POSE);
    }

    /** These options with another steering. */
    public SimOptions withSteering(Steering s) {
        return new SimOptions(stepRate, s);
    }
}
