/**
 * Storage of runs, their options, results, verdicts and recorded frame chunks (JDBC over the Flyway schema).
 */
package dev.driftlab.app.runs.persistence;
