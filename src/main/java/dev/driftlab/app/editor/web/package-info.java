/**
 * Editor pages and forms: the drawing page, the live check, the settings, variants and gates forms and the occupancy image import, each checked by the scenario reader and validator.
 */
package dev.driftlab.app.editor.web;
