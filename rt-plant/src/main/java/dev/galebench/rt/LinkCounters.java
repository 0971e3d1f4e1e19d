package dev.galebench.rt;

/**
 * Named fault counters of one board link. The transport increments the wire-level counters
 * (CRC, malformed, send failures); the loop's supervision increments the exchange-level ones
 * (late, stale, duplicate, missing, NaN or out-of-range, watchdog). Single writer (the
 * real-time thread); volatile-free plain longs, read by reporters after the run or
 * approximately while it runs.
 */
public final class LinkCounters {
    /** Frames sent to the board. */
    public long framesSent;
    /** Valid replies accepted. */
    public long repliesAccepted;
    /** Frames whose CRC did not match. */
    public long crcErrors;
    /** Frames of wrong length, unknown version or profile, bad framing (COBS) or bad magic. */
    public long malformedFrames;
    /** Replies that arrived after the exchange they answer had passed (age &gt; 0) but newer than any accepted. */
    public long lateReplies;
    /** Replies answering a sequence older than one already accepted. */
    public long staleReplies;
    /** Replies answering a sequence already accepted. */
    public long duplicateReplies;
    /** Exchanges that ended with no reply to their frame. */
    public long missingReplies;
    /** Replies with a NaN, infinite or out-of-range reference (rejected, last good command held). */
    public long invalidReferences;
    /** Sends the OS refused (buffer full, port gone). */
    public long sendFailures;
    /** Times the watchdog fired. */
    public long watchdogTrips;

    /** Sets every counter to zero. */
    public void reset() {
        framesSent = repliesAccepted = crcErrors = malformedFrames = lateReplies = staleReplies = 0;
        duplicateReplies = missingReplies = invalidReferences = sendFailures = watchdogTrips = 0;
    }

    /** Copies every counter of {@code other} (for off-thread snapshots). */
    public void copyFrom(LinkCounters o) {
        framesSent = o.framesSent; repliesAccepted = o.repliesAccepted; crcErrors = o.crcErrors;
        malformedFrames = o.malformedFrames; lateReplies = o.lateReplies; staleReplies = o.staleReplies;
        duplicateReplies = o.duplicateReplies; missingReplies = o.missingReplies;
        invalidReferences = o.invalidReferences; sendFailures = o.sendFailures; watchdogTrips = o.watchdogTrips;
    }
}
