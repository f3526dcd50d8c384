/**
 * The player's page and its JSON API: the scene of a run and its frame chunks.
 */
package dev.driftlab.app.player.web;
