package dev.galebench.sequence;

/** The link faults a sequence can inject between the plant and the board. */
public enum LinkFaultKind {
    /** Replies are lost (every Nth one). */
    DROP,
    /** Replies arrive a fixed number of exchanges late. */
    DELAY,
    /** The board's replies stop altogether; the link watchdog must act. */
    SILENCE
}
