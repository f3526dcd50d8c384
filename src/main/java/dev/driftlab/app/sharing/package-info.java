/**
 * View and edit links: issuing, revoking and resolving the tokens that grant access to a scenario
 * or a suite. The rules are written once ({@link dev.driftlab.app.sharing.OwnerLinks}, {@link
 * dev.driftlab.app.sharing.Access}) for every kind of owner.
 */
package dev.driftlab.app.sharing;
