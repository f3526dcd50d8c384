/**
 * Run pages, the runs panel fragment and the runs JSON API.
 */
package dev.driftlab.app.runs.web;
