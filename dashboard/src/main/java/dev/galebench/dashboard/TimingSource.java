package dev.galebench.dashboard;

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
    /** Fills {@code into} with the current counters. */
    void read(TimingSnapshot into);
}
