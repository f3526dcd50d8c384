/**
 * Storage of scenarios and their revisions (JDBC over the Flyway schema).
 */
package dev.driftlab.app.scenarios.persistence;
