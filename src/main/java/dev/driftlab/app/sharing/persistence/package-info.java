/**
 * Storage of view and edit links (JDBC over the Flyway schema): the queries of every link table,
 * written once in {@link dev.driftlab.app.sharing.persistence.LinkTable}.
 */
package dev.driftlab.app.sharing.persistence;
