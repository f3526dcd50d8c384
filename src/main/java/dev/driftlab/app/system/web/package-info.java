/**
 * Cross-cutting web concerns: error pages, problem responses, security headers, request size limits.
 */
package dev.driftlab.app.system.web;
