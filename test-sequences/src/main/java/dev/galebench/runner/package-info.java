/**
 * The sequence runner and the commands around it: {@code run}, {@code demo}, {@code sequences},
 * {@code compare}, {@code replay}. The runner wires parse, plant, link, real-time loop, streaming
 * checks and report writers, and maps verdicts to exit codes (0 all passed, 1 a check failed or
 * the run aborted, 2 bad input).
 */
package dev.galebench.runner;
