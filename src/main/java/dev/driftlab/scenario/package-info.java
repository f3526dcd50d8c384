/**
 * The scenario: the editable, versioned test case (site plan, robot, rangefinder, route, faults,
 * localizer settings, settings variants and gates), its JSON file format and its validation; also the
 * suite and profile files (SuiteFile, Profile) that name scenarios and change them.
 *
 * <p>Records here hold SI units and radians. The JSON file holds metres, seconds and degrees;
 * {@link dev.driftlab.scenario.ScenarioJson} converts at the boundary.
 */
package dev.driftlab.scenario;
