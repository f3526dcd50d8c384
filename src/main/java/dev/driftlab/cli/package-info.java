/**
 * Command-line entry points for CI pipelines ({@code validate}, and later {@code run}, {@code batch},
 * {@code sweep}). Plain Java: no web server or database starts.
 */
package dev.driftlab.cli;
