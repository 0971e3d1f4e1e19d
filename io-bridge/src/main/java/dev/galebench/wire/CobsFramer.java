package dev.galebench.wire;

/**
 * Splits a byte stream from a serial line into COBS-decoded frames at 0x00 delimiters. The
 * caller reads raw bytes straight into {@link #buffer()} at {@link #writeOffset()} (up to
 * {@link #writableBytes()}), reports them with {@link #advance}, then takes frames with
 * {@link #nextFrame}. Pre-allocated, allocation-free, one owner thread.
 *
 * <p>Resynchronisation rules (also in PROTOCOL.md): an empty frame (two delimiters in a row)
 * is ignored; a run of more than {@code maxEncodedLength} bytes without a delimiter is
 * discarded up to the next delimiter and counted once as malformed; after
 * {@link #discardUntilDelimiter()} (used when a port opens mid-stream) the bytes up to the
 * first delimiter are dropped silently.
 */
public final class CobsFramer {
    /** {@link #nextFrame} result: no complete frame buffered. */
    public static final int NONE = 0;
    /** {@link #nextFrame} result: a malformed block was dropped. */
    public static final int MALFORMED = -1;

    private final byte[] stream;
    private final int maxEncoded;
    private int start;
    private int end;
    private int scan;
    private boolean discarding;
    private boolean overlong;

    /** A framer for frames of at most {@code maxFrameLength} decoded bytes. */
    public CobsFramer(int maxFrameLength, int streamCapacity) {
        maxEncoded = Cobs.maxEncodedLength(maxFrameLength);
        if (streamCapacity < 2 * (maxEncoded + 1)) {
            throw new IllegalArgumentException("stream capacity " + streamCapacity + " too small for frames of " + maxFrameLength + " bytes");
        }
        stream = new byte[streamCapacity];
    }

    /** The stream buffer to read raw bytes into. */
    public byte[] buffer() {
        return stream;
    }

    /** Where the next raw byte goes; makes room first by moving unread bytes to the front. */
    public int writeOffset() {
        if (start > 0) {
            final int remaining = end - start;
            System.arraycopy(stream, start, stream, 0, remaining);
            scan -= start;
            end = remaining;
            start = 0;
        }
        return end;
    }

    /** Free bytes after {@link #writeOffset()}. */
    public int writableBytes() {
        return stream.length - end;
    }

    /** Records {@code n} raw bytes written at {@link #writeOffset()}. */
    public void advance(int n) {
        end += n;
    }

    /** Drops the bytes up to the next delimiter without counting them. */
    public void discardUntilDelimiter() {
        discarding = true;
    }

    /** Bytes buffered but not yet framed. */
    public int pendingBytes() {
        return end - start;
    }

    /**
     * Decodes the next complete frame into {@code dst[0..]}: returns its length,
     * {@link #NONE} if no complete frame is buffered, or {@link #MALFORMED} once per bad block.
     */
    public int nextFrame(byte[] dst) {
        final byte[] s = stream;
        while (true) {
            int delimiter = -1;
            for (int i = scan; i < end; i++) {
                if (s[i] == 0) {
                    delimiter = i;
                    break;
                }
            }
            if (delimiter < 0) {
                scan = end;
                if (end - start > maxEncoded) {
                    start = end = scan = 0;
                    if (!discarding && !overlong) {
                        overlong = true;
                        return MALFORMED;
                    }
                }
                return NONE;
            }
            final int blockStart = start;
            final int blockLength = delimiter - blockStart;
            start = scan = delimiter + 1;
            if (discarding || overlong) {
                discarding = false;
                overlong = false;
                continue;
            }
            if (blockLength == 0) {
                continue;
            }
            if (blockLength > maxEncoded) {
                return MALFORMED;
            }
            final int n = Cobs.decode(s, blockStart, blockLength, dst, 0, dst.length);
            return n <= 0 ? MALFORMED : n; // a block that decodes to nothing is not a frame
        }
    }
}
