package dev.galebench.wire;

/**
 * Results of decoding one frame. Decoders return these codes instead of throwing, so a bad
 * frame costs a branch, never an exception, on the real-time thread.
 */
public final class FrameStatus {
    /** The frame is valid; the output object was written. */
    public static final int OK = 0;
    /** The CRC-32C did not match; output untouched. */
    public static final int CRC_ERROR = 1;
    /** Wrong length, magic, version or kind, bad COBS block, or a reply to a sequence never sent; output untouched. */
    public static final int MALFORMED = 2;
    /** A command reference is NaN, infinite or out of its range, or a reserved flag bit is set; output untouched. */
    public static final int INVALID_REFERENCE = 3;

    private FrameStatus() {
    }

    /** Short name of a status code, for logs and test messages (not for the real-time thread). */
    public static String name(int status) {
        switch (status) {
            case OK: return "ok";
            case CRC_ERROR: return "crc-error";
            case MALFORMED: return "malformed";
            case INVALID_REFERENCE: return "invalid-reference";
            default: return "status-" + status;
        }
    }
}
