/**
 * The share panel: reissuing and revoking a scenario's links.
 */
package dev.driftlab.app.sharing.web;
