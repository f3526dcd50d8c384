/**
 * Plane geometry of a site in the site frame: metres, radians, x east, y north, headings
 * counter-clockwise from +x and wrapped to (-pi, pi].
 *
 * <p>Besides the small values (points, poses, segments, polygons) this package holds the hot-loop
 * structures the simulator and the localizer share: wall segment sets with their exact ray caster,
 * the occupancy grid, its Euclidean distance field, the grid ray caster and the free-space
 * sampler. They keep their data in primitive arrays and allocate nothing per ray. This package
 * knows nothing about scenarios; {@code dev.driftlab.site} turns a scenario's site plan
 * into these structures.
 */
package dev.driftlab.geometry;
