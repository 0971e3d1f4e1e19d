package dev.galebench.sequence;

/** The link faults a sequence can inject between the plant and the board. */
public enum LinkFaultKind {
    /** Replies are lost (each with the given probability). */
    DROP,
    /** Replies arrive a fixed number of exchanges late (each with the given probability). */
    DELAY,
    /** Replies arrive twice (each with the given probability). */
    DUPLICATE,
    /** One byte of a reply is changed (each with the given probability): the CRC must catch it. */
    CORRUPT,
    /** The board's replies stop altogether; the link watchdog must act. */
    SILENCE
}
