package dev.driftlab.trial;

import dev.driftlab.geometry.GridMap;
import dev.driftlab.geometry.Pose;
import dev.driftlab.localizer.MapViews;
import dev.driftlab.localizer.MonteCarloLocalizer;
import dev.driftlab.localizer.TrialLocalizer;
import dev.driftlab.scenario.LocalizerSettings;
import dev.driftlab.scenario.Scenario;
import dev.driftlab.site.BelievedMap;

/**
 * Where a trial's localizer comes from: the built-in filter ({@link #BUILT_IN}) or an outside
 * program ({@link OutsideLocalizer}). One source serves every trial of a batch; {@link #open} is
 * called once per trial, from the trial's thread.
 */
public interface LocalizerSource {

    /**
     * What a localizer is started with.
     *
     * @param scenario the scenario (robot, rangefinder, route start)
     * @param settings the variant's localizer settings
     * @param believed the believed map (walls and fixtures as segments)
     * @param grid the believed map rasterised at the settings' cell size
     * @param views the built-in filter's views of that grid
     * @param seed the localizer's own seed, derived from the trial's seed
     * @param beamAngles beam directions relative to the sensor heading, radians
     * @param mount sensor pose on the robot
     * @param maxRange longest measurable range, metres
     * @param recording whether the trial records frames (an outside localizer is then asked for
     *     particles to draw)
     */
    record Setup(
            Scenario scenario,
            LocalizerSettings settings,
            BelievedMap believed,
            GridMap grid,
            MapViews views,
            long seed,
            double[] beamAngles,
            Pose mount,
            double maxRange,
            boolean recording) {}

    /**
     * Starts a localizer for one trial, at the route's start hint.
     *
     * @throws dev.driftlab.localizer.LocalizerFailure when an outside localizer cannot be started
     *     or its greeting fails
     */
    TrialLocalizer open(Setup setup);

    /** Short name for results and reports: "built-in" or the outside program's command. */
    String name();

    /** The built-in Monte Carlo localizer, started as its settings say. */
    LocalizerSource BUILT_IN = new LocalizerSource() {
        @Override
        public TrialLocalizer open(Setup s) {
            MonteCarloLocalizer filter = new MonteCarloLocalizer(s.settings(), s.views(), s.seed(), 1);
            filter.initialize(s.scenario().route().start());
            return filter;
        }

        @Override
        public String name() {
            return "built-in";
        }
    };
}
