/**
 * The scenario editor in the browser: the page that hosts the drawing canvas, the live check of a
 * document being edited, the settings forms and the floor plan import from an occupancy image. The
 * browser holds the scenario as the file-format document; saving goes through the scenario store
 * as a new revision, like any other save.
 */
package dev.driftlab.app.editor;
