/**
 * Report pages and downloads: recovery and batch reports, before-and-after comparisons, PDF.
 */
package dev.driftlab.app.reports.web;
