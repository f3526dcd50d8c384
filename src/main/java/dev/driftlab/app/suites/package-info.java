/** Suites in the web app: shared, versioned lists of scenarios and profiles, and their runs. */
package dev.driftlab.app.suites;
