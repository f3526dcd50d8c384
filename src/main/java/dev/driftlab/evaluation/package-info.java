/**
 * Evaluation of trials: error series, absolute and relative trajectory error, convergence, lost
 * and kidnap episodes, early ends and faults that did not fire, success rates with Wilson score
 * intervals, percentiles, paired comparisons between settings variants, gates judged over the
 * trials that exercised them, and the verdict.
 */
package dev.driftlab.evaluation;
