/**
 * Scenario pages and the scenario JSON API: home page, scenario page, history, upload.
 */
package dev.driftlab.app.scenarios.web;
