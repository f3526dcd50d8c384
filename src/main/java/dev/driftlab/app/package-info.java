/**
 * The Spring Boot web app. One package per feature (scenarios, runs, reports, sharing, system),
 * each with {@code web/} and {@code persistence/} inside. The only place Spring appears.
 */
package dev.driftlab.app;
