/**
 * The live web console: a Netty HTTP + WebSocket server inside the galebench process that
 * shows decimated live plots, loop timing, link counters, the sequence list and verdicts, and
 * (in interactive mode) lets a user drive the bench.
 *
 * <p>Why it is built this way: the real-time thread must never wait for a browser. Telemetry
 * therefore reaches the console only through the sample ring: {@link dev.galebench.dashboard.DecimatingFeed}
 * is an ordinary {@link dev.galebench.rt.SampleConsumer} on its own thread, reduces every
 * ~20 ms of plant time to a min/max pair per plotted signal and hands pre-encoded JSON batches
 * to {@link dev.galebench.dashboard.TelemetryHub}, which fans them out to every open socket.
 * Cost to the loop: one extra ring consumer; if the console falls behind, the ring counts its
 * losses and never blocks.
 *
 * <p>The module depends on rt-plant only. What it needs from the bench (sequences, start,
 * abort, wind, dips, link faults, loop counters) is expressed as the interfaces
 * {@link dev.galebench.dashboard.BenchControl} and {@link dev.galebench.dashboard.TimingSource},
 * implemented by test-sequences. The entry point for everything else is
 * {@link dev.galebench.dashboard.Dashboard}. Protocol and access rules: {@code dashboard/README.md}.
 */
package dev.galebench.dashboard;
