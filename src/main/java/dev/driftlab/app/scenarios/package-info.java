/**
 * Scenarios as stored revisions: saving with conflict detection, reading a revision, loading the sample projects on first start.
 */
package dev.driftlab.app.scenarios;
