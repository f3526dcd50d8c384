/**
 * The run player: a run's scene (site plan, map differences, beam angles, series, markers) and its
 * recorded frames as compact JSON for the browser, decoded on the server from the stored chunks.
 */
package dev.driftlab.app.player;
