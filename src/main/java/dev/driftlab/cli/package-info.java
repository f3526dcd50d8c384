/**
 * Command-line entry points for CI pipelines ({@code validate}, {@code run}, {@code batch}, {@code
 * sweep}, {@code suite}, and {@code submit} and {@code suite --server}, which run a batch or a suite
 * on a Driftlab server over its JSON API), the
 * {@code --localizer} option that judges an outside program, and {@code localizer-stdio}, the
 * built-in localizer behind the open protocol. Plain Java: no web server or database starts.
 */
package dev.driftlab.cli;
