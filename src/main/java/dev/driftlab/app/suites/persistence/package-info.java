/** Rows of the suite tables (suite, suite_revision, suite_link, suite_run, suite_cell). */
package dev.driftlab.app.suites.persistence;
