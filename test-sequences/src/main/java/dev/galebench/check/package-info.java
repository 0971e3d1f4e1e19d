/**
 * Streaming checks of a sequence run: each check is a small state machine fed sample by
 * sample ({@link dev.galebench.check.StreamingCheck}), ending in a
 * {@link dev.galebench.report.CheckOutcome} with measured and required values in words and units
 * and the signal, window and band for plots. {@link dev.galebench.check.CheckSet} feeds all of a
 * run's checks from one consumer thread. No check keeps samples: memory stays flat for a run of
 * any length. Timing and link-health checks are judged after the run from the loop's histograms
 * and the link counters ({@link dev.galebench.check.RunFacts}).
 */
package dev.galebench.check;
