package dev.galebench.rt;

import org.HdrHistogram.Histogram;
import org.HdrHistogram.SingleWriterRecorder;

import java.util.concurrent.atomic.AtomicLong;

/**
 * One timing quantity (lateness, compute, round trip, reply age): a fixed-range
 * {@link SingleWriterRecorder} written wait-free by the real-time thread, and a reader side
 * that swaps intervals, recycles the previous interval histogram and accumulates a whole-run
 * histogram. Values above the range are recorded as the highest trackable value and counted
 * ({@link #clampedCount()}); negative values are recorded as 0 and counted too, because a
 * fixed-range histogram never resizes (resizing would allocate on the writer).
 *
 * <p>Threads: {@link #record} from the real-time thread only; everything else from the reader
 * (guarded by the owning {@link LoopTimings}' lock, never taken by the writer).
 */
final class TimingChannel {
    static final int SIGNIFICANT_DIGITS = 3;

    final String tag;
    final long highestTrackable;
    private final SingleWriterRecorder recorder;
    private final AtomicLong clamped = new AtomicLong();
    private final Histogram total;
    private final Histogram pending;
    private long pendingStartMs = Long.MAX_VALUE;
    private long pendingEndMs;
    private Histogram interval;

    TimingChannel(String tag, long highestTrackable) {
        this.tag = tag;
        this.highestTrackable = highestTrackable;
        this.recorder = new SingleWriterRecorder(1, highestTrackable, SIGNIFICANT_DIGITS);
        this.total = new Histogram(1, highestTrackable, SIGNIFICANT_DIGITS);
        this.total.setTag(tag);
        this.pending = new Histogram(1, highestTrackable, SIGNIFICANT_DIGITS);
        this.pending.setTag(tag);
        this.interval = recorder.getIntervalHistogram();
    }

    /** Real-time thread: records {@code value}, clamped into [0, highestTrackable]. Wait-free, no allocation. */
    void record(long value) {
        long v = value;
        if (v > highestTrackable) {
            v = highestTrackable;
            clamped.lazySet(clamped.get() + 1);
        } else if (v < 0) {
            v = 0;
            clamped.lazySet(clamped.get() + 1);
        }
        recorder.recordValue(v);
    }

    /** Values clamped into the range so far. */
    long clampedCount() {
        return clamped.get();
    }

    /**
     * Reader: swaps the recorder's interval, adds it to the run total and to the pending log
     * interval (several swaps may make one logged interval).
     */
    void swapInterval() {
        interval = recorder.getIntervalHistogram(interval);
        interval.setTag(tag);
        total.add(interval);
        pending.add(interval);
        pendingStartMs = Math.min(pendingStartMs, interval.getStartTimeStamp());
        pendingEndMs = Math.max(pendingEndMs, interval.getEndTimeStamp());
    }

    /** Reader: the histogram of everything swapped since the last call, timestamped and tagged, or null if nothing was swapped. */
    Histogram pendingLogInterval() {
        if (pendingStartMs == Long.MAX_VALUE) {
            return null;
        }
        pending.setStartTimeStamp(pendingStartMs);
        pending.setEndTimeStamp(pendingEndMs);
        return pending;
    }

    /** Reader: starts a new pending log interval. */
    void clearPending() {
        pending.reset();
        pending.setTag(tag);
        pendingStartMs = Long.MAX_VALUE;
        pendingEndMs = 0;
    }

    /** Reader: discards everything recorded so far (before the run starts). */
    void resetAll() {
        swapInterval();
        total.reset();
        total.setTag(tag);
        clearPending();
    }

    /** Reader: the whole-run histogram so far (live object, copy before handing out). */
    Histogram total() {
        return total;
    }

    /** Reader: the last interval histogram (live object, copy before handing out). */
    Histogram lastInterval() {
        return interval;
    }
}
