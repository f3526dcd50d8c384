package dev.driftlab.app.editor.web;

/**
 * One settings form as the editor page first shows it.
 *
 * @param section which form
 * @param form its values
 * @param outcome no messages yet
 */
public record SectionForm(SettingsSection section, SettingsForm form, SettingsForm.Outcome outcome) {}
