/** Cross-cutting parts of the web app: security headers and CSRF, error answers, API documentation. */
package dev.driftlab.app.system;
