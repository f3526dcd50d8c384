/**
 * Storage of share links (JDBC over the Flyway schema).
 */
package dev.driftlab.app.sharing.persistence;
