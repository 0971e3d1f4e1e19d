package dev.galebench.dashboard;

import dev.galebench.rt.BoardLink;
import dev.galebench.rt.RealTimeLoop;
import dev.galebench.rt.TimingSnapshot;

/**
 * Loop and link counters the console shows beside the plots. Lateness and round trip per
 * exchange already travel in the sample stream ({@code lateness_us}, {@code rtt_us}); the
 * console builds its histogram and percentiles from those itself. What the stream does not
 * carry (overrun count, link fault counters) comes from here.
 *
 * <p>Called from the console's feed thread about twice a second; must not block. Reading
 * counters another thread writes gives approximate values, which is fine for a display.
 */
@FunctionalInterface
public interface TimingSource {
    /** Fills {@code into} (cleared before the call) with the current counters. */
    void read(BenchCounters into);

    /**
     * The usual source: exchanges and overruns from the loop's live timing, fault counters
     * from the board link it runs (the loop's supervision writes those same counters).
     * Each read allocates one loop snapshot (a few hundred bytes, twice a second).
     *
     * @param link null if the run has no board link to show
     */
    static TimingSource of(RealTimeLoop loop, BoardLink link) {
        return into -> {
            TimingSnapshot t = loop.timings().snapshot();
            into.exchanges = t.exchanges();
            into.overruns = t.overruns();
            if (link != null) {
                into.linkPresent = true;
                into.link.copyFrom(link.counters());
            }
        };
    }
}
