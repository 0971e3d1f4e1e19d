/**
 * {@code galebench serve}: an interactive bench behind the live web console. Between
 * sequences the plant runs freely in real time against the board (the virtual board in-process,
 * or a real one over UDP or serial); the console's bench controls reach the plant through a
 * real-time-safe {@link dev.galebench.cli.serve.BenchMailbox} and every one is written to the
 * session's {@code controls.log}. The web side lives in the dashboard module; this package is
 * the bench side of {@link dev.galebench.dashboard.BenchControl}.
 */
package dev.galebench.cli.serve;
