package dev.galebench.rt;

import org.HdrHistogram.Histogram;
import org.HdrHistogram.HistogramLogWriter;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.util.concurrent.atomic.AtomicLong;

/**
 * Timing of a running (or finished) loop, readable from any thread while the loop runs: a
 * dashboard or the preflight command calls {@link #snapshot()}. The real-time thread only
 * records into single-writer recorders and bumps counters with release stores; it never waits
 * for a reader. A reader thread owned by the loop swaps the interval histograms every
 * {@code timingIntervalNs}, accumulates run totals and appends the interval to an in-memory
 * HdrHistogram interval log (compressed, a few hundred bytes per interval and tag).
 *
 * <p>Units: lateness, compute and round trip in ns (highest trackable 60 s); reply age in
 * exchanges (highest 10^9). Snapshots lag the loop by at most one interval for percentiles;
 * the counters are current.
 */
public final class LoopTimings {
    static final long HIGHEST_TIME_NS = 60_000_000_000L;
    static final long HIGHEST_AGE = 1_000_000_000L;
    /** Phase-flip period of the recorders during the start of a run, ms. */
    static final long WARMUP_SWAP_MS = 10;
    /** How long the frequent phase flips last, ms. */
    static final long WARMUP_MS = 3_000;

    final TimingChannel lateness = new TimingChannel("lateness", HIGHEST_TIME_NS);
    final TimingChannel compute = new TimingChannel("compute", HIGHEST_TIME_NS);
    final TimingChannel rtt = new TimingChannel("rtt", HIGHEST_TIME_NS);
    final TimingChannel replyAge = new TimingChannel("reply_age", HIGHEST_AGE);

    /** Exchanges done (written by the real-time thread). */
    final AtomicLong exchanges = new AtomicLong();
    /** Exchanges that started more than one exchange period after their deadline. */
    final AtomicLong overruns = new AtomicLong();
    /** Deadlines dropped under {@link MissedTickPolicy#SKIP}. */
    final AtomicLong skippedExchanges = new AtomicLong();
    /** Plant steps done. */
    final AtomicLong steps = new AtomicLong();

    private final long exchangePeriodNs;
    private final ByteArrayOutputStream logBytes = new ByteArrayOutputStream(1 << 16);
    private final HistogramLogWriter logWriter;
    private long baseTimeMs;
    private long intervals;

    LoopTimings(long exchangePeriodNs) {
        this.exchangePeriodNs = exchangePeriodNs;
        this.logWriter = new HistogramLogWriter(new PrintStream(logBytes, false, StandardCharsets.US_ASCII));
    }

    synchronized void start(long baseTimeMs) {
        this.baseTimeMs = baseTimeMs;
        logWriter.setBaseTime(baseTimeMs);
        lateness.resetAll();
        compute.resetAll();
        rtt.resetAll();
        replyAge.resetAll();
    }

    /**
     * Reader: closes the recorders' current interval (a phase flip of each recorder) and adds it
     * to the run totals; with {@code log} also writes everything since the last logged interval
     * as one interval of the log. The loop's reader flips every {@value #WARMUP_SWAP_MS} ms during
     * the first {@value #WARMUP_MS} ms and logs once per {@code timingIntervalNs}: the recorders'
     * phase flips change the sign of the writer's epoch, and a flip that C2's profile never saw
     * deoptimises the compiled loop once (an uncommon trap, which also re-materialises
     * scalar-replaced objects on the loop thread). Flipping often while the loop is still being
     * profiled avoids that.
     */
    synchronized void takeInterval(boolean log) {
        lateness.swapInterval();
        compute.swapInterval();
        rtt.swapInterval();
        replyAge.swapInterval();
        if (log) {
            logPending(lateness);
            logPending(compute);
            logPending(rtt);
            logPending(replyAge);
            intervals++;
        }
    }

    /** Reader: closes and logs the current interval. */
    void takeInterval() {
        takeInterval(true);
    }

    private void logPending(TimingChannel c) {
        final Histogram h = c.pendingLogInterval();
        if (h != null) {
            logWriter.outputIntervalHistogram(h);
        }
        c.clearPending();
    }

    /** A consistent copy of what is known now (allocates; call from any non-real-time thread). */
    public synchronized TimingSnapshot snapshot() {
        return new TimingSnapshot(exchanges.get(), steps.get(), overruns.get(), skippedExchanges.get(),
                exchangePeriodNs, intervals,
                Percentiles.of(lateness.total()), Percentiles.of(compute.total()),
                Percentiles.of(rtt.total()), Percentiles.of(replyAge.total()),
                Percentiles.of(lateness.lastInterval()), Percentiles.of(rtt.lastInterval()),
                lateness.clampedCount() + compute.clampedCount() + rtt.clampedCount() + replyAge.clampedCount());
    }

    /**
     * A copy of the whole-run histogram (as of the last closed interval) of {@code tag}:
     * "lateness", "compute", "rtt" (ns) or "reply_age" (exchanges); for a dashboard's histogram
     * plot. Allocates about 200 KB; call it a few times a second at most.
     *
     * @throws IllegalArgumentException for another tag
     */
    public Histogram histogram(String tag) {
        switch (tag) {
            case "lateness": return copyTotal(lateness);
            case "compute": return copyTotal(compute);
            case "rtt": return copyTotal(rtt);
            case "reply_age": return copyTotal(replyAge);
            default: throw new IllegalArgumentException("no timing histogram '" + tag + "' (lateness, compute, rtt, reply_age)");
        }
    }

    synchronized Histogram copyTotal(TimingChannel c) {
        Histogram h = c.total().copy();
        h.setTag(c.tag);
        return h;
    }

    synchronized byte[] intervalLogBody() {
        return logBytes.toByteArray();
    }

    synchronized long baseTimeMs() {
        return baseTimeMs;
    }
}
