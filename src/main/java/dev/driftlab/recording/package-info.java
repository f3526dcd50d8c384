/**
 * Recording of runs: frames (particles, poses, scan, filter figures), written in chunks that can
 * each be read alone, compact enough for long runs and seekable frame by frame.
 */
package dev.driftlab.recording;
