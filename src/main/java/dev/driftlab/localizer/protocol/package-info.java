/**
 * The open protocol {@code driftlab-localizer/1}: an outside localizer as a child process that
 * reads JSON lines on standard input and answers JSON lines on standard output (see
 * docs/localizer-protocol.md).
 *
 * <p>{@link dev.driftlab.localizer.protocol.Messages} writes and reads every message and is the one
 * home of the protocol's names, versions and bounds; {@link
 * dev.driftlab.localizer.protocol.ProcessLocalizer} runs a program as a {@link
 * dev.driftlab.localizer.TrialLocalizer}, with a time limit on every answer, bounded reads and the
 * tail of the program's error output; {@link dev.driftlab.localizer.protocol.OccupancyRows} is the
 * run-length form of the occupancy grid. Plain Java and Jackson; units are SI (metres, seconds,
 * radians) in the site frame, as everywhere in the core.
 */
package dev.driftlab.localizer.protocol;
