package dev.driftlab.scenario;

import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Set;

/**
 * Checks a scenario's meaning: ranges, geometry, references between items and sizes. Returns every
 * problem at once, each with the path of the field in the file and a plain message; errors refuse
 * the scenario, warnings allow it (a door narrower than the robot may be the point of the test).
 *
 * <p>The one entry point for the checks of each part: {@link SiteChecks}, {@link RouteChecks},
 * {@link FaultChecks}, {@link SettingsChecks} (robot, rangefinder, localizer settings and variants)
 * and {@link GateChecks}, run in that order so the problems come in file order.
 */
public final class ScenarioValidator {

    private ScenarioValidator() {}

    /** Validates a scenario read from a file. */
    public static ValidationReport validate(Scenario s) {
        List<Problem> problems = new ArrayList<>();
        Findings out = new Findings(problems);
        SiteChecks site = new SiteChecks(s, out);
        site.check();
        SettingsChecks.robot(s.robot(), problems);
        SettingsChecks.rangefinder(s.rangefinder(), problems);
        RouteChecks.check(s, site, out);
        FaultChecks.check(s, site, out);
        int before = problems.size();
        SettingsChecks.localizer(s.localizer(), s.rangefinder().beams(), "localizer", problems);
        SettingsChecks.gridSize(s.localizer(), s.site().bounds(), "localizer", problems);
        Set<Problem> baseProblems = new HashSet<>(problems.subList(before, problems.size()));
        SettingsChecks.variants(s, baseProblems, problems);
        GateChecks.check(s, problems);
        return new ValidationReport(problems);
    }

    /** Validates one set of localizer settings on its own, with paths under {@code prefix}. */
    public static List<Problem> validateSettings(LocalizerSettings settings, int beams, String prefix) {
        List<Problem> problems = new ArrayList<>();
        SettingsChecks.localizer(settings, beams, prefix, problems);
        return problems;
    }
}
