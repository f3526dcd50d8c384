/**
 * Running trials: the simulator and the localizer in lockstep (one trial is a pure function of
 * revision, settings and seed), batches of many seeds and variants on the same seeds,
 * particle-count sweeps, and suites (SuitePlan, SuiteRunner: many scenarios, each as it is and
 * under each profile, on the same seeds). Reads the site, sim, localizer, recording and evaluation
 * stages. The localizer of a trial comes from a {@link dev.driftlab.trial.LocalizerSource}: the
 * built-in filter, or an outside program ({@link dev.driftlab.trial.OutsideLocalizer}, a child
 * process per trial speaking driftlab-localizer/1); apart from starting that program, nothing here
 * does I/O of its own.
 */
package dev.driftlab.trial;
