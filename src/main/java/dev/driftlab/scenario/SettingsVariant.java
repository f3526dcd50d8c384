package dev.driftlab.scenario;

/**
 * A named alternative set of localizer settings, compared with the others on the same seeds.
 *
 * @param name display name, unique within the scenario
 * @param settings the complete settings of this variant
 */
public record SettingsVariant(String name, LocalizerSettings settings) {
    /** Checks presence. */
    public SettingsVariant {
        Checks.present(name, "name");
        Checks.present(settings, "settings");
    }
}
