/**
 * Running trials: the simulator and the localizer in lockstep (one trial is a pure function of
 * revision, settings and seed), batches of many seeds and variants on the same seeds, and
 * particle-count sweeps. Reads the site, sim, localizer, recording and evaluation stages; nothing
 * here does I/O of its own.
 */
package dev.driftlab.trial;
