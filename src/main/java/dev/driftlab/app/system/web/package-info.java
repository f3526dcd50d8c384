/**
 * Cross-cutting web concerns: error pages, problem responses, security headers, request size limits,
 * and the API page listing the OpenAPI document's operations.
 */
package dev.driftlab.app.system.web;
