package dev.driftlab.trial;

import dev.driftlab.scenario.LocalizerSettings;
import dev.driftlab.scenario.Scenario;
import dev.driftlab.sim.Simulator;

/**
 * What one trial will cost before it runs, for refusing work no server should take on: the
 * filter's work is about particles x beams per scan, and a recording keeps every particle of every
 * scan. Both are upper estimates: the route's generous planned duration, the adaptive count at
 * its maximum.
 *
 * @param scans scans the trial is expected to take
 * @param particles particles per scan (the fixed count, or the adaptive maximum)
 * @param beams beams the measurement model reads per particle
 */
public record TrialCost(long scans, int particles, int beams) {

    /**
     * The cost of one trial of the scenario with these settings.
     *
     * @param fixedParticles a fixed particle count that overrides the settings (a sweep), or 0
     */
    public static TrialCost of(Scenario scenario, LocalizerSettings settings, int fixedParticles) {
        double seconds = Simulator.plannedDuration(scenario.route(), scenario.robot());
        long scans = (long) Math.ceil(seconds * scenario.rangefinder().rate()) + 1;
        LocalizerSettings.Particles p = settings.particles();
        int particles = fixedParticles > 0 ? fixedParticles : p.adaptive() ? p.maxCount() : p.count();
        int step = Math.max(1, settings.rangeModel().beamStep());
        int beams = (scenario.rangefinder().beams() + step - 1) / step;
        return new TrialCost(scans, particles, beams);
    }

    /** Particle-beam likelihood evaluations over the trial: the filter's main work. */
    public double particleBeams() {
        return (double) scans * particles * beams;
    }

    /** Particle states a recording of the trial keeps (about a byte each, compressed). */
    public double recordedParticles() {
        return (double) scans * particles;
    }
}
