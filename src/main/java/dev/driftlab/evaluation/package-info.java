/**
 * Evaluation of runs and batches: error series, trajectory error, convergence, lost and kidnap
 * episodes, success rates with Wilson score intervals, percentiles, paired comparisons between
 * settings variants, and gates. Also the frame recorder that keeps runs compact and seekable.
 */
package dev.driftlab.evaluation;
