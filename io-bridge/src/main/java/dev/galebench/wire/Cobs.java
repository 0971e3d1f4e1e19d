package dev.galebench.wire;

/**
 * Consistent Overhead Byte Stuffing (Cheshire and Baker, IEEE/ACM Trans. Networking 1999):
 * removes every 0x00 from a frame so that 0x00 can delimit frames on a serial line.
 *
 * <p>Overhead: one byte per started 254 bytes of payload (one byte for every galebench
 * frame), plus the 0x00 delimiter the caller appends. Both directions work on caller-owned
 * arrays and allocate nothing.
 */
public final class Cobs {
    /** Status of {@link #decode}: the encoded block is not valid COBS. */
    public static final int INVALID = -1;

    private Cobs() {
    }

    /** Largest encoded size (without delimiter) of a {@code length}-byte frame. */
    public static int maxEncodedLength(int length) {
        return length + length / 254 + 1;
    }

    /**
     * Encodes {@code length} bytes of {@code src} from {@code srcOffset} into {@code dst} at
     * {@code dstOffset} (no delimiter is written). {@code dst} needs
     * {@link #maxEncodedLength(int)} bytes. Returns the encoded length.
     */
    public static int encode(byte[] src, int srcOffset, int length, byte[] dst, int dstOffset) {
        int codeIndex = dstOffset;
        int out = dstOffset + 1;
        int code = 1;
        final int end = srcOffset + length;
        for (int i = srcOffset; i < end; i++) {
            final byte b = src[i];
            if (b == 0) {
                dst[codeIndex] = (byte) code;
                codeIndex = out++;
                code = 1;
            } else {
                dst[out++] = b;
                code++;
                if (code == 0xFF) {
                    dst[codeIndex] = (byte) code;
                    if (i + 1 == end) {
                        return out - dstOffset; // a full block ends the frame: no extra code byte
                    }
                    codeIndex = out++;
                    code = 1;
                }
            }
        }
        dst[codeIndex] = (byte) code;
        return out - dstOffset;
    }

    /**
     * Decodes one COBS block ({@code length} bytes, delimiter excluded) into {@code dst} at
     * {@code dstOffset}, writing at most {@code dstCapacity} bytes. Returns the decoded
     * length, or {@link #INVALID} if the block holds a 0x00, a code byte points past its end,
     * or the result would not fit.
     */
    public static int decode(byte[] src, int srcOffset, int length, byte[] dst, int dstOffset, int dstCapacity) {
        int in = srcOffset;
        final int end = srcOffset + length;
        int out = 0;
        while (in < end) {
            final int code = src[in++] & 0xFF;
            if (code == 0 || in + code - 1 > end) {
                return INVALID;
            }
            for (int k = 1; k < code; k++) {
                final byte b = src[in++];
                if (b == 0 || out >= dstCapacity) {
                    return INVALID;
                }
                dst[dstOffset + out++] = b;
            }
            if (code != 0xFF && in < end) {
                if (out >= dstCapacity) {
                    return INVALID;
                }
                dst[dstOffset + out++] = 0;
            }
        }
        return out;
    }
}
