/**
 * Turns a scenario's site plan into geometry: wall segments with door gaps cut out, the believed
 * map the localizer is given, and the actual world the rangefinder sees at a given time. Units are
 * metres and radians in the site frame.
 */
package dev.driftlab.site;
