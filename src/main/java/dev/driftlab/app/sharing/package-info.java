/**
 * View and edit links: issuing, revoking and resolving the tokens that grant access to a scenario.
 */
package dev.driftlab.app.sharing;
