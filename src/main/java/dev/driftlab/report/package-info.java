/**
 * Report model and the renderers that need no web server: the site plan drawing (SVG) now, and the
 * run and batch reports as they arrive. Used by the web app and the command line alike.
 */
package dev.driftlab.report;
