package dev.galebench.rt;

/**
 * What a dashboard shows about a running loop. Counters are current; whole-run percentiles
 * ({@code lateness}, {@code compute}, {@code rtt} in ns, {@code replyAge} in exchanges) and the
 * last-interval ones are as of the last closed timing interval.
 */
public record TimingSnapshot(long exchanges, long steps, long overruns, long skippedExchanges,
                             long exchangePeriodNs, long intervalsClosed,
                             Percentiles lateness, Percentiles compute, Percentiles rtt, Percentiles replyAge,
                             Percentiles lastIntervalLateness, Percentiles lastIntervalRtt,
                             long clampedValues) {
}
