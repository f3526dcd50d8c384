/**
 * Recovery reports of a run or of the runs submitted together, rebuilt from the stored result
 * documents and frame chunks and rendered as a page or a PDF.
 */
package dev.driftlab.app.reports;
