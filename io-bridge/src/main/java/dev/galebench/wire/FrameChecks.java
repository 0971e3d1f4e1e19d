package dev.galebench.wire;

import java.nio.ByteBuffer;

/** Checks shared by both decoders: length, CRC, magic, version, kind. */
final class FrameChecks {
    private FrameChecks() {
    }

    /**
     * Returns the kind byte (&gt; 0) of a well-formed frame with a good CRC, or the negated
     * {@link FrameStatus} code. Order: length first (it says where the CRC is), then CRC, then
     * header fields, so a corrupted valid-length frame is a CRC error, not "malformed".
     */
    static int checkFrame(Crc32c crc, ByteBuffer b, int o, int length) {
        if (length != FrameLayout.FULL_MEASUREMENT_LENGTH && length != FrameLayout.FULL_COMMAND_LENGTH
                && length != FrameLayout.COMPACT_MEASUREMENT_LENGTH && length != FrameLayout.COMPACT_COMMAND_LENGTH) {
            return -FrameStatus.MALFORMED;
        }
        final int crcAt = length - FrameLayout.CRC_LENGTH;
        if (crc.of(b, o, crcAt) != b.getInt(o + crcAt)) {
            return -FrameStatus.CRC_ERROR;
        }
        if ((b.get(o) & 0xFF) != FrameLayout.MAGIC_0 || (b.get(o + 1) & 0xFF) != FrameLayout.MAGIC_1
                || (b.get(o + FrameLayout.OFFSET_VERSION) & 0xFF) != FrameLayout.VERSION) {
            return -FrameStatus.MALFORMED;
        }
        final int kind = b.get(o + FrameLayout.OFFSET_KIND) & 0xFF;
        final int expectedLength;
        switch (kind) {
            case FrameLayout.KIND_MEASUREMENT_FULL: expectedLength = FrameLayout.FULL_MEASUREMENT_LENGTH; break;
            case FrameLayout.KIND_COMMAND_FULL: expectedLength = FrameLayout.FULL_COMMAND_LENGTH; break;
            case FrameLayout.KIND_MEASUREMENT_COMPACT: expectedLength = FrameLayout.COMPACT_MEASUREMENT_LENGTH; break;
            case FrameLayout.KIND_COMMAND_COMPACT: expectedLength = FrameLayout.COMPACT_COMMAND_LENGTH; break;
            default: return -FrameStatus.MALFORMED;
        }
        return expectedLength == length ? kind : -FrameStatus.MALFORMED;
    }
}
