/**
 * The real-time side of galebench: the busy-spinning loop that steps the plant on an absolute
 * schedule and exchanges frames with a board through {@link dev.galebench.rt.BoardLink}, its
 * link supervision (late, stale, duplicate, missing, invalid replies, watchdog), its timing
 * histograms ({@link dev.galebench.rt.LoopTimings}, HdrHistogram single-writer recorders) and
 * the per-consumer Disruptor rings that carry {@link dev.galebench.rt.Sample}s to recorders,
 * checkers and the dashboard without ever making the loop wait.
 *
 * <p>Cost model: the loop thread spins one core at 100 % for the whole run, by design (a
 * sleeping wake-up is three orders of magnitude less punctual on the machines we measured).
 * Each consumer costs one thread that parks for 100 us when idle. Nothing here knows sockets,
 * files or web pages. Design, missed-tick policy, supervision rules and measured numbers:
 * rt-plant/LOOP.md.
 */
package dev.galebench.rt;
