/**
 * Command-line entry points for CI pipelines ({@code validate}, {@code run}, {@code batch}, {@code
 * sweep}, and {@code submit}, which runs a batch on a Driftlab server over its JSON API), the
 * {@code --localizer} option that judges an outside program, and {@code localizer-stdio}, the
 * built-in localizer behind the open protocol. Plain Java: no web server or database starts.
 */
package dev.driftlab.cli;
