/**
 * Runs and batches: the bounded queue and its workers, progress, stored results and verdicts, the engine that runs trials.
 */
package dev.driftlab.app.runs;
