package dev.galebench.board;

/**
 * What the virtual board saw. Written by the board's receive thread, read by others after
 * {@link VirtualBoard#close} or approximately while it runs (volatile, one writer).
 */
public final class BoardCounters {
    /** Frames that passed every check and were answered. */
    public volatile long framesAnswered;
    /** Frames with a bad CRC-32C (not answered). */
    public volatile long crcErrors;
    /** Frames of bad length, magic, version or kind, or bad COBS (not answered). */
    public volatile long malformedFrames;
    /** Valid measurement frames of the other profile than the board's (not answered). */
    public volatile long wrongProfile;
    /** Replies the OS refused. */
    public volatile long sendFailures;
    /** Times the controller was (re)started: first frame, or the plant's sequence went backwards. */
    public volatile long starts;
    /**
     * Measurement frames passed over because a newer one was already waiting: after a stall
     * the board answers the newest frame only, as a board sampling its latest inputs would.
     */
    public volatile long framesSkipped;

    @Override
    public String toString() {
        return "answered " + framesAnswered + ", crc errors " + crcErrors + ", malformed " + malformedFrames
                + ", wrong profile " + wrongProfile + ", send failures " + sendFailures + ", controller starts " + starts
                + ", skipped (newer waiting) " + framesSkipped;
    }
}
