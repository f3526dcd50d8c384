package dev.driftlab.scenario;

import dev.driftlab.geometry.Bounds;
import java.util.List;

/**
 * The whole editable test case. Values are SI units and radians.
 *
 * @param name display name
 * @param description what the scenario tests, in plain words
 * @param site the floor plan
 * @param robot drive geometry and errors
 * @param rangefinder the range sensor
 * @param route the path the robot is told to drive
 * @param faults injected trouble
 * @param localizer base localizer settings
 * @param variants alternative settings compared on the same seeds (may be empty)
 * @param gates pass/fail criteria
 */
public record Scenario(
        String name,
        String description,
        SitePlan site,
        Robot robot,
        Rangefinder rangefinder,
        Route route,
        List<Fault> faults,
        LocalizerSettings localizer,
        List<SettingsVariant> variants,
        List<Gate> gates) {

    /** Checks presence and copies lists. */
    public Scenario {
        Checks.present(name, "name");
        Checks.present(description, "description");
        Checks.present(site, "site");
        Checks.present(robot, "robot");
        Checks.present(rangefinder, "rangefinder");
        Checks.present(route, "route");
        faults = List.copyOf(faults);
        Checks.present(localizer, "localizer");
        variants = List.copyOf(variants);
        gates = List.copyOf(gates);
    }

    /**
     * The settings variants to compare: the base settings named "base" first, then the declared
     * variants.
     */
    public List<SettingsVariant> allVariants() {
        var all = new java.util.ArrayList<SettingsVariant>();
        all.add(new SettingsVariant("base", localizer));
        all.addAll(variants);
        return List.copyOf(all);
    }

    /**
     * What a drawing of the plan must show: the rooms' bounding box grown to include the route's
     * start, in metres.
     */
    public Bounds drawingBounds() {
        Bounds start = Bounds.of(route.start().x(), route.start().y());
        return site.bounds().map(b -> b.union(start)).orElse(start);
    }
}
