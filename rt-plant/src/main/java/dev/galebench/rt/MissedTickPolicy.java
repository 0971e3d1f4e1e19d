package dev.galebench.rt;

/**
 * What the loop does when it finds itself more than one exchange period behind its schedule
 * (the host took the CPU away, a GC ran, a consumer or hook took too long). Either way the
 * late exchanges are counted as overruns; nothing drifts silently.
 */
public enum MissedTickPolicy {
    /**
     * Run the missed exchanges back to back, without waiting, until the loop is on schedule
     * again. Plant time stays locked to wall time (t0 + k h), which is what a board with its
     * own clock expects; the cost is a burst of exchanges closer together than one period.
     * Default.
     */
    CATCH_UP,
    /**
     * Drop the missed deadlines: the next exchange waits for the next deadline on the same
     * t0 + k h grid. The plant advances only M steps for that exchange, so plant time falls
     * behind wall time by the skipped periods (counted in {@code skippedExchanges}); frames stay
     * evenly spaced. Use it when a burst of back-to-back frames would upset the board more than
     * a time lag.
     */
    SKIP
}
