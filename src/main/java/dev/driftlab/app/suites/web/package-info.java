/** Suite pages and the suite JSON API. */
package dev.driftlab.app.suites.web;
